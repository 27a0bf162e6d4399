// The samples a response fit uses: unclipped, inside the window, block-averaged when very long.

import type { Trace } from './trace';
import type { BlockAverage } from '../response/secondOrder';
import { estimateNoise, median } from './noise';
import { FitInputError } from './fitInputError';

export interface FitSet {
  /** The times and values fitted: views of the trace's own when they are its unbroken run (read, never written). */
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
  /** The blocks the values are means over (null when not decimated): the model is averaged alike. */
  block: BlockAverage | null;
  warnings: string[];
}

/** The samples a fit set was made of, before any block means: the event's rail test reads them (responseStart.ts). */
export interface KeptSamples {
  /** Views of the trace's own arrays when they are its unbroken run, else copies (read, never written). */
  time: Float64Array;
  values: Float64Array;
  /** Their smallest and largest value. */
  lo: number;
  hi: number;
  /** Whether their times never decrease, so that the samples before a time are a leading run of them. */
  ordered: boolean;
}

/** Fewest usable samples a response fit runs on: a handful per parameter, with the event among them. */
export const MIN_FIT_SAMPLES = 20;
/**
 * Above this many samples the fit runs on block means (the poles of a damped exponential survive averaging,
 * and the model is averaged over the same blocks, so the means are fitted without approximation).
 */
const MAX_RAW_POINTS = 3000;
/**
 * How many block means a longer record is reduced to, unless a block would then pass BLOCK_PER_PERIOD. A block
 * of at most 1/8 of the ring period keeps at least sinc(pi/8)^2 = 95 % of the ring's power, and 1000 means still
 * carry the decay and the event in hundreds of points; every solve of the fit costs in proportion to the points.
 */
export const BLOCK_MEANS_TARGET = 1000;
/** A block spans at most this fraction of the shortest period the sampling could carry. */
const BLOCK_PER_PERIOD = 1 / 8;
/**
 * A block of a response in which no ring period shows spans at most this fraction of its transit: its samples away
 * from both the level it starts at and the one it ends at. A decay from a step spends about 2.3 time constants there
 * (down to a tenth of the step), so a block is at most about 0.3 of a time constant. A 26 ns overdamped step in 25 us
 * had been averaged in blocks of 25 ns, which left its shape to a handful of points: its time constant read
 * 27 ns +- 250 ms. Over six noise draws of it, blocks of 1/4 of the transit (14 samples) still left three with no
 * finite uncertainty, and 1/6 three read as a single decay; 1/8 read zeta 1.41 to 1.61 for 1.52 in all six.
 */
const BLOCK_PER_TRANSIT = 1 / 8;
/**
 * Most block means a fit runs on, whatever the transit: every solve of the fit costs in proportion to the points, and
 * a decay shorter than a fourth of a record's 4000th part is left to the blocks this allows.
 */
const MAX_BLOCK_MEANS = 4 * BLOCK_MEANS_TARGET;
/**
 * The first samples of a record (this share, and at most HEAD_MAX of them) give the level a response starts from, for
 * its transit: most of them lie before the event whenever it comes after 500 samples (or a fortieth of the record).
 * Where fewer do, the samples before it count as transit too, and the blocks only come out shorter.
 */
const HEAD_SHARE = 0.05;
const HEAD_MAX = 1000;

export function prepareFitSet(trace: Trace, window: { start?: number; end?: number }): FitSet {
  return fitSetAndSamples(trace, window).set;
}

