// Where the fit starts: at the event the record holds, or, with no level before it to fit, where the response surely runs.

import type { Trace } from './trace';
import { detectEvent, MIN_PRE_EVENT, type EventEstimate } from './eventDetection';
import { firstSampleTime, MIN_FIT_SAMPLES, prepareFitSet, type FitSet, type KeptSamples } from './fitSet';
import { railHeadCount, type KeptRange } from './railGuard';
import { attemptValue, type Attempt } from './attempt';
import { refine } from './refine';
import { solveAmplitudes, Workspace } from './amplitudes';
import { shiftByHalfPeriods } from './halfPeriodShift';
import { LAYOUTS, layoutsFor, layoutValues } from './responseModel';
import { searchLayouts } from './layoutSearch';
import { chooseByInformation, effectiveSamples, information } from './modelSelection';
import type { RateCandidate } from './startingRates';
import { FitInputError } from './fitInputError';
import { estimateNoise, median, quantisationStep } from './noise';

type FitWindow = { start?: number; end?: number };

/** The layout without an event: t0 held at the first sample, the initial state free. */
const NO_EVENT_LAYOUT = 'free';

/**
 * A fit with an event and one without are told apart when their Bayesian information criteria differ by
 * more than this (very strong evidence on the 2 ln B scale: Kass and Raftery, JASA 90, 773, 1995; from memory).
 */
const CLEAR_EVIDENCE = 10;

const NOT_MEASURED = 't0 is that sample, not a measured event';

export interface ResponseStart {
  set: FitSet;
  window: FitWindow;
  event: EventEstimate;
  warnings: string[];
}

/**
 * The event in the fit set (of the caller's window or the whole record). A level before it that sits at a
 * converter rail is censored, not flat: those samples are left out, and the fit starts, without an event,
 * at the first sample surely inside the response (the window's start moves there, so every later fit set
 * starts there too).
 */
export function locateResponse(trace: Trace, set: FitSet, kept: KeptSamples, window: FitWindow, noise: number, step: number): ResponseStart {
  const event = detectEvent(set.values, noise, step);
  if (event.responseFrom === 0) return { set, window, event, warnings: [] };
  const departure = firstSampleTime(set, event.responseFrom);
  const { head, range } = keptBefore(kept, departure);
  const onRail = railHeadCount(head, range, noise);
  if (onRail === 0) return { set, window, event, warnings: [] };
  const moved = setFrom(trace, window, departure);
  if (moved.set.time.length < MIN_FIT_SAMPLES) {
    throw new FitInputError('trace', `only ${moved.set.time.length} usable samples follow where the response leaves the converter's rail; at least ${MIN_FIT_SAMPLES} are needed`);
  }
  const warning = `the level before the event sits at a converter rail: ${onRail} samples there are censored (the true level lies beyond the rail) and were left out; fitted without an event from where the response leaves the rail (${NOT_MEASURED})`;
  return { ...moved, event: { index: 0, hasPreEvent: false, responseFrom: 0 }, warnings: [warning] };
}

/** The fit's state once settleEvent has decided. */
export interface SettledStart {
  set: FitSet;
  window: FitWindow;
  best: Attempt;
  t0Start: number;
  /** Why the fit moved, for the reader; null when it only found an event the search had missed. */
  warning: string | null;
}

/**
 * Whether the record holds the event the fit placed, or was caught with the response in progress: a ring
 * caught near a peak looks flat for a while, and a response from rest is even about its start. The fit
 * with the event is kept only when it explains the record clearly better than one from the first sample
 * without an event; when that one explains it clearly better, the record starts inside the response;
 * when neither does, the fit runs without an event from the first sample surely inside the response.
 * A fit already without an event moves there too when it misses the samples before the departure (a level
 * too short to fit). Null when the fit stands.
 */
