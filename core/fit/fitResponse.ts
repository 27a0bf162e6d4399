// Fits the second-order response to one trace: runs the fit's steps in order; each step is its own module.

import { fitOrigin, rebasedOptions, rebasedTrace, restoredFit } from './timeOrigin';
import { formatEngineering } from '../units/format';
import { slowestDecayRate } from '../response/secondOrder';
import { estimateNoise, quantisationStep, recordNoise } from './noise';
import { locateResponse, settleEvent } from './responseStart';
import { rateCandidates } from './startingRates';
import { LAYOUTS, layoutsFor } from './responseModel';
import { firstSampleTime, fitSetAndSamples, MIN_FIT_SAMPLES, uniformValues } from './fitSet';
import { searchLayouts } from './layoutSearch';
import { chooseByInformation, explainRecord } from './modelSelection';
import { fitFirstOrderRecord, tailTimeConstant, type TailTimeConstant } from './firstOrderFit';
import { freeStartFor } from './jumpStart';
import { withAlphaAllowance } from './stepStart';
import { ringRulesOutDecay } from './decayBound';
import { refitAwayFromRails } from './railGuard';
import { subCodeNoiseWarning } from './fitWarnings';
import { responseCovariance } from './responseCovariance';
import { assembleFit, failedFit, noResponseFit } from './assembleFit';
import { FitInputError } from './fitInputError';
import { checkModeOptions, ringModes } from './modeOrder';
import type { Trace } from './trace';
import type { ResponseFit, ResponseFitOptions } from './responseFit';
import { attemptValue, type Attempt } from './attempt';

export type { Trace } from './trace';
export type { Regime, ResponseFit, ResponseFitOptions } from './responseFit';

/** A window whose samples all hold one value: no noise, no step, nothing to fit (a probe off, another channel meant, or a window beside the response). */
const FLAT_EVIDENCE = 'every usable sample holds one value';
const FLAT_MESSAGE = `no second-order response found: ${FLAT_EVIDENCE} (a flat line: a disconnected probe, the wrong channel, or a window that misses the response?)`;

/** ' (from 280 ns to 300 ns; the record runs from -50 ns to 250 ns)' for a window set at either end, so that a window beside the record shows as one; else ''. */
function windowAndRecord(window: { start?: number; end?: number }, { time }: Trace, origin: number): string {
  if (window.start === undefined && window.end === undefined) return '';
  const at = (t: number | undefined, open: string) => (t === undefined ? open : formatEngineering(t + origin, 's'));
  const finite = time.filter(Number.isFinite);
  const record = finite.length > 0 ? `; the record runs from ${at(finite[0], '')} to ${at(finite[finite.length - 1], '')}` : '';
  return ` (from ${at(window.start, 'the start')} to ${at(window.end, 'the end')}${record})`;
}

export function fitResponse(trace: Trace, options: ResponseFitOptions = {}): ResponseFit {
  const origin = fitOrigin(trace.time);
  if (origin === 0) return fitOnAxis(trace, options, 0);
  return restoredFit(fitOnAxis(rebasedTrace(trace, origin), rebasedOptions(options, origin), origin), origin);
}

