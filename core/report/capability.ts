// Process capability of a lot: sample statistics of one quantity and Cp, Cpk against its limits, with their intervals.

import { chiSquareQuantile } from '../chiSquare';

/** Specification limits of a quantity in SI units; null on an open side. */
export interface Limits {
  lower: number | null;
  upper: number | null;
}

export interface SampleStatistics {
  n: number;
  mean: number;
  /** Sample standard deviation (n - 1 in the denominator); null for a single value. */
  sd: number | null;
  min: number;
  max: number;
}

/** A 95 % confidence interval of an index: the lot is a sample of the process, and a few units pin it down loosely. */
export interface IndexInterval {
  lower: number;
  upper: number;
}

/** A capability index with its 95 % interval, or why it is not defined (never 0 or NaN in its place). */
export type CapabilityIndex = { value: number; interval: IndexInterval; reason: null } | { value: null; reason: string };

export interface Capability {
  cp: CapabilityIndex;
  cpk: CapabilityIndex;
}

/** Stated beside every capability table: the formulas, their source, the sigma estimate and the intervals. */
export const CAPABILITY_RULE =
  'Cp = (USL - LSL) / (6 s) and Cpk = min(USL - mean, mean - LSL) / (3 s), with one limit only the one side (NIST/SEMATECH e-Handbook of Statistical Methods, 6.1.6 "What is Process Capability?"); s is the sample standard deviation (n - 1) of the units\' final measurements. ' +
  'In brackets, each index\'s 95 % confidence interval for a normal process: Cp sqrt(chi^2(0.025 or 0.975; n - 1) / (n - 1)) for Cp, and Bissell\'s approximation Cpk ± 1.96 sqrt(1 / (9 n) + Cpk^2 / (2 (n - 1))) for Cpk (the forms the same handbook section gives, from memory).';

/** The two-sided 95 % quantile of the standard normal distribution. */
const Z_95 = 1.959963984540054;

/** n, mean, sample standard deviation, min and max; null for no values. */
export function sampleStatistics(values: readonly number[]): SampleStatistics | null {
  const n = values.length;
  if (n === 0) return null;
  const mean = values.reduce((sum, v) => sum + v, 0) / n;
  const squares = values.reduce((sum, v) => sum + (v - mean) ** 2, 0);
  return { n, mean, sd: n > 1 ? Math.sqrt(squares / (n - 1)) : null, min: Math.min(...values), max: Math.max(...values) };
}

/** Cp and Cpk of the statistics against the limits, each with the reason when it is not defined. */
export function processCapability(stats: SampleStatistics, limits: Limits | null): Capability {
  const lower = limits?.lower ?? null;
  const upper = limits?.upper ?? null;
  const none = (reason: string): CapabilityIndex => ({ value: null, reason });
  if (lower === null && upper === null) return { cp: none('no limits'), cpk: none('no limits') };
  if (stats.sd === null) return { cp: none('one unit only'), cpk: none('one unit only') };
  if (stats.sd === 0) return { cp: none('no spread'), cpk: none('no spread') };
  const sigma = stats.sd;
  const sides: number[] = [];
  if (upper !== null) sides.push((upper - stats.mean) / (3 * sigma));
  if (lower !== null) sides.push((stats.mean - lower) / (3 * sigma));
  const cpk = Math.min(...sides);
  const cp = lower !== null && upper !== null ? (upper - lower) / (6 * sigma) : null;
  return {
    cp: cp === null ? none('one-sided limit') : { value: cp, interval: cpInterval(cp, stats.n), reason: null },
    cpk: { value: cpk, interval: cpkInterval(cpk, stats.n), reason: null },
  };
}

/** Cp's exact 95 % interval for a normal process: s^2 (n - 1) / sigma^2 is chi-square with n - 1 degrees of freedom. */
function cpInterval(cp: number, n: number): IndexInterval {
  const dof = n - 1;
  return { lower: cp * Math.sqrt(chiSquareQuantile(0.025, dof) / dof), upper: cp * Math.sqrt(chiSquareQuantile(0.975, dof) / dof) };
}

/** Cpk's approximate 95 % interval (Bissell's normal approximation to the spread of the estimate). */
function cpkInterval(cpk: number, n: number): IndexInterval {
  const half = Z_95 * Math.sqrt(1 / (9 * n) + (cpk * cpk) / (2 * (n - 1)));
  return { lower: cpk - half, upper: cpk + half };
}