export function settleEvent(
  trace: Trace,
  set: FitSet,
  window: FitWindow,
  best: Attempt,
  event: EventEstimate,
  candidates: RateCandidate[],
  noise: number,
): SettledStart | null {
  const recordStart = firstSampleTime(set);
  const rates = { alpha: attemptValue(best, 'alpha'), omega0: attemptValue(best, 'omega0'), source: 'fit before' };
  if (!LAYOUTS[best.layout].fitsT0) {
    if (event.responseFrom === 0) {
      const hidden = eventInQuietHead(set, best, event, rates, noise);
      return hidden ? { set, window, best: hidden.best, t0Start: hidden.t0Start, warning: null } : null;
    }
    const fromRest = eventBeforeDeparture(set, best, event, rates, noise);
    if (fromRest) return { set, window, best: fromRest.best, t0Start: fromRest.t0Start, warning: null };
    if (!headMisfit(set, best, recordStart, event.responseFrom)) return null;
    return fromDeparture(trace, set, window, event, rates, SHORT_LEVEL);
  }
  const inProgress = `the record starts inside the response (it is explained better without an event in it): fitted from the first sample with the initial state free (${NOT_MEASURED})`;
  if (attemptValue(best, 't0') <= recordStart) {
    // The event was placed at or before the first sample: no sample sees the level before it.
    const searched = searchLayouts(set, [NO_EVENT_LAYOUT], candidates, recordStart, noise);
    const fromStart = [...searched, refine(set, NO_EVENT_LAYOUT, rates, recordStart)].reduce((x, y) => (y.sse < x.sse ? y : x));
    return Number.isFinite(fromStart.sse) ? { set, window, best: fromStart, t0Start: recordStart, warning: inProgress } : null;
  }
  if (holdsEventClearly(set, best, recordStart, noise)) return null;
  const fromStart = refine(set, NO_EVENT_LAYOUT, rates, recordStart);
  if (!Number.isFinite(fromStart.sse)) return null;
  const n = effectiveSamples([best, fromStart], set, recordStart);
  const gap = information(fromStart.sse, fromStart.values.length, n) - information(best.sse, best.values.length, n);
  if (gap > CLEAR_EVIDENCE) return null;
  if (gap < -CLEAR_EVIDENCE) return { set, window, best: fromStart, t0Start: recordStart, warning: inProgress };
  return fromDeparture(trace, set, window, event, rates, UNDECIDED);
}

/** t0 is started halfway between the record's start and the first clear departure (a quarter and three quarters of the way as well found no other fit on the corpus). */
const EVENT_START_SHARE = 0.5;

/**
 * The fit with an event before the first clear departure, when it explains the record clearly better than the
 * fit from the first sample: a response that leaves its level from rest (zero slope, as a capacitor's voltage
 * or an inductor's current in a natural response does) rises as the square of the time, and the event search,
 * fitting a level and a square up to a tenth of the swing, can place its start at the record's first sample
 * although the record holds a flat head. Fitted from that head's start as well, a free response bends through
 * the head and comes out biased by several standard errors, but its rates lie close: each layout with an event
 * is refined from them once (a full search from three t0 starts cost a sixth of a corpus batch's time and found
 * nothing more). Null when no such fit wins.
 */
function eventBeforeDeparture(set: FitSet, best: Attempt, event: EventEstimate, rates: RateCandidate, noise: number): { best: Attempt; t0Start: number } | null {
  if (flatHeadLength(set.values, noise) < MIN_PRE_EVENT) return null;
  const recordStart = firstSampleTime(set);
  const departure = set.time[event.responseFrom];
  const t0Start = recordStart + EVENT_START_SHARE * (departure - recordStart);
  // Each layout with an event refined once; the layouts then compared as the first search compares them.
  const found = layoutsFor({ hasPreEvent: true, continuity: 'continuous' })
    .map((layout) => refine(set, layout, rates, t0Start))
    .filter((attempt) => Number.isFinite(attempt.sse) && attemptValue(attempt, 't0') > recordStart && attemptValue(attempt, 't0') < departure);
  if (found.length === 0) return null;
  const chosen = chooseByInformation(found, set, recordStart);
  const n = effectiveSamples([best, chosen], set, recordStart);
  const gap = information(best.sse, best.values.length, n) - information(chosen.sse, chosen.values.length, n);
  return gap > CLEAR_EVIDENCE ? { best: chosen, t0Start } : null;
}

/** The t0 scan over a quiet head steps by this share of a ring period at most... */
const SCAN_PERIOD_SHARE = 1 / 8;
/** ...and tries at most this many places. */
const SCAN_POINTS = 400;