/** The fit set and the samples it was made of (the kept samples are not a field of the set: every set keeps one shape). */
export function fitSetAndSamples(trace: Trace, window: { start?: number; end?: number }): { set: FitSet; kept: KeptSamples } {
  const { time, values, clipped } = trace;
  if (time.length !== values.length) throw new FitInputError('trace', `time has ${time.length} samples but values has ${values.length}`);
  const start = window.start ?? -Infinity;
  const end = window.end ?? Infinity;
  if (start >= end) throw new FitInputError('window', `the fit window starts (${start} s) at or after its end (${end} s)`);
  // Each sample is read once: a long record's loop runs before it is optimised, when every read costs.
  const usable = (t: number, v: number) => t >= start && t <= end && Number.isFinite(v) && Number.isFinite(t);
  // The samples kept are counted, with the range of their values, whether they form one unbroken run and whether their times are in order.
  let count = 0;
  let clippedCount = 0;
  let first = -1;
  let last = -1;
  let lo = Infinity;
  let hi = -Infinity;
  let ordered = true;
  let previous = -Infinity;
  for (let i = 0; i < time.length; i++) {
    const ti = time[i];
    const v = values[i];
    if (!usable(ti, v)) continue;
    if (clipped && clipped[i]) {
      clippedCount++;
      continue;
    }
    if (ti < previous) ordered = false;
    previous = ti;
    if (first < 0) first = i;
    last = i;
    count++;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  // An unbroken run is read in place: a copy of a long record would cost the first touch of as much fresh memory.
  const kept = count === last - first + 1 ? { t: time.subarray(first, last + 1), y: values.subarray(first, last + 1), gapBefore: null } : keptSamples(trace, usable, count);
  const samples: KeptSamples = { time: kept.t, values: kept.y, lo, hi, ordered };
  let t: Float64Array = kept.t;
  let y: Float64Array = kept.y;
  const warnings: string[] = [];
  if (clippedCount > 0) warnings.push(`${clippedCount} clipped samples were left out of the fit`);
  const spacing: number[] = [];
  const stride = Math.max(1, Math.floor(t.length / 5000));
  for (let i = stride; i < t.length; i += stride) spacing.push(t[i] - t[i - 1]);
  const dt = spacing.length ? median(spacing) : NaN;
  let used = t.length;
  let decimation: FitSet['decimation'] = null;
  if (t.length > MAX_RAW_POINTS) {
    const most = Math.ceil(t.length / BLOCK_MEANS_TARGET);
    const scan = periodAndMeans(t, y, kept.gapBefore, hi - lo, most);
    // A ring's period bounds its blocks; a response in which no ring period shows, its transit.
    const rings = scan.periodSamples < t.length;
    const longest = rings ? scan.periodSamples * BLOCK_PER_PERIOD : scan.transitSamples * BLOCK_PER_TRANSIT;
    const factor = Math.max(1, Math.ceil(t.length / MAX_BLOCK_MEANS), Math.min(most, Math.floor(longest)));
    if (factor > 1) {
      [t, y] = factor === most ? scan.means : blockAverage(t, y, kept.gapBefore, factor);
      [lo, hi] = extremes(y);
      used = t.length * factor;
      decimation = {
        factor,
        note: `fitted on means of ${factor} consecutive samples (${t.length} points), each block at most ${rings ? `1/${1 / BLOCK_PER_PERIOD} of the ring period` : `1/${1 / BLOCK_PER_TRANSIT} of the response's transit`}, against the model averaged over the same blocks`,
      };
    }
  }
  const set: FitSet = {
    time: t,
    values: y,
    dt: decimation ? dt * decimation.factor : dt,
    range: hi - lo,
    samplesUsed: used,
    window: { start: t.length ? t[0] : NaN, end: t.length ? t[t.length - 1] : NaN },
    decimation,
    block: decimation ? { samples: decimation.factor, spacing: dt } : null,
    warnings,
  };
  return { set, kept: samples };
}

/** The smallest and the largest value (Infinity and -Infinity for none). */
function extremes(y: Float64Array): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < y.length; i++) {
    if (y[i] < lo) lo = y[i];
    if (y[i] > hi) hi = y[i];
  }
  return [lo, hi];
}

/**
 * Samples per ring period from the spacing of crossings of the median (a coarse, safe upper bound for blocks), the
 * samples of the response's transit (away from the levels at the record's head and its end, by the same band),
 * with `range` the spread of the finite values y; and, in the same pass, the block means of `factor` samples
 * (blockAverage's), which are the fit set whenever the ring is slow enough for blocks that long: a long record is
 * read once, not twice, while its loop is still cold.
 */
