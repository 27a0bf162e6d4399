// Fits the second-order response to one trace: estimates, multi-start Levenberg-Marquardt, uncertainties.

import { quantity, type Quantity } from '../quantity';
import type { ResponseParams } from '../response/secondOrder';
import type { FitStatus } from './types';
import { fitCurve } from './fitCurve';
import { estimateNoise, quantisationStep, recordNoise } from './noise';
import { detectEvent, rateCandidates, type RateCandidate } from './estimate';
import { solveAmplitudes, Workspace } from './amplitudes';
import { LAYOUT_NAMES, fitsT0, layoutValues, nonlinearCount, unpackParams, type ParameterLayout } from './responseModel';
import { firstSampleTime, prepareFitSet, uniformValues, type FitSet } from './fitSet';
import { responseCovariance } from './responseCovariance';
import { FitInputError } from './fitInputError';

export interface Trace {
  time: Float64Array;
  values: Float64Array;
  clipped?: Uint8Array;
  unit: string;
  name?: string;
}

export interface ResponseFitOptions {
  /** Fit window in s (default: from the detected event, or the record start, to the record end). */
  window?: { start?: number; end?: number };
  /** Whether the measured quantity is continuous at the event (default 'continuous'). */
  continuity?: 'continuous' | 'free';
}

export type Regime = 'underdamped' | 'critically damped' | 'overdamped';

export interface ResponseFit {
  status: FitStatus;
  message: string;
  regime: Regime;
  regimeEvidence: string;
  alpha: Quantity;
  omega0: Quantity;
  omegaD: Quantity | null;
  zeta: Quantity;
  Q: Quantity;
  finalValue: Quantity;
  t0: Quantity;
  preLevel: Quantity;
  params: ResponseParams;
  correlation: { names: string[]; matrix: number[][] } | null;
  rmsResidual: number;
  noiseRms: number;
  samplesUsed: number;
  window: { start: number; end: number };
  iterations: number;
  decimation: { factor: number; note: string } | null;
  warnings: string[];
}

const MIN_SAMPLES = 20;
const MAX_STARTS = 3;
/** A start that has not converged by then is crawling along a degenerate valley; a better start exists. */
const MAX_ITERATIONS = 60;

interface Attempt {
  layout: ParameterLayout;
  /** Full parameter vector of the layout (LAYOUT_NAMES order). */
  values: number[];
  sse: number;
  status: FitStatus;
  message: string;
  iterations: number;
  warnings: string[];
}

export function fitResponse(trace: Trace, options: ResponseFitOptions = {}): ResponseFit {
  const continuity = options.continuity ?? 'continuous';
  let set = prepareFitSet(trace, options.window ?? {});
  if (set.time.length < MIN_SAMPLES) {
    throw new FitInputError('trace', `only ${set.time.length} usable samples in the fit window; at least ${MIN_SAMPLES} are needed`);
  }
  const noise = recordNoise(set.values);
  const step = quantisationStep(set.values);
  const event = options.window?.start !== undefined ? { index: 0, hasPreEvent: false } : detectEvent(set.values, noise, step);
  // Without a pre-event stretch the response is taken from the first sample on.
  let t0Start = event.hasPreEvent ? set.time[event.index] : firstSampleTime(set);
  const layouts: ParameterLayout[] = !event.hasPreEvent ? ['free'] : continuity === 'continuous' ? ['smooth', 'step'] : ['free-pre'];
  const warnings: string[] = [...set.warnings];
  const uniform = uniformValues(set);
  const eventOnGrid = Math.round((t0Start - set.time[0]) / set.dt);
  const candidates = rateCandidates(uniform, eventOnGrid, uniform.length, set.dt);
  const attempts = searchLayouts(set, layouts, candidates, t0Start, noise);
  if (attempts.length === 0) return failedFit(set, noise, warnings, 'no damped response was found in the data (no usable starting values)');
  let best = chooseByInformation(attempts, set, t0Start);
  if (!Number.isFinite(best.sse)) return failedFit(set, noise, warnings, 'the solver did not reach a finite residual');
  if (fitsT0(best.layout) && best.values[2] <= firstSampleTime(set)) {
    // The event was placed at or before the first sample: no sample sees the level before it.
    const fromStart = searchLayouts(set, ['free'], candidates, firstSampleTime(set), noise);
    if (fromStart.length > 0 && Number.isFinite(fromStart[0].sse)) {
      best = fromStart[0];
      t0Start = firstSampleTime(set);
    }
  }

  // The raw samples' own noise: the rail guard's margin and the dither test are about single samples.
  const sampleNoise = estimateNoise(trace.values);
  const guarded = guardRails(trace, best, t0Start, options.window ?? {}, sampleNoise);
  if (guarded) {
    set = guarded.set;
    const start = { alpha: best.values[0], omega0: best.values[1], source: 'fit before the rail guard' };
    best = refine(set, best.layout, start, fitsT0(best.layout) ? best.values[2] : t0Start);
    warnings.push(guarded.warning);
  }
  const subCode = subCodeNoiseWarning(trace.values, sampleNoise);
  if (subCode) warnings.push(subCode);
  const params = unpackParams(best.layout, best.values, t0Start);
  const dof = set.time.length - best.values.length;
  const cov = responseCovariance(set, best.layout, best.values, t0Start, best.sse / Math.max(1, dof));
  warnings.push(...best.warnings, ...cov.warnings);
  return assembleFit(trace, set, params, best.layout, best, cov, noise, warnings);
}

