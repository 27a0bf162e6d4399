// Process capability of a lot: sample statistics of one quantity and Cp, Cpk against its limits.

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

/** A capability index, or why it is not defined (never 0 or NaN in its place). */
export type CapabilityIndex = { value: number; reason: null } | { value: null; reason: string };

export interface Capability {
  cp: CapabilityIndex;
  cpk: CapabilityIndex;
}

/** Stated beside every capability table: the formulas, their source and the sigma estimate. */
export const CAPABILITY_RULE =
  'Cp = (USL - LSL) / (6 s) and Cpk = min(USL - mean, mean - LSL) / (3 s), with one limit only the one side (NIST/SEMATECH e-Handbook of Statistical Methods, 6.1.6 "What is Process Capability?"); s is the sample standard deviation (n - 1) of the units\' final measurements.';

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
  const cpk: CapabilityIndex = { value: Math.min(...sides), reason: null };
  const cp: CapabilityIndex = lower !== null && upper !== null ? { value: (upper - lower) / (6 * sigma), reason: null } : none('one-sided limit');
  return { cp, cpk };
}
