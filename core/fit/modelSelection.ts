// Chooses among the layouts' best attempts by the Bayesian information criterion over the effective
// sample count, and whether a ring, a single decay or nothing at all explains the record.

import type { FitSet } from './fitSet';
import { LAYOUTS, layoutValues } from './responseModel';
import type { Attempt } from './attempt';
import { nestedFTestTail } from './significance';
import { pValueText } from '../chiSquare';

/** Smallest residual sum of squares the criterion takes the logarithm of (a perfect fit stays finite). */
const MIN_SSE = 1e-300;

/**
 * Bayesian information criterion: among nested layouts, the extra parameter must pay for itself.
 * Correlated noise carries fewer independent samples than the record holds, so the count is the
 * effective one, n (1 - rho) / (1 + rho), with rho the lag-1 correlation of the closest fit's residuals
 * (an autoregression of order one; no single source, common practice).
 */
export function chooseByInformation(attempts: Attempt[], set: FitSet, t0Start: number): Attempt {
  const n = effectiveSamples(attempts, set, t0Start);
  const bic = (a: Attempt) => information(a.sse, a.values.length, n);
  return [...attempts].sort((x, y) => bic(x) - bic(y))[0];
}

/** The Bayesian information criterion of a least-squares fit with p parameters over n effective samples. */
export function information(sse: number, parameters: number, n: number): number {
  return n * Math.log(Math.max(sse, MIN_SSE)) + parameters * Math.log(n);
}

/** Independent samples in the set: n (1 - rho) / (1 + rho), rho from the closest attempt's residuals. */
export function effectiveSamples(attempts: Attempt[], set: FitSet, t0Start: number): number {
  const closest = attempts.reduce((x, y) => (y.sse < x.sse ? y : x));
  const rho = Math.max(0, lagOneCorrelation(set, closest, t0Start));
  return (set.time.length * (1 - rho)) / (1 + rho);
}

/**
 * A richer model is accepted only when noise alone would lower the residual as much less often than
 * this (the F-test's level, after the search correction below).
 */
const SIGNIFICANCE_LEVEL = 1e-3;
/**
 * A ring the F-test puts below this level, though not below SIGNIFICANCE_LEVEL, is suggested but not established:
 * the single decay is kept and said to be in doubt (0.05, the usual level of a suggestive result; common practice).
 */
const SUGGESTIVE_LEVEL = 0.05;
/** Most parameters of a response layout (a ring with a level before it, a jump and t0). */
const RING_PARAMETERS_MAX = 6;
/**
 * Fewest independent residuals the tests count beyond the parameters. The count comes from the residuals'
 * lag-1 correlation (an order-one autoregression), which reads a record's slow wander under one converter
 * code, or a model's small smooth miss on a measured circuit, as a correlation near 1: a few "independent"
 * samples, no degrees of freedom left, and a 100-fold drop in residual judged no better than chance.
 * A floor of 10 keeps the test meaningful there (the F tail at 10 denominator degrees of freedom is still
 * heavy: a drop needs F over about 12 at 1e-3); a judgment of ours, not from a source.
 */
const MIN_RESIDUAL_DOF = 10;

/** What explains a record: the ring, a single decay, or nothing but a constant level. */
export interface Explanation {
  choice: 'second-order' | 'first-order' | 'none';
  /** The comparison behind the choice, in words. */
  evidence: string;
  /** Set when a single decay was chosen although the record suggests a ring: the doubt, in words. */
  doubt?: string;
  /**
   * Set with 'none' when the constant level does not explain the record either (it leaves CONSTANT_MISFIT times the
   * noise or more): the record holds something neither model describes, which is a failed fit, not "no response".
   */
  misfit?: string;
}

/** A constant level leaving this many times the noise's rms explains nothing (white noise about a level leaves about 1; our choice). */
const CONSTANT_MISFIT = 3;

/**
 * Whether the record holds a ring, a single decay, or no response. A richer model must win on both the
 * information criterion (the BIC above) and an F-test of the nested residuals (significance.ts) at
 * SIGNIFICANCE_LEVEL. Against a constant level the response's event time and rates were searched over the
 * whole record, so the smallest of many chances is being looked at: the F-test's tail is multiplied by
 * the number of independent samples (Bonferroni over the places a response could be put, as the false-alarm
 * probability of the largest of N periodogram peaks, 1 - (1 - p)^N < N p: Scargle, ApJ 263, 835, 1982;
 * from memory). A ring must also beat the single decay, which is nested in it (omega0 = alpha with no
 * slope term); the single decay is kept when it explains the record as well.
 */
