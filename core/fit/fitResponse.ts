// Fits the second-order response to one trace: runs the fit's steps in order; each step is its own module.

import { estimateNoise, quantisationStep, recordNoise } from './noise';
import { detectEvent } from './eventDetection';
import { rateCandidates } from './startingRates';
import { LAYOUTS, layoutsFor } from './responseModel';
import { firstSampleTime, MIN_FIT_SAMPLES, prepareFitSet, uniformValues } from './fitSet';
import { attemptValue } from './attempt';
import { searchLayouts } from './layoutSearch';
import { chooseByInformation, explainRecord } from './modelSelection';
import { fitFirstOrderRecord } from './firstOrderFit';
import { fitJumpStart, showsJump } from './jumpStart';
import { refitAwayFromRails } from './railGuard';
import { subCodeNoiseWarning } from './fitWarnings';
import { responseCovariance } from './responseCovariance';
import { assembleFit, failedFit, noResponseFit } from './assembleFit';
import { FitInputError } from './fitInputError';
import type { Trace } from './trace';
import type { ResponseFit, ResponseFitOptions } from './responseFit';

export type { Trace } from './trace';
export type { Regime, ResponseFit, ResponseFitOptions } from './responseFit';

export function fitResponse(trace: Trace, options: ResponseFitOptions = {}): ResponseFit {
  // The continuous layouts are fitted first; a jump at the event is looked for once they are (jumpStart.ts).
  const continuity = 'continuous';
  const jumpOption = options.continuity ?? 'auto';
  const window = options.window ?? {};
  let set = prepareFitSet(trace, window);
  if (set.time.length < MIN_FIT_SAMPLES) {
    throw new FitInputError('trace', `only ${set.time.length} usable samples in the fit window; at least ${MIN_FIT_SAMPLES} are needed`);
  }
  const noise = recordNoise(set.values);
  const step = quantisationStep(set.values);
  // A window start the caller chose is taken as the start of the response.
  const event = options.window?.start !== undefined ? { index: 0, hasPreEvent: false } : detectEvent(set.values, noise, step);
  // Without a pre-event stretch the response is taken from the first sample on.
  let t0Start = event.hasPreEvent ? set.time[event.index] : firstSampleTime(set);
  const warnings: string[] = [...set.warnings];
  const uniform = uniformValues(set);
  const eventOnGrid = Math.round((t0Start - set.time[0]) / set.dt);
  const candidates = rateCandidates(uniform, eventOnGrid, uniform.length, set.dt);

  const attempts = searchLayouts(set, layoutsFor({ hasPreEvent: event.hasPreEvent, continuity }), candidates, t0Start, noise);
  if (attempts.length === 0) return failedFit(set, noise, warnings, 'no damped response was found in the data (no usable starting values)');
  let best = chooseByInformation(attempts, set, t0Start);
  if (!Number.isFinite(best.sse)) return failedFit(set, noise, warnings, 'the solver did not reach a finite residual');
  if (LAYOUTS[best.layout].fitsT0 && attemptValue(best, 't0') <= firstSampleTime(set)) {
    // The event was placed at or before the first sample: no sample sees the level before it.
    const recordStart = firstSampleTime(set);
    const fromStart = searchLayouts(set, layoutsFor({ hasPreEvent: false, continuity }), candidates, recordStart, noise);
    const fromStartBest = fromStart.length > 0 ? chooseByInformation(fromStart, set, recordStart) : null;
    if (fromStartBest && Number.isFinite(fromStartBest.sse)) {
      best = fromStartBest;
      t0Start = recordStart;
    }
  }

  const hasPreEvent = LAYOUTS[best.layout].preLevelColumn !== null;
  let jumpStart = false;
  if (hasPreEvent && jumpOption !== 'continuous') {
    const free = fitJumpStart(set, best, candidates, t0Start, noise, jumpOption === 'free');
    if (free && (jumpOption === 'free' || showsJump(best, free, set, noise))) {
      ({ attempt: best, t0: t0Start } = free);
      jumpStart = true;
    }
  }
  const firstOrder = fitFirstOrderRecord(set, { hasPreEvent, jumpStart }, t0Start, noise);
  const explanation = explainRecord(best, t0Start, firstOrder, set);
  if (explanation.choice === 'none') return noResponseFit(set, noise, warnings, explanation.evidence, trace.unit);
  if (explanation.choice === 'first-order' && firstOrder) {
    ({ attempt: best, t0: t0Start } = firstOrder);
    jumpStart = !LAYOUTS[best.layout].fitsT0 && hasPreEvent;
  }

  // The raw samples' own noise: the rail guard's margin and the dither test are about single samples.
  const sampleNoise = estimateNoise(trace.values);
  const guarded = LAYOUTS[best.layout].order === 2 ? refitAwayFromRails(trace, best, t0Start, window, sampleNoise) : null;
  if (guarded) {
    ({ set, best } = guarded);
    warnings.push(guarded.warning);
  }
  const subCode = subCodeNoiseWarning(trace.values, sampleNoise);
  if (subCode) warnings.push(subCode);

  const dof = set.time.length - best.values.length;
  const cov = responseCovariance(set, best.layout, best.values, t0Start, best.sse / Math.max(1, dof));
  warnings.push(...best.warnings, ...cov.warnings);
  return assembleFit(trace, set, best, t0Start, cov, noise, warnings, { jumpStart, evidence: explanation.evidence });
}
