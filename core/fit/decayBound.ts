// Whether a fitted ring rules out a single decay without fitting one: the least misfit any single decay could reach.

import { layoutValues } from './responseModel';
import { attemptT0, type Attempt } from './attempt';
import type { FitSet } from './fitSet';

/**
 * A single decay can be skipped when even its least possible misfit to the fitted ring exceeds the ring's
 * own residual by this many noise variances. At 400 (a misfit 20 noise levels long), noise can bring the
 * decay closer by at most about 2 x 20 x 3 = 120 variances (the cross term at 3 sigma), which still leaves
 * far more than any information criterion or F-test asks of the ring.
 */
const CLEAR_MARGIN_VARIANCES = 400;

/**
 * Whether no single decay could explain the set as well as the fitted ring. Every single-decay model
 * (with or without an event, a jump, a level before it) moves in at most two monotone pieces: a level or
 * a jump one way, then a decay towards its final value. So its squared distance from the ring's curve is
 * at least that of the best two-piece monotone (unimodal) sequence, found by pool-adjacent-violators from
 * each end (O(n)). When that exceeds the margin, the ring wins every comparison with a decay.
 */
export function ringRulesOutDecay(set: FitSet, ring: Attempt, t0Start: number, noise: number): boolean {
  const n = set.time.length;
  if (n < 4) return false;
  const model = layoutValues(ring.layout, ring.values, attemptT0(ring, t0Start), set.time, set.block);
  const variance = Math.max(noise * noise, ring.sse / n);
  return unimodalMisfit(model) > CLEAR_MARGIN_VARIANCES * variance;
}

/** Least squared distance from y to a sequence that rises then falls, or falls then rises. */
export function unimodalMisfit(y: ArrayLike<number>): number {
  const n = y.length;
  const reversed = Float64Array.from({ length: n }, (_, i) => y[n - 1 - i]);
  let best = Infinity;
  for (const direction of [1, -1] as const) {
    const head = monotoneMisfits(y, direction);
    const tail = monotoneMisfits(reversed, direction);
    // head[k]: the first k samples one way; tail[n - k]: the last n - k samples the other way (read backwards, the same way).
    for (let k = 0; k <= n; k++) best = Math.min(best, head[k] + tail[n - k]);
  }
  return best;
}

/**
 * misfit[k] = least squared distance from y[0..k) to a sequence that never falls (direction 1) or never
 * rises (direction -1): pool-adjacent-violators, keeping the running sum of each pool's squared deviations.
 */
function monotoneMisfits(y: ArrayLike<number>, direction: 1 | -1): Float64Array {
  const n = y.length;
  const misfit = new Float64Array(n + 1);
  const sums: number[] = [];
  const squares: number[] = [];
  const counts: number[] = [];
  const deviation = (j: number) => squares[j] - (sums[j] * sums[j]) / counts[j];
  let total = 0;
  for (let i = 0; i < n; i++) {
    const v = direction * y[i];
    sums.push(v);
    squares.push(v * v);
    counts.push(1);
    // Merge while the last pool's mean lies below the one before it.
    while (sums.length > 1) {
      const last = sums.length - 1;
      if (sums[last] / counts[last] >= sums[last - 1] / counts[last - 1]) break;
      total -= deviation(last - 1) + deviation(last);
      sums[last - 1] += sums[last];
      squares[last - 1] += squares[last];
      counts[last - 1] += counts[last];
      sums.pop();
      squares.pop();
      counts.pop();
      total += deviation(last - 1);
    }
    misfit[i + 1] = Math.max(0, total);
  }
  return misfit;
}