/**
 * Several starts in the first layout, tried in rank order until one leaves no more than the noise;
 * a richer layout starts from the simpler one's solution and from the best-ranked candidate.
 * One best attempt per layout.
 */
function searchLayouts(set: FitSet, layouts: ParameterLayout[], candidates: RateCandidate[], t0Start: number, noise: number): Attempt[] {
  const attempts: Attempt[] = [];
  // A wrong minimum can leave only a little more than the noise: the tolerance shrinks with the record,
  // as the spread of the residual's rms and of the noise estimate do (both about 1 / sqrt(n)).
  const tolerance = 1.02 + 4 / Math.sqrt(set.time.length);
  const goodEnough = (a: Attempt) => Math.sqrt(a.sse / set.time.length) <= tolerance * Math.max(noise, 1e-12 * set.range);
  for (const [i, layout] of layouts.entries()) {
    const simpler = attempts[0];
    const starts: [RateCandidate, number][] = simpler
      ? [[{ alpha: simpler.values[0], omega0: simpler.values[1], source: 'nested layout' }, simpler.values[2] ?? t0Start]]
      : [];
    for (const c of rankCandidates(set, layout, candidates, t0Start).slice(0, i === 0 ? MAX_STARTS : 1)) starts.push([c, t0Start]);
    let best: Attempt | undefined;
    for (const [start, t0] of starts) {
      const attempt = refine(set, layout, start, t0);
      if (!best || attempt.sse < best.sse) best = attempt;
      // A richer layout tries both of its starts: the simpler layout's minimum can pass for noise.
      if (!simpler && goodEnough(best)) break;
    }
    if (best) attempts.push(fitsT0(layout) ? shiftByHalfPeriods(set, best) : best);
  }
  return attempts;
}

/** How many half ring periods either way the event time is tried at once a layout has converged. */
const HALF_PERIOD_SHIFTS = 4;

/**
 * A lightly damped ring fits almost as well with its start moved by half a period and its sign turned
 * over; in noise the solver keeps whichever of these minima lies nearest its start. The residual is
 * compared at t0 moved by 1 to 4 half periods each way, and the fit refined from a shift that does better.
 */
function shiftByHalfPeriods(set: FitSet, attempt: Attempt): Attempt {
  const [alpha, omega0, t0] = attempt.values;
  if (!(omega0 > alpha)) return attempt;
  const halfPeriod = Math.PI / Math.sqrt(omega0 * omega0 - alpha * alpha);
  const workspace = new Workspace(set.time.length);
  let bestShift = 0;
  let bestSse = attempt.sse;
  for (let k = -HALF_PERIOD_SHIFTS; k <= HALF_PERIOD_SHIFTS; k++) {
    const shifted = t0 + k * halfPeriod;
    if (k === 0 || shifted <= set.time[0] || shifted >= set.time[set.time.length - 1]) continue;
    const { sse } = solveAmplitudes(attempt.layout, set.time, set.values, alpha, omega0, shifted, workspace, set.block);
    if (sse < bestSse) {
      bestSse = sse;
      bestShift = k;
    }
  }
  if (bestShift === 0) return attempt;
  const refined = refine(set, attempt.layout, { alpha, omega0, source: 'shifted by half periods' }, t0 + bestShift * halfPeriod);
  return refined.sse < attempt.sse ? refined : attempt;
}

/**
 * With less noise than half a converter code to dither it, the quantisation error follows the signal
 * instead of averaging out: its mean ripples by about (q / pi) exp(-2 pi^2 sigma^2 / q^2), 0.06 q at
 * sigma = 0.3 q but under 0.01 q from sigma = q / 2 on (Widrow and Kollar, Quantization Noise, 2008,
 * Gaussian input; from memory). The fit's standard errors do not include that bias.
 */