/** The fit of a trace whose times are counted from `origin` (timeOrigin.ts), which only its messages add back. */
function fitOnAxis(trace: Trace, options: ResponseFitOptions, origin: number): ResponseFit {
  // The continuous layouts are fitted first; a jump at the event is looked for once they are (jumpStart.ts).
  const continuity = 'continuous';
  const jumpOption = options.continuity ?? 'auto';
  checkModeOptions(options);
  // Every window of the fit has the one shape, so the steps that read it are compiled once (not again per caller's shape).
  let window: { start?: number; end?: number } = { start: options.window?.start, end: options.window?.end };
  const prepared = fitSetAndSamples(trace, window);
  let set = prepared.set;
  if (set.time.length < MIN_FIT_SAMPLES) {
    throw new FitInputError('trace', `only ${set.time.length} usable samples in the fit window${windowAndRecord(window, trace, origin)}; at least ${MIN_FIT_SAMPLES} are needed`);
  }
  if (!(set.range > 0)) return { ...noResponseFit(set, 0, [...set.warnings], FLAT_EVIDENCE, trace.unit), message: FLAT_MESSAGE };
  // Block means lie few to a ring period: their noise is read from second differences (noise.ts).
  const noise = recordNoise(set.values, set.block !== null);
  const step = quantisationStep(set.values);
  // The event is looked for inside any window; without a level before it the fit starts where the response surely runs.
  const start = locateResponse(trace, set, prepared.kept, window, noise, step);
  ({ set, window } = start);
  const event = start.event;
  let t0Start = event.hasPreEvent ? set.time[event.index] : firstSampleTime(set);
  const warnings: string[] = [...set.warnings, ...start.warnings];
  const uniform = uniformValues(set);
  const eventOnGrid = Math.round((t0Start - set.time[0]) / set.dt);
  const candidates = rateCandidates(uniform, eventOnGrid, uniform.length, set.dt);

  const attempts = searchLayouts(set, layoutsFor({ hasPreEvent: event.hasPreEvent, continuity }), candidates, t0Start, noise);
  if (attempts.length === 0) return failedFit(set, noise, warnings, 'no damped response was found in the data (no usable starting values)');
  let best = chooseByInformation(attempts, set, t0Start);
  if (!Number.isFinite(best.sse)) return failedFit(set, noise, warnings, 'the solver did not reach a finite residual');
  // An event placed at or before the first sample, one the record does not clearly hold, or a level too short to fit: fitted without them.
  const settled = settleEvent(trace, set, window, best, event, candidates, noise);
  if (settled) {
    ({ set, window, best, t0Start } = settled);
    if (settled.warning) warnings.push(settled.warning);
  }

  const hasPreEvent = LAYOUTS[best.layout].preLevelColumn !== null;
  let jumpStart = false;
  let startNote: string | null = null;
  // An allowance holds for the held start's own attempt only: a later choice (a single decay, a refit away from the
  // rails, several modes) is another fit.
  let allowance: { held: Attempt; alphaVariance: number; warning: string } | null = null;
  if (hasPreEvent && jumpOption !== 'continuous') {
    const start = freeStartFor(set, best, candidates, t0Start, noise, jumpOption === 'free');
    if (start?.fit) {
      ({ attempt: best, t0: t0Start } = start.fit);
      jumpStart = true;
      startNote = start.note;
    } else if (start?.allowance) allowance = { held: best, ...start.allowance };
  }
  // A ring no single decay could come near is not compared with one (the decay's own fit is the costliest step).
  const ringDecayRate = slowestDecayRate(attemptValue(best, 'alpha'), attemptValue(best, 'omega0'));
  const firstOrder = ringRulesOutDecay(set, best, t0Start, noise) ? null : fitFirstOrderRecord(set, { hasPreEvent, jumpStart }, t0Start, noise, ringDecayRate);
  const explanation = explainRecord(best, t0Start, firstOrder, set, noise);
  if (explanation.misfit) return failedFit(set, noise, warnings, explanation.misfit);
  if (explanation.choice === 'none') return noResponseFit(set, noise, warnings, explanation.evidence, trace.unit);
  let tail: TailTimeConstant | undefined;
  if (explanation.choice === 'first-order' && firstOrder) {
    if (explanation.doubt) warnings.push(explanation.doubt);
    tail = tailTimeConstant(set, firstOrder.attempt, firstOrder.t0) ?? undefined;
    ({ attempt: best, t0: t0Start } = firstOrder);
    jumpStart = !LAYOUTS[best.layout].fitsT0 && hasPreEvent;
  }

  // The raw samples' own noise: the rail guard's margin and the dither test are about single samples.
  const sampleNoise = estimateNoise(trace.values);
  const guarded = LAYOUTS[best.layout].order === 2 ? refitAwayFromRails(trace, best, t0Start, window, sampleNoise) : null;
  if (guarded) {
    ({ set, best } = guarded);
    warnings.push(...guarded.warnings);
  }
  const subCode = subCodeNoiseWarning(trace.values, sampleNoise);
  if (subCode) warnings.push(subCode);

  // How many ringing modes the record holds (modeOrder.ts): a model with several replaces the one ring, with its own covariance.
  const modes = ringModes(set, best, t0Start, noise, options);
  const dof = set.time.length - best.values.length;
  const own = modes.multiMode?.covariance ?? responseCovariance(set, best.layout, best.values, t0Start, best.sse / Math.max(1, dof));
  const allowed = allowance && allowance.held === best && !modes.multiMode ? allowance : null;
  const cov = allowed ? withAlphaAllowance(own, allowed.alphaVariance) : own;
  warnings.push(...best.warnings, ...cov.warnings, ...(allowed ? [allowed.warning] : []));
  return assembleFit(trace, set, best, t0Start, cov, noise, warnings, { jumpStart, startNote, evidence: explanation.evidence, tailTimeConstant: tail, ...modes });
}
