// Covariance of every parameter of a model with several modes: its Jacobian, as a sandwich when the residuals are correlated.

import { covarianceFromJacobian } from './covariance';
import { noiseReading } from './responseCovariance';
import { expandLinear, linearNames, modesValues, ModesWorkspace, solverLinear, type ModeRates } from './modesModel';
import type { ModesFit } from './modesFit';
import type { FitSet } from './fitSet';

/** Relative central-difference step of the Jacobian (as responseCovariance.ts takes it). */
const STEP = 1e-6;
/** Above this variance ratio against white noise for a ring's rates, the widening is worth a warning. */
const WARN_INFLATION = 1.5;

export interface ModesCovariance {
  /** 'alpha1', 'omega01'... per ring as fitted, 'slowRate', 't0' where fitted, then the linear parameters. */
  names: string[];
  values: number[];
  covariance: number[][] | null;
  correlation: number[][] | null;
  warnings: string[];
}

/** The full parameter vector of a fitted model and the way back to rates and linear parameters. */
export function fullVector(fit: ModesFit): { names: string[]; values: number[]; unpack(v: readonly number[]): { rates: ModeRates; phi: number[] } } {
  const { spec, rates } = fit;
  const rateNames = [...rates.rings.flatMap((_, k) => [`alpha${k + 1}`, `omega0${k + 1}`]), ...(spec.slow ? ['slowRate'] : []), ...(spec.fitsT0 ? ['t0'] : [])];
  const rateValues = [...rates.rings.flatMap((ring) => [ring.alpha, ring.omega0]), ...(spec.slow ? [rates.slowRate] : []), ...(spec.fitsT0 ? [rates.t0] : [])];
  const count = rateValues.length;
  return {
    names: [...rateNames, ...linearNames(spec)],
    values: [...rateValues, ...solverLinear(spec, fit.linear)],
    unpack: (v) => ({
      rates: {
        rings: rates.rings.map((_, k) => ({ alpha: v[2 * k], omega0: v[2 * k + 1] })),
        slowRate: spec.slow ? v[2 * spec.rings] : 0,
        t0: spec.fitsT0 ? v[count - 1] : rates.t0,
      },
      phi: v.slice(count),
    }),
  };
}

/** The named linear parameters of a full vector (for quantities derived from it). */
export function linearOf(fit: ModesFit, v: readonly number[]) {
  const { rates, phi } = fullVector(fit).unpack(v);
  return { rates, linear: expandLinear(fit.spec, rates, phi) };
}

/** Step floors per parameter: a rate by the first ring's omega0, t0 by its period, a level or amplitude by the data's range. */
export function stepFloors(names: readonly string[], reference: number, range: number): number[] {
  return names.map((name) => (name === 't0' ? 1 / reference : /^(alpha|omega0|slowRate)/.test(name) ? reference : /^b\d/.test(name) ? range * reference : range));
}

/**
 * The covariance of every parameter at the solution: s^2 (J^T J)^-1 for white residuals, the sandwich over
 * an autoregression of the residuals when one fits them better (as responseCovariance.ts does for one ring:
 * Newey and West 1987, the autoregressive spectral estimate of den Haan and Levin 1997; from memory).
 */
export function modesCovariance(set: FitSet, fit: ModesFit): ModesCovariance {
  const full = fullVector(fit);
  const { names, values } = full;
  const ws = new ModesWorkspace(set.time.length);
  const evaluate = (v: readonly number[]) => {
    const { rates, phi } = full.unpack(v);
    return modesValues(set, fit.spec, rates, phi, ws);
  };
  const model = evaluate(values);
  const floors = stepFloors(names, fit.rates.rings[0].omega0, set.range);
  const n = set.time.length;
  const columns = values.map((v, j) => {
    const h = STEP * Math.max(names[j] === 't0' ? 0 : Math.abs(v), floors[j]);
    const up = [...values];
    const down = [...values];
    up[j] += h;
    down[j] -= h;
    const hi = evaluate(up);
    const lo = evaluate(down);
    return Float64Array.from(hi, (x, i) => (x - lo[i]) / (2 * h));
  });
  // Only the values the model is fitted to (all of them where the record has samples before t0).
  const rows: number[] = [];
  const reach = set.block ? ((set.block.samples - 1) / 2) * set.block.spacing : 0;
  for (let i = 0; i < n; i++) if (fit.spec.start !== 'no-pre-event' || set.time[i] - reach >= fit.rates.t0) rows.push(i);
  const J = rows.map((i) => Float64Array.from(columns, (c) => c[i]));
  const residuals = Float64Array.from(rows, (i) => set.values[i] - model[i]);
  const estimate = covarianceFromJacobian(J, 1, 1e-12, names);
  const warnings = [...estimate.warnings];
  const bread = estimate.covariance;
  if (!bread) return { names, values, covariance: null, correlation: estimate.correlation, warnings };
  const variance = fit.sse / Math.max(1, rows.length - values.length);
  const plain = bread.map((row) => row.map((v) => variance * v));
  const rateIndex = names.map((name, j) => (/^(alpha|omega0)\d/.test(name) ? j : -1)).filter((j) => j >= 0);
  const inflationOf = (c: number[][]) => Math.max(...rateIndex.map((j) => c[j][j] / plain[j][j]));
  // Read as for one ring (responseCovariance.ts).
  const reading = noiseReading(J, bread, residuals, { covariance: plain, correlation: estimate.correlation }, inflationOf);
  if (reading.kind === 'white') return { names, values, ...reading.estimate, warnings };
  const inflation = inflationOf(reading.estimate.covariance);
  if (reading.kind === 'uneven') {
    warnings.push(`the residuals are larger where the response changes fast (sampling jitter, or noise that scales with the signal): the modes' uncertainties widened by up to ${Math.sqrt(inflation).toFixed(2)}x`);
  } else if (inflation > WARN_INFLATION) {
    warnings.push(`the residuals are correlated (noise bandwidth-limited or model mismatch): the modes' uncertainties widened by up to ${Math.sqrt(inflation).toFixed(2)}x`);
  }
  return { names, values, ...reading.estimate, warnings };
}
