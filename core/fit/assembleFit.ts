// Builds the ResponseFit a caller sees from the chosen attempt and its covariance, or from a failure.

import { quantity, type Quantity } from '../quantity';
import { LAYOUTS, unpackParams } from './responseModel';
import type { Trace } from './trace';
import type { FitSet } from './fitSet';
import type { Attempt } from './attempt';
import type { ResponseCovariance } from './responseCovariance';
import type { ModelOrder, ResponseFit } from './responseFit';
import type { TailTimeConstant } from './firstOrderFit';
import { classifyRegime } from './regime';
import { formatEngineering } from '../units/format';
import { slowestDecayRate } from '../response/secondOrder';
import { plausibilityWarnings, uncertainOmega0Warning } from './fitWarnings';
import { singleModeFields, type MultiModeModel } from './modesResult';

/** How the fit's model was chosen: a jump at the event let in, and why a single decay was kept (or ''). */
export interface ModelChoice {
  jumpStart: boolean;
  /** Why the initial value was fitted freely when not for a jump (freeStartFor): it replaces the jump's warning. */
  startNote?: string | null;
  evidence: string;
  /** For a single decay: the time constant of the record's tail alone and its standard error (tailTimeConstant). */
  tailTimeConstant?: TailTimeConstant;
  /** How many ringing modes (modeOrder.ts); absent where no other order was looked at. */
  modeOrder?: ModelOrder;
  /** The model with several rings or a slow term, when it was chosen: it replaces the one ring's fit. */
  multiMode?: MultiModeModel;
}

/**
 * The result of a fit that reached a residual: alpha, omega0 and what follows from them with standard
 * errors (or tau alone for a single decay), the levels, the fit statistics and every warning (in order, each once).
 */
export function assembleFit(
  trace: Trace,
  set: FitSet,
  best: Attempt,
  t0Start: number,
  cov: ResponseCovariance,
  noise: number,
  warnings: string[],
  choice: ModelChoice = { jumpStart: false, evidence: '' },
): ResponseFit {
  const multi = choice.multiMode ?? null;
  const params = multi?.params ?? unpackParams(best.layout, best.values, t0Start);
  // A ring found riding on a single decay (modeOrder.ts) makes the fit a ring's again.
  const firstOrder = LAYOUTS[best.layout].order === 1 && !multi;
  const names = cov.names;
  const c = cov.covariance;
  const se = (name: string) => {
    const i = names.indexOf(name);
    return c && i >= 0 ? Math.sqrt(c[i][i]) : null;
  };
  const { alpha, omega0 } = params;
  const ring = firstOrder ? null : ringQuantities(alpha, omega0, c, names.indexOf('alpha'), names.indexOf('omega0'));
  const { regime, evidence } = ring ? classifyRegime(ring.zeta, cov.zetaInterval) : { regime: 'first-order' as const, evidence: choice.evidence };
  const rmsResidual = Math.sqrt((multi?.sse ?? best.sse) / set.time.length);
  const t0Known = LAYOUTS[best.layout].fitsT0;
  // A layout with the level before the event holds its t0 at a jump it found; one without has no samples before it.
  const seesPreEvent = t0Known || LAYOUTS[best.layout].preLevelColumn !== null;
  if (!seesPreEvent) {
    warnings.push('t0 was not fitted: the record has no flat samples before the event, so t0 is taken as the start of the fit window');
  }
  if (choice.jumpStart) warnings.push(choice.startNote ?? 'the response jumps at the event: its initial value was fitted freely and t0 held between the samples either side of the jump');
  const omegaDValue = ring?.omegaD?.value ?? null;
  warnings.push(...plausibilityWarnings(set, params, omegaDValue, rmsResidual, noise));
  const omega0Warning = ring ? uncertainOmega0Warning(omega0, se('omega0')) : null;
  if (omega0Warning) warnings.push(omega0Warning);
  const seAlpha = se('alpha');
  const { warnings: modeWarnings = [], ...modeFields } = !ring
    ? { modes: [], modelOrder: null }
    : multi
      ? { ...multi.fields(ring, trace.unit), modelOrder: choice.modeOrder ?? null }
      : singleModeFields(best, t0Start, cov, ring, set, trace.unit, choice.modeOrder ?? null);
  warnings.push(...modeWarnings);
  // A single decay's params carry omega0 = alpha, whose slowest rate is alpha itself.
  const unresolved = unresolvedDecay(slowestDecayRate(alpha, omega0), firstOrder ? "the single decay's" : "the response's slowest", set);
  return {
    status: unresolved ? 'failed' : (multi?.status ?? best.status),
    message: unresolved ?? multi?.message ?? best.message,
    regime,
    regimeEvidence: evidence,
    ...(ring ?? { alpha: NOT_APPLICABLE('s^-1'), omega0: NOT_APPLICABLE('rad/s'), omegaD: null, zeta: NOT_APPLICABLE(''), Q: NOT_APPLICABLE('') }),
    ...(firstOrder ? { tau: decayTime(alpha, seAlpha, choice.tailTimeConstant) } : {}),
    ...(choice.jumpStart ? { jumpStart: true } : {}),
    ...(seesPreEvent ? {} : { startsInResponse: true }),
    finalValue: quantity(params.yFinal, se('yFinal'), trace.unit),
    t0: quantity(params.t0, t0Known ? se('t0') : null, 's'),
    // A layout without a pre-event level reports y(t0+) there, with no standard error.
    preLevel: quantity(params.yPre, se('yPre'), trace.unit),
    params,
    correlation: cov.correlation ? { names, matrix: cov.correlation } : null,
    rmsResidual,
    noiseRms: noise,
    samplesUsed: set.samplesUsed,
    window: { start: seesPreEvent ? set.window.start : params.t0, end: set.window.end },
    iterations: multi?.iterations ?? best.iterations,
    decimation: set.decimation,
    warnings: [...new Set(warnings)],
    ...modeFields,
  };
}

