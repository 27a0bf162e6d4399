// A response that jumps at the event (a capacitor's current, an inductor's voltage), or whose start a finite edge
// bends: its free-start fit, and whether the record asks for it.

import { solveAmplitudes, Workspace } from './amplitudes';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { searchLayouts } from './layoutSearch';
import { effectiveSamples, information } from './modelSelection';
import { refine } from './refine';
import { LAYOUTS, layoutValues, unpackParams, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { RateCandidate } from './startingRates';
import { compareStarts, continuousStartRejected, startAllowance, type StartAllowance } from './stepStart';

/** Event times tried either side of the detected event and the continuous fit's t0, in set values. */
const SCAN_VALUES = 4;
/**
 * Event times tried in each of the scan's two passes: over the whole reach, then one raw sample apart (or as
 * fine as this allows) across two coarse steps either side of the best coarse one. The residual changes
 * smoothly with t0 at fixed rates, so two passes find what one pass over every raw sample found, at a
 * tenth of the cost on a block-averaged record (where the reach spans thousands of raw samples).
 */
const SCAN_POSITIONS = 160;
/** Coarse steps either side of the best coarse event time that the fine pass covers. */
const FINE_REACH_STEPS = 2;
/**
 * A jump is taken as found only when it exceeds this many noise levels of one value: far beyond what
 * the first sample's noise could make (one sample in 10^6 lies 5 sigma out; common practice).
 */
const JUMP_NOISE = 5;

/** Moves of a free fit's event time (each a sample or so: the first scan is off by one or two where it is off at all). */
const EVENT_MOVES = 4;

/** The continuous fit's alpha and omega0, which the free start is refined from. */
type Rates = { alpha: number; omega0: number };

/** The free-start fit and the event time it holds (between the last sample before the jump and the first after it). */
export interface JumpStartFit {
  attempt: Attempt;
  t0: number;
  /** y(t0+) - yPre of the fit. */
  jump: number;
}

/** What the start of a response asks for: the free start, or an allowance on the held start's alpha. */
export type StartChoice = { fit: JumpStartFit; note: string | null; allowance?: undefined } | { fit?: undefined; allowance: StartAllowance };

/**
 * The free start the record asks for, with the warning that says why (null: the jump's own, which assembleFit
 * words): a jump (showsJump), or a start the held fit bends its rates to meet (continuousStartRejected: a finite
 * edge). Or, where the two starts differ only suggestively, the held start with an allowance on alpha
 * (startAllowance). Null when the held start stands as it is. `stated`: the person asked for the free start.
 */
export function freeStartFor(
  set: FitSet,
  continuous: Attempt,
  candidates: RateCandidate[],
  t0Start: number,
  noise: number,
  stated: boolean,
): StartChoice | null {
  const rates = { alpha: attemptValue(continuous, 'alpha'), omega0: attemptValue(continuous, 'omega0') };
  const scan = scanEventTime(set, 'free-pre', rates, t0Start, attemptT0(continuous, t0Start));
  const asked = stated || beatsContinuous(continuous, scan.sse, continuous.values.length + 1, set, scan.t0);
  const fitted = asked ? fitJumpStart(set, rates, scan.t0, candidates, noise) : null;
  if (fitted && (stated || showsJump(continuous, fitted, set, noise))) return { fit: fitted, note: null };
  // The comparison needs a free start even where none beat the held one: refined once from its rates.
  const compared = fitted ?? refinedFreeStart(set, rates, scan.t0);
  const comparison = compareStarts(set, continuous, t0Start, compared.attempt, compared.t0);
  const note = continuousStartRejected(comparison);
  if (note) return { fit: fitted ?? fitJumpStart(set, rates, scan.t0, candidates, noise, compared.attempt) ?? compared, note };
  const allowance = startAllowance(comparison);
  return allowance ? { allowance } : null;
}

/**
 * The response fitted from any initial value at the event. With a jump, the event lies anywhere between
 * two samples (every place there fits alike), so t0 is held at `t0` (scanEventTime's, with the continuous
 * fit's rates), and the fit is refined from those rates (`fromRates`, when already refined) and from the ranked starts.
 */
function fitJumpStart(
  set: FitSet,
  rates: Rates,
  t0: number,
  candidates: RateCandidate[],
  noise: number,
  fromRates: Attempt = refinedFreeStart(set, rates, t0).attempt,
): JumpStartFit | null {
  const starts = [fromRates, ...searchLayouts(set, ['free-pre'], candidates, t0, noise)];
  const tried = starts.filter((a) => Number.isFinite(a.sse));
  if (tried.length === 0) return null;
  const best = tried.reduce((x, y) => (y.sse < x.sse ? y : x));
  return settleEventTime(set, best, t0, noise, (at, from) => refine(set, 'free-pre', { ...from, source: 'free fit at a moved event time' }, at));
}

/**
 * Moves the held event time while a fit there leaves less residual: to where a scan at the jumping fit's own rates
 * puts it, and one raw sample either way, each fitted by `fitAt`; up to EVENT_MOVES times. The first scan used the
 * rates of a fit held continuous at the event, which the jump bends: with them the least residual can lie a sample
 * or more off the jump, and samples of the level before then count as the response's (seen on rings with a strong
 * jump and a damping ratio near 0.2: alpha 10 % off, its uncertainty widened to 8 % by the misfit; and on single
 * decays, 10 samples early, which lost the decay to an unresolved ring). Where the jump falls between two samples
 * every event time there fits alike, so the fits compared differ in which samples are the response's.
 */
export function settleEventTime(set: FitSet, attempt: Attempt, t0: number, noise: number, fitAt: (t0: number, rates: Rates) => Attempt | null): JumpStartFit {
  const rawStep = set.block?.spacing ?? set.dt;
  const layout = attempt.layout;
  let best = { attempt, t0 };
  if (fitsAtEvent(set, attempt, t0, noise)) return { ...best, jump: jumpOf(attempt, t0) };
  const tried = [t0];
  for (let move = 0; move < EVENT_MOVES; move++) {
    const rates = ratesOf(best.attempt);
    const scanned = scanEventTime(set, layout, rates, best.t0, best.t0).t0;
    const places = [scanned, best.t0 - rawStep, best.t0 + rawStep].filter((t) => tried.every((u) => Math.abs(t - u) > rawStep / 2));
    let moved: typeof best | null = null;
    for (const place of places) {
      tried.push(place);
      const there = fitAt(place, rates);
      if (there && there.sse < (moved ?? best).attempt.sse) moved = { attempt: there, t0: place };
    }
    if (!moved) break;
    best = moved;
  }
  return { ...best, jump: jumpOf(best.attempt, best.t0) };
}

/**
 * A value either side of the one the event falls in, and that one, within this many noise levels of the fit: no
 * sample there is on the wrong side of the event (one would stand off by about the jump), so the event time stays.
 */
const EVENT_FIT_SIGMAS = 3;

/** Whether the values around the event time lie within EVENT_FIT_SIGMAS noise levels of the attempt held there. */
function fitsAtEvent(set: FitSet, attempt: Attempt, t0: number, noise: number): boolean {
  const reach = halfBlockSpan(set);
  const at = set.time.findIndex((t) => t + reach >= t0);
  if (at < 0) return false;
  const from = Math.max(0, at - 1);
  const to = Math.min(set.time.length, at + 2);
  const model = layoutValues(attempt.layout, attempt.values, t0, set.time.subarray(from, to), set.block);
  return model.every((m, k) => Math.abs(set.values[from + k] - m) <= EVENT_FIT_SIGMAS * noise);
}

/** An attempt's alpha and omega0 (a single decay's rate as both). */
function ratesOf(attempt: Attempt): Rates {
  const alpha = attemptValue(attempt, 'alpha');
  return { alpha, omega0: LAYOUTS[attempt.layout].order === 1 ? alpha : attemptValue(attempt, 'omega0') };
}

/** The free start refined from the continuous fit's rates, t0 held. */
function refinedFreeStart(set: FitSet, rates: Rates, t0: number): JumpStartFit {
  const attempt = refine(set, 'free-pre', { ...rates, source: 'continuous fit' }, t0);
  return { attempt, t0, jump: jumpOf(attempt, t0) };
}

/**
 * The event time to hold a jumping layout at: among places one raw sample apart around the detected event
 * and a continuous fit's t0, the one that leaves the least residual at the given rates.
 */
export function scanEventTime(
  set: FitSet,
  layout: ParameterLayout,
  rates: { alpha: number; omega0: number },
  detected: number,
  fitted: number,
): { t0: number; sse: number } {
  const rawStep = set.block?.spacing ?? set.dt;
  const reach = SCAN_VALUES * set.dt;
  const from = Math.min(detected, fitted) - reach;
  const to = Math.max(detected, fitted) + reach;
  // Positions sit half a step off the grid of raw samples, at the detected event snapped to it: between two samples,
  // not on one. (A block's mean time lies between two samples when the block holds an even number of them: placed
  // there, every position fell on a sample, and rounding decided on which side of the event that sample was.)
  const firstRaw = firstRawTime(set);
  const onGrid = firstRaw + Math.round((detected - firstRaw) / rawStep) * rawStep;
  const origin = onGrid - Math.ceil((onGrid - from) / rawStep) * rawStep;
  const workspace = new Workspace(set.time.length);
  let best = { t0: detected, sse: Infinity };
  const pass = (start: number, end: number, step: number) => {
    const first = Math.ceil((start - origin) / step - 0.5);
    for (let k = first; origin + (k + 0.5) * step <= end; k++) {
      const t = origin + (k + 0.5) * step;
      const { sse } = solveAmplitudes(layout, set.time, set.values, rates.alpha, rates.omega0, t, workspace, set.block);
      if (sse < best.sse) best = { t0: t, sse };
    }
  };
  const coarse = Math.max(rawStep, Math.ceil((to - origin) / SCAN_POSITIONS / rawStep) * rawStep);
  pass(origin, to, coarse);
  if (coarse > rawStep) {
    const centre = best.t0;
    const fine = Math.max(rawStep, Math.ceil((2 * FINE_REACH_STEPS * coarse) / SCAN_POSITIONS / rawStep) * rawStep);
    pass(centre - FINE_REACH_STEPS * coarse, centre + FINE_REACH_STEPS * coarse, fine);
  }
  return best;
}

/** The time of the set's first raw sample: its first value's, less half a block's span when it holds block means. */
function firstRawTime(set: FitSet): number {
  return set.time[0] - halfBlockSpan(set);
}

/** From a value's time to its block's first sample (0 without blocks). */
function halfBlockSpan(set: FitSet): number {
  return set.block ? ((set.block.samples - 1) / 2) * set.block.spacing : 0;
}

/**
 * Whether the record shows a jump at the event: the jump must stand far out of the noise, and the free
 * start must win on the information criterion with its event time counted as a parameter (it was
 * searched for, as the continuous fits fit theirs).
 */
export function showsJump(continuous: Attempt, free: JumpStartFit, set: FitSet, noise: number): boolean {
  if (!(Math.abs(free.jump) > JUMP_NOISE * noise)) return false;
  return beatsContinuous(continuous, free.attempt.sse, free.attempt.values.length + 1, set, free.t0);
}

/** y(t0+) - yPre of an attempt of a layout with a level before the event, held at t0. */
export function jumpOf(attempt: Attempt, t0: number): number {
  const p = unpackParams(attempt.layout, attempt.values, t0);
  return p.yFinal + p.a - p.yPre;
}

/** Whether a free-start residual with that many parameters beats the continuous fit on the information criterion. */
export function beatsContinuous(continuous: Attempt, sse: number, parameters: number, set: FitSet, t0: number): boolean {
  const n = effectiveSamples([continuous], set, t0);
  return information(sse, parameters, n) < information(continuous.sse, continuous.values.length, n);
}