/**
 * The fit with an event inside a head that starts quiet, when the event search found no departure at all (a
 * response that never stands 12 noise levels clear, and whose block energies stay low): the fit then runs from
 * the first sample with a free initial state, which bends through the head and comes out biased by several
 * standard errors. For each layout with an event, the residual with the levels and amplitudes solved at the
 * free fit's rates is scanned over t0 across the stretch that stays within the noise of the starting level;
 * the layout is refined from the best place (and by half periods), and kept only when it beats the fit
 * without an event by CLEAR_EVIDENCE (the samples counted with the free fit's residual correlation, the larger
 * one, so the comparison errs towards the fit without an event). Null when none does.
 */
function eventInQuietHead(set: FitSet, best: Attempt, event: EventEstimate, rates: RateCandidate, noise: number): { best: Attempt; t0Start: number } | null {
  if (event.hasPreEvent) return null;
  const head = flatHeadLength(set.values, noise);
  if (head < 2 * MIN_PRE_EVENT) return null;
  const { alpha, omega0 } = rates;
  if (!(alpha > 0 && omega0 > 0)) return null;
  const recordStart = firstSampleTime(set);
  const from = set.time[MIN_PRE_EVENT];
  const to = set.time[Math.min(head, set.time.length - MIN_FIT_SAMPLES) - 1];
  if (!(to > from)) return null;
  const ring = omega0 > alpha ? (2 * Math.PI) / Math.sqrt(omega0 * omega0 - alpha * alpha) : 1 / alpha;
  const points = Math.min(SCAN_POINTS, Math.max(2, Math.ceil((to - from) / (SCAN_PERIOD_SHARE * ring))));
  const workspace = new Workspace(set.time.length);
  const n = effectiveSamples([best], set, recordStart);
  let chosen: { best: Attempt; t0Start: number } | null = null;
  let chosenInformation = Infinity;
  for (const layout of layoutsFor({ hasPreEvent: true, continuity: 'continuous' })) {
    let t0Start = from;
    let scanSse = Infinity;
    for (let k = 0; k <= points; k++) {
      const t0 = from + ((to - from) * k) / points;
      const { sse } = solveAmplitudes(layout, set.time, set.values, alpha, omega0, t0, workspace, set.block);
      if (sse < scanSse) {
        scanSse = sse;
        t0Start = t0;
      }
    }
    const refined = refine(set, layout, rates, t0Start);
    if (!Number.isFinite(refined.sse)) continue;
    const attempt = shiftByHalfPeriods(set, refined);
    if (!(attemptValue(attempt, 't0') > set.time[MIN_PRE_EVENT - 1])) continue;
    const value = information(attempt.sse, attempt.values.length, n);
    if (value < chosenInformation) {
      chosenInformation = value;
      chosen = { best: attempt, t0Start };
    }
  }
  if (!chosen) return null;
  const gap = information(best.sse, best.values.length, n) - chosenInformation;
  return gap > CLEAR_EVIDENCE ? chosen : null;
}

/** A sample of a flat head lies within this many noise levels of the head's level (4: a normal sample falls outside once in 16000). */
const FLAT_HEAD_NOISES = 4;

/**
 * How many samples from the record's start stay within FLAT_HEAD_NOISES noise levels of the median of its first
 * MIN_PRE_EVENT: a record that starts moving (a ring caught near a peak) has few, so the search for an event
 * before the departure is not paid for there.
 */
function flatHeadLength(values: Float64Array, noise: number): number {
  if (values.length < MIN_PRE_EVENT) return 0;
  const level = median(values.subarray(0, MIN_PRE_EVENT));
  let count = 0;
  while (count < values.length && Math.abs(values[count] - level) <= FLAT_HEAD_NOISES * noise) count++;
  return count;
}

/** Below this zeta a fitted response is a clear ring: it swings through its amplitude every half period. */
const CLEAR_RING_ZETA = 0.5;
/** A level the record holds for at least this many ring periods before the event cannot be a ring's swing. */
const FLAT_PERIODS = 1;
/** The response after the event must stand this many noise levels clear of the level before it. */
const CLEAR_RESPONSE_NOISES = 10;

/**
 * Whether the record surely holds the event the fit placed, so the comparison with a fit from the first
 * sample can be skipped: a clear ring, and a level before the event that lasts a ring period or more and
 * that the fit matches within the noise. A response caught in progress with a free initial state would be a
 * damped ring there, swinging at least as widely as it does later (its envelope only decays), so it cannot
 * stay flat for a period and then ring clear of the noise.
 */
