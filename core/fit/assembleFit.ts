// Builds the ResponseFit a caller sees from the chosen attempt and its covariance, or from a failure.

import { quantity, type Quantity } from '../quantity';
import { LAYOUTS, unpackParams } from './responseModel';
import type { Trace } from './trace';
import type { FitSet } from './fitSet';
import type { Attempt } from './attempt';
import type { ResponseCovariance } from './responseCovariance';
import type { ResponseFit } from './responseFit';
import { classifyRegime } from './regime';
import { plausibilityWarnings, uncertainOmega0Warning } from './fitWarnings';

/**
 * The result of a fit that reached a residual: alpha, omega0 and what follows from them with standard
 * errors, the levels, the fit statistics and every warning (in order, each once).
 */
export function assembleFit(
  trace: Trace,
  set: FitSet,
  best: Attempt,
  t0Start: number,
  cov: ResponseCovariance,
  noise: number,
  warnings: string[],
): ResponseFit {
  const params = unpackParams(best.layout, best.values, t0Start);
  const names = cov.names;
  const c = cov.covariance;
  const se = (name: string) => {
    const i = names.indexOf(name);
    return c && i >= 0 ? Math.sqrt(c[i][i]) : null;
  };
  const ia = names.indexOf('alpha');
  const iw = names.indexOf('omega0');
  const { alpha, omega0 } = params;
  const zeta = derived(alpha / omega0, [1 / omega0, -alpha / (omega0 * omega0)], c, ia, iw, '');
  const q = derived(omega0 / (2 * alpha), [-omega0 / (2 * alpha * alpha), 1 / (2 * alpha)], c, ia, iw, '');
  const omegaDValue = omega0 > alpha ? Math.sqrt(omega0 * omega0 - alpha * alpha) : null;
  const omegaD =
    omegaDValue === null ? null : derived(omegaDValue, [-alpha / omegaDValue, omega0 / omegaDValue], c, ia, iw, 'rad/s');
  const { regime, evidence } = classifyRegime(zeta);
  const rmsResidual = Math.sqrt(best.sse / set.time.length);
  const t0Known = LAYOUTS[best.layout].fitsT0;
  if (!t0Known) {
    warnings.push('t0 was not fitted: the record has no flat samples before the event, so t0 is taken as the start of the fit window');
  }
  warnings.push(...plausibilityWarnings(set, params, omegaDValue, rmsResidual, noise));
  const omega0Warning = uncertainOmega0Warning(omega0, se('omega0'));
  if (omega0Warning) warnings.push(omega0Warning);
  return {
    status: best.status,
    message: best.message,
    regime,
    regimeEvidence: evidence,
    alpha: quantity(alpha, se('alpha'), 's^-1'),
    omega0: quantity(omega0, se('omega0'), 'rad/s'),
    omegaD: regime === 'underdamped' || omegaD ? omegaD : null,
    zeta,
    Q: q,
    finalValue: quantity(params.yFinal, se('yFinal'), trace.unit),
    t0: quantity(params.t0, t0Known ? se('t0') : null, 's'),
    // A layout without a pre-event level reports y(t0+) there, with no standard error.
    preLevel: quantity(params.yPre, se('yPre'), trace.unit),
    params,
    correlation: cov.correlation ? { names, matrix: cov.correlation } : null,
    rmsResidual,
    noiseRms: noise,
    samplesUsed: set.samplesUsed,
    window: { start: t0Known ? set.window.start : params.t0, end: set.window.end },
    iterations: best.iterations,
    decimation: set.decimation,
    warnings: [...new Set(warnings)],
  };
}

/** The result of a fit that found no response or no finite residual: every value NaN, the reason in `message`. */
export function failedFit(set: FitSet, noise: number, warnings: string[], message: string): ResponseFit {
  const nothing = (unit: string) => quantity(NaN, null, unit);
  return {
    status: 'failed',
    message,
    regime: 'underdamped',
    regimeEvidence: 'no fit',
    alpha: nothing('s^-1'),
    omega0: nothing('rad/s'),
    omegaD: null,
    zeta: nothing(''),
    Q: nothing(''),
    finalValue: nothing(''),
    t0: nothing('s'),
    preLevel: nothing(''),
    params: { t0: set.window.start, yPre: NaN, yFinal: NaN, alpha: NaN, omega0: NaN, a: NaN, b: NaN },
    correlation: null,
    rmsResidual: NaN,
    noiseRms: noise,
    samplesUsed: set.samplesUsed,
    window: set.window,
    iterations: 0,
    decimation: set.decimation,
    warnings,
  };
}

/** Value and standard error of a smooth function of (alpha, omega0), to first order. */
function derived(
  value: number,
  gradient: [number, number],
  cov: number[][] | null,
  ia: number,
  iw: number,
  unit: string,
): Quantity {
  if (!cov) return quantity(value, null, unit);
  const [ga, gw] = gradient;
  const variance = ga * ga * cov[ia][ia] + 2 * ga * gw * cov[ia][iw] + gw * gw * cov[iw][iw];
  return quantity(value, variance >= 0 ? Math.sqrt(variance) : null, unit);
}