function subCodeNoiseWarning(values: ArrayLike<number>, noise: number): string | null {
  const q = quantisationStep(values);
  if (!(q > 0) || noise >= 0.5 * q) return null;
  return `the noise (${(noise / q).toFixed(2)} of a converter code) is too small to dither the quantisation: its error follows the signal and may bias the fit beyond its standard errors (more vertical resolution or averaging off helps)`;
}

/**
 * A sample beside a converter rail is kept only when its noise did not carry it onto the rail, so the
 * samples left near a rail read low (censored data). Once clipping was found, the samples whose fitted
 * value lies within 3 noise levels of a rail are left out too, and the fit is repeated on the rest.
 */
function guardRails(
  trace: Trace,
  best: Attempt,
  t0Start: number,
  window: { start?: number; end?: number },
  sampleNoise: number,
): { set: FitSet; warning: string } | null {
  const { clipped, values, time } = trace;
  if (!clipped) return null;
  let top = -Infinity;
  let bottom = Infinity;
  let unclippedTop = -Infinity;
  for (let i = 0; i < values.length; i++) {
    if (clipped[i]) {
      top = Math.max(top, values[i]);
      bottom = Math.min(bottom, values[i]);
    } else unclippedTop = Math.max(unclippedTop, values[i]);
  }
  if (top === -Infinity) return null;
  // One rail only: it is the top one when it lies above every unclipped sample.
  if (top === bottom) [top, bottom] = top >= unclippedTop ? [top, -Infinity] : [Infinity, bottom];
  const margin = 3 * sampleNoise;
  const model = layoutValues(best.layout, best.values, t0Start, time);
  const guard = Uint8Array.from(clipped);
  let added = 0;
  for (let i = 0; i < values.length; i++) {
    if (!guard[i] && (model[i] > top - margin || model[i] < bottom + margin)) {
      guard[i] = 1;
      added++;
    }
  }
  if (added === 0) return null;
  const set = prepareFitSet({ ...trace, clipped: guard }, window);
  if (set.time.length < MIN_SAMPLES) return null;
  return {
    set,
    warning: `${added} more samples were left out because the fit puts them within 3 noise levels of a clipped rail (their noise is cut off there)`,
  };
}

/**
 * Bayesian information criterion: among nested layouts, the extra parameter must pay for itself.
 * Correlated noise carries fewer independent samples than the record holds, so the count is the
 * effective one, n (1 - rho) / (1 + rho), with rho the lag-1 correlation of the closest fit's residuals
 * (an autoregression of order one; no single source, common practice).
 */
