// Clipped-rail guard: leaves out the samples the fit puts near a clipped rail (their noise is cut off there) and fits
// again; tells a record whose level before the event sits at a rail.

import { windowSpan, type Trace } from './trace';
import { MIN_FIT_SAMPLES, prepareFitSet, type FitSet } from './fitSet';
import { PointModel } from './pointModel';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { refine } from './refine';
import { censoredRails } from './censoredRail';

/** Samples whose fitted value lies within this many noise levels of a rail are left out. */
const RAIL_MARGIN = 3;

/**
 * A sample beside a converter rail is kept only when its noise did not carry it onto the rail, so the
 * samples left near a rail read low (censored data). Once clipping was found (by the importer, or here as a
 * rail the fit expects samples beyond: censoredRail.ts), the samples at a rail and those whose fitted value
 * lies within 3 noise levels of it are left out, and the fit is repeated on the rest from the fit before
 * (null when nothing more is left out, or too little would be left).
 */
export function refitAwayFromRails(
  trace: Trace,
  best: Attempt,
  t0Start: number,
  window: { start?: number; end?: number },
  sampleNoise: number,
): { set: FitSet; best: Attempt; warnings: string[] } | null {
  const span = windowSpan(trace.time, window);
  const model = new PointModel(best.layout, best.values, t0Start, trace.time);
  const unseen = censoredRails(trace, span, model);
  const railed = unseen ? { ...trace, clipped: unseen.clipped } : trace;
  const guarded = guardRails(railed, span, model, window, sampleNoise, unseen !== null);
  if (!guarded) return null;
  const start = { alpha: attemptValue(best, 'alpha'), omega0: attemptValue(best, 'omega0'), source: 'fit before the rail guard' };
  const warnings = [...(unseen?.warnings ?? []), ...guarded.warnings];
  return { set: guarded.set, best: refine(guarded.set, best.layout, start, attemptT0(best, t0Start)), warnings };
}

/**
 * The fit set without the samples at and near a rail, and the warning that says so (`newRails`: flags the fit did not
 * leave out yet); `model` is the fitted response, read at the window's samples `span`.
 */
function guardRails(
  trace: Trace,
  span: { from: number; to: number },
  model: PointModel,
  window: { start?: number; end?: number },
  sampleNoise: number,
  newRails: boolean,
): { set: FitSet; warnings: string[] } | null {
  const { clipped, values } = trace;
  // indexOf() scans natively: most records hold no clipped sample (flags are 0 or 1, as the importer marks them).
  if (!clipped || clipped.indexOf(1) < 0) return null;
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
  const margin = RAIL_MARGIN * sampleNoise;
  const guard = clipped.slice();
  let added = 0;
  model.forEachChunk(span.from, span.to, (first, y) => {
    for (let k = 0; k < y.length; k++) {
      if (!guard[first + k] && (y[k] > top - margin || y[k] < bottom + margin)) {
        guard[first + k] = 1;
        added++;
      }
    }
  });
  if (added === 0 && !newRails) return null;
  const set = prepareFitSet({ ...trace, clipped: guard }, window);
  if (set.time.length < MIN_FIT_SAMPLES) return null;
  const note = `${added} more samples were left out because the fit puts them within ${RAIL_MARGIN} noise levels of a clipped rail (their noise is cut off there)`;
  return { set, warnings: added > 0 ? [note] : [] };
}

/** Fewest samples before the departure for a pile-up at a rail to be told from the noise's tail. */
const MIN_RAIL_HEAD = 20;
/** Fewest samples exactly at the extreme that make a pile-up. */
const MIN_PILE = 3;
/**
 * With samples inward of it, the extreme is a rail once it holds this share of the head and at least as
 * many as the next value inward: a normal level's tail one code out holds less than its neighbour.
 */
const PILE_SHARE = 0.1;
/**
 * A level inside a code spreads its samples over the codes beside it once the noise is half a code (16 % on
 * each side; 20 samples all on one code with probability 0.68^20 < 1e-3), so a pile on one side is a rail.
 */
const SPREAD_CODES = 0.5;

/** The lowest and highest unclipped sample of the window, and the quantisation step of the first of them. */
export interface KeptRange {
  lo: number;
  hi: number;
  step: number;
}

/**
 * How many samples of the record's head (`head`: the unclipped samples before the response surely runs)
 * sit at the record's highest or lowest value (`range`: of every unclipped sample of the window) because
 * the level before the event lies at or beyond a converter rail: those samples are censored, not a flat
 * pre-event stretch. 0 when the head is not at a rail. `noise` is the record's noise level.
 */
export function railHeadCount(head: ArrayLike<number>, range: KeptRange, noise: number): number {
  if (head.length < MIN_RAIL_HEAD) return 0;
  return Math.max(pileAt(head, range.lo, 1, range.step, noise), pileAt(head, range.hi, -1, range.step, noise));
}

/** Samples of the head on `rail` when they pile up there (inward: +1 above a bottom rail, -1 below a top one), else 0. */
function pileAt(head: ArrayLike<number>, rail: number, inward: 1 | -1, step: number, noise: number): number {
  let onRail = 0;
  let next = Infinity;
  for (let i = 0; i < head.length; i++) {
    const distance = inward * (head[i] - rail);
    if (distance === 0) onRail++;
    else next = Math.min(next, distance);
  }
  // Noise below half a code leaves a level inside one code there: a pile on the extreme is no sign of a rail.
  if (onRail < MIN_PILE || (step > 0 && noise < SPREAD_CODES * step)) return 0;
  // The whole head on one value: with noise over codes only a rail holds it there; unquantised, a noiseless level.
  if (onRail === head.length) return step > 0 ? onRail : 0;
  if (onRail < PILE_SHARE * head.length) return 0;
  let besideRail = 0;
  for (let i = 0; i < head.length; i++) if (inward * (head[i] - rail) === next) besideRail++;
  return onRail >= besideRail ? onRail : 0;
}