/**
 * Why a response that dies faster than one sample interval is no measurement, or null: its slowest time constant
 * passes between two samples (it falls by e^-1 or more), so it is a jump or a glitch the sampling cannot time, and its
 * rates rest on a sample or two. `what` names the time constant.
 */
function unresolvedDecay(rate: number, what: string, set: FitSet): string | null {
  const interval = set.block?.spacing ?? set.dt;
  if (!(rate * interval > 1)) return null;
  return `${what} time constant (${formatEngineering(1 / rate, 's')}) is shorter than the sample interval (${formatEngineering(interval, 's')}): a jump the sampling cannot time, not a response to measure`;
}

/** A ring quantity of a fit without a ring (a single decay, no response): NaN with no standard error. */
const NOT_APPLICABLE = (unit: string) => quantity(NaN, null, unit);

/**
 * The result when a constant level explains the record as well as any response: status 'no-response',
 * the level with its standard error (as for white noise) and no ring.
 */
export function noResponseFit(set: FitSet, noise: number, warnings: string[], evidence: string, unit: string): ResponseFit {
  const n = set.values.length;
  const mean = set.values.reduce((sum, v) => sum + v, 0) / n;
  const spread = Math.sqrt(set.values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / Math.max(1, n - 1));
  const level = quantity(mean, spread / Math.sqrt(n), unit);
  const failed = failedFit(set, noise, warnings, 'no second-order response found');
  return {
    ...failed,
    status: 'no-response',
    regimeEvidence: evidence,
    finalValue: level,
    preLevel: level,
    t0: NOT_APPLICABLE('s'),
    // A flat line: the critically damped basis at zero rates with no natural part.
    params: { t0: set.window.start, yPre: mean, yFinal: mean, alpha: 0, omega0: 0, a: 0, b: 0 },
    rmsResidual: spread,
  };
}

/** The result of a fit that found no response or no finite residual: every value NaN, the reason in `message`. */
export function failedFit(set: FitSet, noise: number, warnings: string[], message: string): ResponseFit {
  const nothing = NOT_APPLICABLE;
  return {
    status: 'failed',
    message,
    regime: 'none',
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
    modes: [],
    modelOrder: null,
  };
}

/**
 * tau = 1 / alpha of a single decay. The record may hold a second, faster root it cannot resolve (a zeta of
 * 1.2 at 20 dB fits a single decay as well as a ring); that root's share pulls tau over the whole record
 * away from the slowest time constant (17 %, 5 standard errors, in that case), while the tail, where the
 * faster root has died out, still reads the slowest one. The distance between the two is added to the
 * standard error in quadrature: the spread between the readings the data allow (as in the unconditional
 * variance of Burnham and Anderson, Model Selection and Multimodel Inference, 2002, 4.3.2; from memory).
 * The distance is itself read through noise: for a single decay the whole record's reading is the efficient
 * one, so the tail's differs from it by noise of variance se_tail^2 - se^2 (Hausman, Specification Tests in
 * Econometrics, Econometrica 1978; from memory), and a distance within that noise bounds the pull only to
 * about the noise. So the allowance is the larger of the two: seed 2's corpus capture #110 (zeta 1.63 at
 * 15 dB) was pulled 2.9 % on average, and a draw whose tail happened to agree within 0.1 % (its noise 5.3 %)
 * stood 3.3 standard errors off.
 */
function decayTime(alpha: number, seAlpha: number | null, tail: TailTimeConstant | undefined): Quantity {
  const tau = 1 / alpha;
  if (seAlpha === null) return quantity(tau, null, 's');
  const se = seAlpha / (alpha * alpha);
  const distance = tail && Number.isFinite(tail.tau) ? Math.abs(tau - tail.tau) : 0;
  const distanceNoise = tail && Number.isFinite(tail.stderr) ? Math.sqrt(Math.max(0, tail.stderr ** 2 - se ** 2)) : 0;
  return quantity(tau, Math.hypot(se, Math.max(distance, distanceNoise)), 's');
}

/** alpha, omega0 and what follows from them (zeta, Q, omega_d where underdamped) with standard errors. */
function ringQuantities(alpha: number, omega0: number, c: number[][] | null, ia: number, iw: number) {
  const se = (i: number) => (c && i >= 0 ? Math.sqrt(c[i][i]) : null);
  const omegaDValue = omega0 > alpha ? Math.sqrt(omega0 * omega0 - alpha * alpha) : null;
  return {
    alpha: quantity(alpha, se(ia), 's^-1'),
    omega0: quantity(omega0, se(iw), 'rad/s'),
    omegaD: omegaDValue === null ? null : derived(omegaDValue, [-alpha / omegaDValue, omega0 / omegaDValue], c, ia, iw, 'rad/s'),
    zeta: derived(alpha / omega0, [1 / omega0, -alpha / (omega0 * omega0)], c, ia, iw, ''),
    Q: derived(omega0 / (2 * alpha), [-omega0 / (2 * alpha * alpha), 1 / (2 * alpha)], c, ia, iw, ''),
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