function chooseByInformation(attempts: Attempt[], set: FitSet, t0Start: number): Attempt {
  const closest = attempts.reduce((x, y) => (y.sse < x.sse ? y : x));
  const rho = Math.max(0, lagOneCorrelation(set, closest, t0Start));
  const n = (set.time.length * (1 - rho)) / (1 + rho);
  const bic = (a: Attempt) => n * Math.log(Math.max(a.sse, 1e-300)) + a.values.length * Math.log(n);
  return [...attempts].sort((x, y) => bic(x) - bic(y))[0];
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

/** Rank the candidate rates by the residual left after the linear part is solved exactly. */
function rankCandidates(set: FitSet, layout: ParameterLayout, candidates: RateCandidate[], t0: number): RateCandidate[] {
  const stride = Math.max(1, Math.floor(set.time.length / 4000));
  const time = set.time.filter((_, i) => i % stride === 0);
  const values = set.values.filter((_, i) => i % stride === 0);
  const workspace = new Workspace(time.length);
  const expanded: RateCandidate[] = [];
  for (const c of candidates) {
    expanded.push(c);
    const zeta = c.alpha / c.omega0;
    // Near critical damping the pencil may put the poles on the wrong side: start from each regime.
    if (zeta > 0.4 && zeta < 2.5) {
      for (const z of [0.8, 1, 1.25]) expanded.push({ alpha: z * c.omega0, omega0: c.omega0, source: `${c.source}, zeta ${z}` });
    }
  }
  const scored = expanded
    .map((c) => ({ c, sse: solveAmplitudes(layout, time, values, c.alpha, c.omega0, t0, workspace, set.block).sse }))
    .filter((s) => Number.isFinite(s.sse))
    .sort((x, y) => x.sse - y.sse);
  const distinct: RateCandidate[] = [];
  for (const { c } of scored) {
    const near = distinct.some((d) => Math.abs(d.alpha - c.alpha) < 0.02 * d.omega0 && Math.abs(d.omega0 - c.omega0) < 0.02 * d.omega0);
    if (!near) distinct.push(c);
  }
  return distinct;
}

/**
 * Levenberg-Marquardt over the nonlinear parameters only (alpha, omega0 and t0 where fitted), scaled
 * to order one; for each trial the levels and amplitudes follow by linear least squares (variable
 * projection, Golub and Pereyra 1973), so the solver never wanders in the linear directions.
 * The solver sees sample indices as its x, so each parameter vector costs one pass over the data.
 */
function refine(set: FitSet, layout: ParameterLayout, start: RateCandidate, t0Start: number): Attempt {
  const k = nonlinearCount(layout);
  const rate = start.omega0;
  // t0 enters as 1 + (t0 - t0Start) omega0 so that every solver variable starts near 1.
  const toPhysical = (u: readonly number[]) => [u[0] * rate, u[1] * rate, ...(k === 3 ? [t0Start + (u[2] - 1) / rate] : [])];
  const workspace = new Workspace(set.time.length);
  // The solver asks point by point, alternating between two vectors for central differences,
  // so the model is kept for the last few parameter vectors it was asked about.
  const cache: { key: readonly number[]; model: Float64Array }[] = [];
  const modelFor = (u: readonly number[]): Float64Array => {
    const hit = cache.find((entry) => entry.key === u);
    if (hit) return hit.model;
    const [alpha, omega0, t0 = t0Start] = toPhysical(u);
    solveAmplitudes(layout, set.time, set.values, alpha, omega0, t0, workspace, set.block);
    const entry = cache.length < 4 ? { key: u, model: new Float64Array(set.time.length) } : (cache.pop() as (typeof cache)[0]);
    entry.key = u;
    entry.model.set(workspace.model);
    cache.unshift(entry);
    return entry.model;
  };
  const model = {
    names: LAYOUT_NAMES[layout].slice(0, k),
    evaluate: (u: readonly number[], index: number) => modelFor(u)[index],
  };
  const indices = Float64Array.from(set.time, (_, i) => i);
  const min = [1e-9, 1e-9, ...(k === 3 ? [-Infinity] : [])];
  // A start can hold a vanishing alpha (an almost undamped ring); the solver needs it inside its bounds.
  const initial = [Math.max(start.alpha / rate, 1e-6), start.omega0 / rate, ...(k === 3 ? [1] : [])];
  const result = fitCurve(model, { x: indices, y: set.values }, initial, { min, maxIterations: MAX_ITERATIONS });
  const nonlinear = toPhysical(result.parameters.map((p) => p.value));
  const [alpha, omega0, t0 = t0Start] = nonlinear;
  const linear = solveAmplitudes(layout, set.time, set.values, alpha, omega0, t0, workspace, set.block);
  return {
    layout,
    values: [...nonlinear, ...linear.coefficients],
    sse: Number.isFinite(linear.sse) ? linear.sse : Infinity,
    ...stallAsConvergence(result.status, result.message),
    iterations: result.iterations,
    warnings: result.warnings.filter((w) => !/covariance/i.test(w)),
  };
}

/**
 * The solver stalls when no step lowers chi^2 although its finite-difference gradient is not quite
 * zero. Here the model's derivatives include the linear solve, whose rounding makes that gradient
 * noisy at the minimum, so a stall after a successful descent is a minimum to the model's precision.
 */
function stallAsConvergence(status: FitStatus, message: string): { status: FitStatus; message: string } {
  return status === 'failed' && message.startsWith('stalled')
    ? { status: 'converged', message: 'no step lowers chi^2 further (minimum to the precision of the model derivatives)' }
    : { status, message };
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

function classifyRegime(zeta: Quantity): { regime: Regime; evidence: string } {
  const z = zeta.value;
  if (zeta.stderr === null) {
    const regime: Regime = z < 1 ? 'underdamped' : z > 1 ? 'overdamped' : 'critically damped';
    return { regime, evidence: `zeta = ${z.toPrecision(4)}; its uncertainty could not be estimated` };
  }
  const s = zeta.stderr;
  const text = `zeta = ${z.toPrecision(4)} ± ${s.toPrecision(2)}`;
  if (z + 2 * s < 1) return { regime: 'underdamped', evidence: `${text}: zeta + 2 sigma < 1` };
  if (z - 2 * s > 1) return { regime: 'overdamped', evidence: `${text}: zeta - 2 sigma > 1` };
  return { regime: 'critically damped', evidence: `${text}: 1 lies within 2 sigma` };
}

function assembleFit(
  trace: Trace,
  set: FitSet,
  params: ResponseParams,
  layout: ParameterLayout,
  best: Attempt,
  cov: ReturnType<typeof responseCovariance>,
  noise: number,
  warnings: string[],
): ResponseFit {
  const names = cov.names;
  const c = cov.covariance;
  const se = (name: string) => {
    const i = names.indexOf(name);
    return c && i >= 0 ? Math.sqrt(c[i][i]) : null;
  };
  const ia = names.indexOf('alpha');
  const iw = names.indexOf('omega0');
  const { alpha, omega0 } = params;
  const rateUnit = 's^-1';
  const zeta = derived(alpha / omega0, [1 / omega0, -alpha / (omega0 * omega0)], c, ia, iw, '');
  const q = derived(omega0 / (2 * alpha), [-omega0 / (2 * alpha * alpha), 1 / (2 * alpha)], c, ia, iw, '');
  const omegaDValue = omega0 > alpha ? Math.sqrt(omega0 * omega0 - alpha * alpha) : null;
  const omegaD =
    omegaDValue === null ? null : derived(omegaDValue, [-alpha / omegaDValue, omega0 / omegaDValue], c, ia, iw, 'rad/s');
  const { regime, evidence } = classifyRegime(zeta);
  const rmsResidual = Math.sqrt(best.sse / set.time.length);
  const t0Known = fitsT0(layout);
  if (!t0Known) {
    warnings.push('t0 was not fitted: the record has no flat samples before the event, so t0 is taken as the start of the fit window');
  }
  addPlausibilityWarnings(set, params, omegaDValue, rmsResidual, noise, warnings);
  const omega0Stderr = se('omega0');
  // 3 sigma beyond 2 % means the natural frequency, and L or C from it, is not pinned down.
  if (omega0Stderr !== null && omega0Stderr > 0.0067 * omega0) {
    warnings.push(`omega0 is uncertain by ${((100 * omega0Stderr) / omega0).toFixed(1)} % (1 sigma): the record does not pin the natural frequency down`);
  }
  const correlation = cov.correlation ? { names, matrix: cov.correlation } : null;
  return {
    status: best.status,
    message: best.message,
    regime,
    regimeEvidence: evidence,
    alpha: quantity(alpha, se('alpha'), rateUnit),
    omega0: quantity(omega0, se('omega0'), 'rad/s'),
    omegaD: regime === 'underdamped' || omegaD ? omegaD : null,
    zeta,
    Q: q,
    finalValue: quantity(params.yFinal, se('yFinal'), trace.unit),
    t0: quantity(params.t0, t0Known ? se('t0') : null, 's'),
    preLevel: quantity(params.yPre, layout === 'free' ? null : se('yPre'), trace.unit),
    params,
    correlation,
    rmsResidual,
    noiseRms: noise,
    samplesUsed: set.samplesUsed,
    window: { start: t0Known ? set.window.start : params.t0, end: set.window.end },
    iterations: best.iterations,
    decimation: set.decimation,
    warnings: [...new Set(warnings)],
  };
}

/** Warnings an engineer needs before trusting the numbers: thin sampling, short record, poor match. */
function addPlausibilityWarnings(
  set: FitSet,
  p: ResponseParams,
  omegaD: number | null,
  rmsResidual: number,
  noise: number,
  warnings: string[],
): void {
  const dtRaw = set.block?.spacing ?? set.dt;
  if (omegaD !== null) {
    const perPeriod = (2 * Math.PI) / omegaD / dtRaw;
    // At least 10 samples per ring period is the usual working margin (common practice, no single source).
    if (perPeriod < 10) warnings.push(`only ${perPeriod.toFixed(1)} samples per ring period (10 or more is the usual margin for a fit)`);
  }
  const span = set.window.end - p.t0;
  const slowest = p.omega0 > p.alpha ? p.alpha : p.alpha - Math.sqrt(p.alpha * p.alpha - p.omega0 * p.omega0);
  if (span * slowest < 1) {
    warnings.push('the record ends before the response has decayed by 1/e: alpha and the final value are poorly determined');
  }
  const floor = Math.max(noise, 1e-12 * set.range);
  if (rmsResidual > 2 * floor) {
    warnings.push(
      `the model leaves a residual of ${(rmsResidual / floor).toFixed(1)}x the noise level: the circuit may not be second order, or the window includes the excitation`,
    );
  }
}

function failedFit(set: FitSet, noise: number, warnings: string[], message: string): ResponseFit {
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