function holdsEventClearly(set: FitSet, best: Attempt, recordStart: number, noise: number): boolean {
  const [alpha, omega0, t0] = [attemptValue(best, 'alpha'), attemptValue(best, 'omega0'), attemptValue(best, 't0')];
  if (!(alpha < CLEAR_RING_ZETA * omega0)) return false;
  const period = (2 * Math.PI) / Math.sqrt(omega0 * omega0 - alpha * alpha);
  if (!(t0 - recordStart >= FLAT_PERIODS * period)) return false;
  let headEnd = 0;
  while (headEnd < set.time.length && set.time[headEnd] < t0) headEnd++;
  if (headEnd === set.time.length || headMisfit(set, best, t0, headEnd)) return false;
  const model = layoutValues(best.layout, best.values, t0, set.time, set.block);
  const level = model[0];
  let swing = 0;
  for (let i = headEnd; i < model.length; i++) swing = Math.max(swing, Math.abs(model[i] - level));
  return swing > CLEAR_RESPONSE_NOISES * noise;
}

const SHORT_LEVEL = `too few flat samples precede the response to fit the level before it: fitted without an event from the first clear departure from the starting level (${NOT_MEASURED})`;
const UNDECIDED = `the record does not show clearly whether it holds the event or starts inside the response: fitted without an event from the first clear departure from the starting level (${NOT_MEASURED})`;

/** The fit without an event from the first sample surely inside the response (null when too little is left there). */
function fromDeparture(trace: Trace, set: FitSet, window: FitWindow, event: EventEstimate, rates: RateCandidate, warning: string): SettledStart | null {
  if (event.responseFrom === 0) return null;
  const moved = setFrom(trace, window, firstSampleTime(set, event.responseFrom));
  if (moved.set.time.length < MIN_FIT_SAMPLES) return null;
  const start = firstSampleTime(moved.set);
  const after = refine(moved.set, NO_EVENT_LAYOUT, rates, start);
  return Number.isFinite(after.sse) ? { ...moved, best: after, t0Start: start, warning } : null;
}

/** The residual over the samples before the departure may exceed its expectation by this many of its standard deviations. */
const HEAD_MISFIT_SIGMAS = 4;

/**
 * Whether a fit from the first sample without an event misses the samples before the clear departure: a
 * short level before the event, which that fit bends through. Their residual sum of squares against
 * noise^2 (k + 4 sqrt(2k)) for k samples (the chi-square's mean and 4 of its standard deviations). The
 * noise is read from first differences: a head inside the response would read high in its spread, and
 * band-limited noise reading low only moves the fit to the departure, which is right either way.
 */
function headMisfit(set: FitSet, fit: Attempt, t0: number, headEnd: number): boolean {
  const noise = estimateNoise(set.values);
  const model = layoutValues(fit.layout, fit.values, t0, set.time.subarray(0, headEnd), set.block);
  let sum = 0;
  for (let i = 0; i < headEnd; i++) sum += (set.values[i] - model[i]) ** 2;
  return sum > noise * noise * (headEnd + HEAD_MISFIT_SIGMAS * Math.sqrt(2 * headEnd));
}

/** The fit set of the window with its start moved to `start`, s. */
function setFrom(trace: Trace, window: FitWindow, start: number): { set: FitSet; window: FitWindow } {
  const moved = { start, end: window.end };
  return { set: prepareFitSet(trace, moved), window: moved };
}

/**
 * The kept samples (unclipped, inside the window) before `end` (s), and the range of all of them with the
 * quantisation step of the first STEP_SAMPLES: in order, the samples before `end` are a view of their leading run.
 */
function keptBefore(kept: KeptSamples, end: number): { head: Float64Array; range: KeptRange } {
  const { time, values } = kept;
  const range = { lo: kept.lo, hi: kept.hi, step: quantisationStep(values) };
  if (kept.ordered) {
    let count = 0;
    while (count < time.length && time[count] < end) count++;
    return { head: values.subarray(0, count), range };
  }
  let count = 0;
  for (let i = 0; i < time.length; i++) if (time[i] < end) count++;
  const head = new Float64Array(count);
  for (let i = 0, h = 0; h < count; i++) if (time[i] < end) head[h++] = values[i];
  return { head, range };
}