export function explainRecord(ring: Attempt, t0Start: number, decay: { attempt: Attempt; t0: number } | null, set: FitSet, noise: number): Explanation {
  const n = set.time.length;
  const firstOrder = decay && Number.isFinite(decay.attempt.sse) ? decay.attempt : null;
  const closer = firstOrder && decay && firstOrder.sse < ring.sse ? decay : { attempt: ring, t0: t0Start };
  // Never fewer independent samples than the richest model's parameters and MIN_RESIDUAL_DOF: see that constant.
  const nEff = Math.max(effectiveSamples([closer.attempt], set, closer.t0), RING_PARAMETERS_MAX + MIN_RESIDUAL_DOF);
  const constantSse = sumOfSquaresAboutMean(set.values);
  const test = (simpleSse: number, simpleParameters: number, rich: Attempt, searched: number) => {
    const fits = { simpleSse, simpleParameters, richSse: rich.sse, richParameters: rich.values.length, effectiveSamples: nEff };
    const p = Math.min(1, searched * nestedFTestTail(fits, n));
    const better = information(rich.sse, rich.values.length, nEff) < information(simpleSse, simpleParameters, nEff);
    return { p, accepted: better && p < SIGNIFICANCE_LEVEL };
  };
  let response = ring;
  let evidence = '';
  let doubt: string | undefined;
  if (firstOrder) {
    const ringOverDecay = test(firstOrder.sse, firstOrder.values.length, ring, 1);
    if (!ringOverDecay.accepted) {
      response = firstOrder;
      evidence = `a single decay explains the record as well as a ring (F-test of the ring against it: ${pValueText(ringOverDecay.p)})`;
      if (ringOverDecay.p < SUGGESTIVE_LEVEL) {
        doubt =
          `a ring is suggested but not established (F-test of the ring against the single decay: ${pValueText(ringOverDecay.p)}; ` +
          `a ring is accepted below ${SIGNIFICANCE_LEVEL}): the record may hold a damped ring its noise hides, and tau then only ` +
          'approximates the response (more signal, or averaging, would tell)';
      }
    }
  }
  const overConstant = test(constantSse, 1, response, nEff);
  if (!overConstant.accepted) {
    const lowered = `the best response fit lowers the residual by ${(100 * (1 - response.sse / constantSse)).toFixed(2)} % (F-test against the constant with the search counted: ${pValueText(overConstant.p)}; accepted below ${SIGNIFICANCE_LEVEL})`;
    const excess = Math.sqrt(constantSse / n) / noise;
    if (excess >= CONSTANT_MISFIT) {
      const misfit =
        `neither a second-order response nor a constant level explains the record: the level leaves ${excess.toFixed(1)} times the noise, and ${lowered} ` +
        '(a drifting baseline, interference, or more than one event in the window?)';
      return { choice: 'none', evidence: misfit, misfit };
    }
    return { choice: 'none', evidence: `a constant level explains the record: ${lowered}` };
  }
  return LAYOUTS[response.layout].order === 1 ? { choice: 'first-order', evidence, doubt } : { choice: 'second-order', evidence };
}

function sumOfSquaresAboutMean(values: ArrayLike<number>): number {
  let mean = 0;
  for (let i = 0; i < values.length; i++) mean += values[i];
  mean /= values.length;
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += (values[i] - mean) ** 2;
  return sum;
}

function lagOneCorrelation(set: FitSet, attempt: Attempt, t0Start: number): number {
  const model = layoutValues(attempt.layout, attempt.values, t0Start, set.time, set.block);
  let c0 = 0;
  let c1 = 0;
  for (let i = 0; i < model.length; i++) {
    const r = set.values[i] - model[i];
    c0 += r * r;
    if (i > 0) c1 += r * (set.values[i - 1] - model[i - 1]);
  }
  return c0 > 0 ? c1 / c0 : 0;
}
