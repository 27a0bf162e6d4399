// The samples a response fit uses: unclipped, inside the window, block-averaged when very long.

import type { Trace } from './fitResponse';
import { median } from './noise';
import { FitInputError } from './fitInputError';

export interface FitSet {
  time: Float64Array;
  values: Float64Array;
  /** Median sample interval of the set, s. */
  dt: number;
  /** max - min of the values. */
  range: number;
  /** Samples of the trace inside the window and not clipped. */
  samplesUsed: number;
  window: { start: number; end: number };
  decimation: { factor: number; note: string } | null;
  /** Width of the blocks the values are means over, s (0 when not decimated): the model is averaged alike. */
  blockWidth: number;
  warnings: string[];
}

/** Above this many samples the fit runs on block means (the poles of a damped exponential survive averaging). */
export const MAX_FIT_POINTS = 3000;
/** A block spans at most this fraction of the shortest period the sampling could carry. */
const BLOCK_PER_PERIOD = 1 / 8;

export function prepareFitSet(trace: Trace, window: { start?: number; end?: number }): FitSet {
  const { time, values, clipped } = trace;
  if (time.length !== values.length) throw new FitInputError('trace', `time has ${time.length} samples but values has ${values.length}`);
  const start = window.start ?? -Infinity;
  const end = window.end ?? Infinity;
  if (start >= end) throw new FitInputError('window', `the fit window starts (${start} s) at or after its end (${end} s)`);
  // Two passes over the trace (count, then copy) so that a long record is never held as a list of indices.
  const usable = (i: number) => time[i] >= start && time[i] <= end && Number.isFinite(values[i]) && Number.isFinite(time[i]);
  let count = 0;
  let clippedCount = 0;
  for (let i = 0; i < time.length; i++) {
    if (!usable(i)) continue;
    if (clipped && clipped[i]) clippedCount++;
    else count++;
  }
  let t: Float64Array = new Float64Array(count);
  let y: Float64Array = new Float64Array(count);
  for (let i = 0, j = 0; i < time.length; i++) {
    if (!usable(i) || (clipped && clipped[i])) continue;
    t[j] = time[i];
    y[j++] = values[i];
  }
  const warnings: string[] = [];
  if (clippedCount > 0) warnings.push(`${clippedCount} clipped samples were left out of the fit`);
  const spacing: number[] = [];
  const stride = Math.max(1, Math.floor(t.length / 5000));
  for (let i = stride; i < t.length; i += stride) spacing.push(t[i] - t[i - 1]);
  const dt = spacing.length ? median(spacing) : NaN;
  const used = t.length;
  let decimation: FitSet['decimation'] = null;
  if (t.length > MAX_FIT_POINTS) {
    const ringPeriod = roughPeriodSamples(y);
    const factor = Math.max(1, Math.min(Math.ceil(t.length / MAX_FIT_POINTS), Math.floor(ringPeriod * BLOCK_PER_PERIOD)));
    if (factor > 1) {
      [t, y] = blockAverage(t, y, factor);
      decimation = {
        factor,
        note: `fitted on means of ${factor} consecutive samples (${t.length} points), each block at most 1/8 of the ring period, against the model averaged over the same blocks`,
      };
    }
  }
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of y) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return {
    time: t,
    values: y,
    dt: decimation ? dt * decimation.factor : dt,
    range: hi - lo,
    samplesUsed: used,
    window: { start: t.length ? t[0] : NaN, end: t.length ? t[t.length - 1] : NaN },
    decimation,
    blockWidth: decimation ? dt * decimation.factor : 0,
    warnings,
  };
}

/** Samples per ring period from the spacing of crossings of the median (a coarse, safe upper bound for blocks). */
function roughPeriodSamples(y: Float64Array): number {
  const level = median(y.subarray(Math.floor(y.length * 0.8)));
  let crossings = 0;
  let first = -1;
  let last = -1;
  // Hysteresis of a tenth of the range keeps noise from counting as crossings.
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of y) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const band = (hi - lo) / 10;
  let state = 0;
  for (let i = 0; i < y.length; i++) {
    const s = y[i] > level + band ? 1 : y[i] < level - band ? -1 : 0;
    if (s !== 0 && s !== state) {
      if (state !== 0) {
        crossings++;
        if (first < 0) first = i;
        last = i;
      }
      state = s;
    }
  }
  if (crossings < 2) return y.length;
  return (2 * (last - first)) / (crossings - 1);
}

function blockAverage(t: Float64Array, y: Float64Array, factor: number): [Float64Array, Float64Array] {
  const blocks = Math.floor(t.length / factor);
  const tb = new Float64Array(blocks);
  const yb = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    let st = 0;
    let sy = 0;
    for (let i = k * factor; i < (k + 1) * factor; i++) {
      st += t[i];
      sy += y[i];
    }
    tb[k] = st / factor;
    yb[k] = sy / factor;
  }
  return [tb, yb];
}