function periodAndMeans(
  t: Float64Array,
  y: Float64Array,
  gapBefore: Uint8Array | null,
  range: number,
  factor: number,
): { periodSamples: number; transitSamples: number; means: [Float64Array, Float64Array] } {
  const level = median(y.subarray(Math.floor(y.length * 0.8)));
  const head = median(y.subarray(0, Math.max(1, Math.min(HEAD_MAX, Math.floor(y.length * HEAD_SHARE)))));
  // Hysteresis of a tenth of the range, and of 4 noise levels, keeps noise from counting as crossings.
  const band = Math.max(range / 10, 4 * estimateNoise(y));
  const above = level + band;
  const below = level - band;
  let crossings = 0;
  let transitSamples = 0;
  let first = -1;
  let last = -1;
  let state = 0;
  const tb = new Float64Array(Math.floor(t.length / factor));
  const yb = new Float64Array(tb.length);
  let blocks = 0;
  let filled = 0;
  let st = 0;
  let sy = 0;
  for (let i = 0; i < y.length; i++) {
    const v = y[i];
    const s = v > above ? 1 : v < below ? -1 : 0;
    if (s !== 0 && (v > head + band || v < head - band)) transitSamples++;
    if (s !== 0 && s !== state) {
      if (state !== 0) {
        crossings++;
        if (first < 0) first = i;
        last = i;
      }
      state = s;
    }
    if (gapBefore && gapBefore[i]) filled = st = sy = 0;
    st += t[i];
    sy += v;
    if (++filled === factor) {
      tb[blocks] = st / factor;
      yb[blocks++] = sy / factor;
      filled = st = sy = 0;
    }
  }
  const periodSamples = crossings < 2 ? y.length : (2 * (last - first)) / (crossings - 1);
  return { periodSamples, transitSamples, means: [tb.subarray(0, blocks), yb.subarray(0, blocks)] };
}

/**
 * Copies of the kept samples (a long record is never held as a list of indices), and where a left-out sample
 * breaks their run (1 before the first sample after a gap): a block mean must not straddle it.
 */
function keptSamples(trace: Trace, usable: (t: number, v: number) => boolean, count: number): { t: Float64Array; y: Float64Array; gapBefore: Uint8Array } {
  const { time, values, clipped } = trace;
  const t = new Float64Array(count);
  const y = new Float64Array(count);
  const gapBefore = new Uint8Array(count);
  for (let i = 0, j = 0, last = -2; i < time.length; i++) {
    if (!usable(time[i], values[i]) || (clipped && clipped[i])) continue;
    gapBefore[j] = i === last + 1 ? 0 : 1;
    last = i;
    t[j] = time[i];
    y[j++] = values[i];
  }
  return { t, y, gapBefore };
}

/**
 * Means of `factor` consecutive samples. A block is restarted after a gap (left-out samples; `gapBefore` null:
 * none), and the partial block before a gap is dropped: the model is averaged over a whole, unbroken block.
 */
function blockAverage(t: Float64Array, y: Float64Array, gapBefore: Uint8Array | null, factor: number): [Float64Array, Float64Array] {
  const tb = new Float64Array(Math.floor(t.length / factor));
  const yb = new Float64Array(tb.length);
  let blocks = 0;
  let filled = 0;
  let st = 0;
  let sy = 0;
  for (let i = 0; i < t.length; i++) {
    if (gapBefore && gapBefore[i]) filled = st = sy = 0;
    st += t[i];
    sy += y[i];
    if (++filled === factor) {
      tb[blocks] = st / factor;
      yb[blocks++] = sy / factor;
      filled = st = sy = 0;
    }
  }
  return [tb.subarray(0, blocks), yb.subarray(0, blocks)];
}

/**
 * The set's values on its uniform grid (interval dt from its first sample), linear across the gaps that
 * left-out samples make: what the starting-value methods, which need uniform sampling, look at.
 */
export function uniformValues(set: FitSet): Float64Array {
  const { time, values, dt } = set;
  const n = time.length;
  if (n < 2 || !(dt > 0) || time[n - 1] - time[0] <= (n - 1) * dt * 1.001) return values;
  const out = new Float64Array(Math.round((time[n - 1] - time[0]) / dt) + 1);
  for (let k = 0, j = 0; k < out.length; k++) {
    const t = time[0] + k * dt;
    while (j < n - 2 && time[j + 1] < t) j++;
    const span = time[j + 1] - time[j];
    const f = span > 0 ? Math.min(1, Math.max(0, (t - time[j]) / span)) : 0;
    out[k] = values[j] + f * (values[j + 1] - values[j]);
  }
  return out;
}

/** Time of the first sample behind the set's point `index` (default the first): the first of its block when the set is block means. */
export function firstSampleTime(set: FitSet, index = 0): number {
  return set.block ? set.time[index] - ((set.block.samples - 1) / 2) * set.block.spacing : set.time[index];
}
