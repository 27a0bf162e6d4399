// Clipped-rail guard: leaves out the samples the fit puts near a clipped rail (their noise is cut off there) and fits again.

import type { Trace } from './trace';
import { MIN_FIT_SAMPLES, prepareFitSet, type FitSet } from './fitSet';
import { layoutValues } from './responseModel';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { refine } from './refine';

/** Samples whose fitted value lies within this many noise levels of a rail are left out. */
const RAIL_MARGIN = 3;

/**
 * A sample beside a converter rail is kept only when its noise did not carry it onto the rail, so the
 * samples left near a rail read low (censored data). Once clipping was found, the samples whose fitted
 * value lies within 3 noise levels of a rail are left out too, and the fit is repeated on the rest from
 * the fit before (null when nothing more is left out, or too little would be left).
 */
export function refitAwayFromRails(
  trace: Trace,
  best: Attempt,
  t0Start: number,
  window: { start?: number; end?: number },
  sampleNoise: number,
): { set: FitSet; best: Attempt; warning: string } | null {
  const guarded = guardRails(trace, best, t0Start, window, sampleNoise);
  if (!guarded) return null;
  const start = { alpha: attemptValue(best, 'alpha'), omega0: attemptValue(best, 'omega0'), source: 'fit before the rail guard' };
  return { ...guarded, best: refine(guarded.set, best.layout, start, attemptT0(best, t0Start)) };
}

/** The fit set without the samples near a rail, and the warning that says so. */
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
  const margin = RAIL_MARGIN * sampleNoise;
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
  if (set.time.length < MIN_FIT_SAMPLES) return null;
  return {
    set,
    warning: `${added} more samples were left out because the fit puts them within ${RAIL_MARGIN} noise levels of a clipped rail (their noise is cut off there)`,
  };
}
