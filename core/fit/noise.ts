// Robust noise level of a sampled record, from its first differences and its flat head.

/** Median of a copy of the values (NaN for an empty list), by selection: the sorted median's value in linear time. */
export function median(values: ArrayLike<number>): number {
  return medianInPlace(copyOf(values, new Float64Array(values.length)));
}

/** The values copied into the start of `room` (a block copy from a typed array; Float64Array.from walks an iterator). */
function copyOf(values: ArrayLike<number>, room: Float64Array): Float64Array {
  const copy = room.subarray(0, values.length);
  copy.set(values);
  return copy;
}

/** The median of values the caller no longer needs, which are rearranged (NaN for an empty list). */
function medianInPlace(copy: Float64Array): number {
  const n = copy.length;
  if (n === 0) return NaN;
  if (holdsNaN(copy)) {
    copy.sort();
    return n % 2 ? copy[(n - 1) >> 1] : 0.5 * (copy[n / 2 - 1] + copy[n / 2]);
  }
  const upper = selectInPlace(copy, n >> 1);
  if (n % 2) return upper;
  // After the selection every value before index n/2 is at most the upper middle: the lower middle is their largest.
  let lower = -Infinity;
  for (let i = 0; i < n >> 1; i++) if (copy[i] > lower) lower = copy[i];
  return 0.5 * (lower + upper);
}

/** Whether any value is NaN (a plain loop: some(Number.isNaN) costs a call per value, ten times the time on long records). */
function holdsNaN(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (values[i] !== values[i]) return true;
  return false;
}

/** Partitions beyond this many times log2(n) fall back to sorting what is left, so no input makes the selection quadratic. */
const SELECT_PARTITIONS_PER_LOG = 3;

/**
 * The k-th smallest value (0-based) of NaN-free values, rearranged in place so that everything before index k is at most it
 * and everything after at least it (Hoare's selection, median-of-three pivots).
 */
function selectInPlace(a: Float64Array, k: number): number {
  let left = 0;
  let right = a.length - 1;
  let budget = SELECT_PARTITIONS_PER_LOG * Math.ceil(Math.log2(a.length + 1)) + 4;
  let state = SELECT_SEED;
  while (right > left) {
    if (budget-- <= 0) {
      a.subarray(left, right + 1).sort();
      return a[k];
    }
    // Three positions spread by a fixed-seed generator: ordered inputs (ramps, organ pipes) partition evenly too.
    const span = right - left + 1;
    state = nextState(state);
    const pivot = middleOfThree(a[left + (state % span)], a[left + ((state >>> 8) % span)], a[left + ((state >>> 16) % span)]);
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const held = a[i];
        a[i++] = a[j];
        a[j--] = held;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return a[k];
  }
  return a[k];
}

/** The pivot generator's seed and step (a 32-bit xorshift): fixed, so a median never depends on the run. */
const SELECT_SEED = 0x9e3779b9;
function nextState(x: number): number {
  x ^= x << 13;
  x ^= x >>> 17;
  x ^= x << 5;
  return x >>> 0;
}

function middleOfThree(a: number, b: number, c: number): number {
  return a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
}

/** values[from, to) without copying a typed array (a view), and as a copy of an ordinary one. */
export function stretchOf(values: ArrayLike<number>, from: number, to: number): ArrayLike<number> {
  return ArrayBuffer.isView(values) ? (values as Float64Array).subarray(from, to) : (Array.prototype.slice.call(values, from, to) as number[]);
}

/** How many of a record's first values its quantisation step is read from: enough steps to see the grid. */
export const STEP_SAMPLES = 4096;

/** Smallest non-zero step between sample values (the first `limit` of them): the quantisation step of an ADC record, or 0. */
export function quantisationStep(values: ArrayLike<number>, limit = STEP_SAMPLES): number {
  const n = Math.min(values.length, limit);
  const steps = new Float64Array(n);
  // Differences at the resolution of the floating-point values (block means of equal codes) are not steps.
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(values[i]));
  const resolution = 1e-12 * largest;
  let count = 0;
  for (let i = 1; i < n; i++) {
    const d = Math.abs(values[i] - values[i - 1]);
    if (d > resolution) steps[count++] = d;
  }
  if (count === 0) return 0;
  let smallest = Infinity;
  for (let i = 0; i < count; i++) if (steps[i] < smallest) smallest = steps[i];
  // Accept only when most steps are near-integer multiples of the smallest one.
  let onGrid = 0;
  for (let i = 0; i < count; i++) {
    const k = steps[i] / smallest;
    if (Math.abs(k - Math.round(k)) < 0.02) onGrid++;
  }
  return onGrid > 0.9 * count ? smallest : 0;
}

/**
 * Where the first-difference estimate exceeds the third-difference one by this factor, the signal's own slope is in
 * the first differences (a ring sampled finely at a high signal-to-noise ratio: 5.7 times the noise at 50 samples a
 * period and 200:1), and the third differences, which take out its slope and curvature too, give the noise. White
 * noise reads alike in both; noise correlated from one sample to the next reads at most 1.3 times higher in first
 * differences (AR(1) up to rho = 0.95: sqrt(1 - rho) against sqrt(1 - (15 rho - 6 rho^2 + rho^3) / 10)), and keeps
 * the first-difference estimate.
 */
const SLOPE_IN_DIFFERENCES = 1.5;
/**
 * The third-difference estimate is trusted only at this many quantisation steps or more: a median of differences
 * that are whole multiples of a step moves by whole steps (on 8-bit records with noise of a step, first and third
 * differences read 1.29 and 0.82 of the fit's residual), and the comparison above would then read the grid.
 */
const SLOPE_TEST_STEPS = 2;

/**
 * Standard deviation of white noise on a smooth signal: MAD of the first differences / (0.6745 sqrt 2), or of the
 * third differences / (0.6745 sqrt 20) where the signal's slope shows in the first (SLOPE_IN_DIFFERENCES).
 * On a quantised record whose noise is below one step the MAD is 0; then q / sqrt(12) is the floor.
 */
export function estimateNoise(values: ArrayLike<number>, start = 0, end = values.length): number {
  if (end - start < 3) return 0;
  const step = gridStep(values, start);
  const first = differenceNoise(values, start, end, 1);
  const third = end - start >= 4 ? differenceNoise(values, start, end, 3) : first;
  const slopeIn = first > SLOPE_IN_DIFFERENCES * third && third >= SLOPE_TEST_STEPS * step;
  return Math.max(slopeIn ? third : first, step / Math.sqrt(12));
}

/**
 * The same from second differences, y[i+1] - 2 y[i] + y[i-1] (MAD / (0.6745 sqrt 6) for white noise; common
 * practice), which take out a signal's slope as well as its level: for block means, whose points lie only 8 to
 * a few tens a ring period apart, so that a ring's slope enters first differences. Where a strong ring's curvature
 * shows in the second differences too (SLOPE_IN_DIFFERENCES over the fourth-difference estimate), the fourth
 * differences give the noise. On the 100 files of the 120-file corpus batch fitted on block means, the record's noise
 * over the fit's final residual rms has median 1.03 and 90th percentile 1.44 (second differences alone: 1.03 and 1.56;
 * first differences: a median of 1.58); 6 files that read 1.6 to 3.6 with second differences alone read 1.0 to 1.5.
 */
export function estimateNoiseOfMeans(values: ArrayLike<number>): number {
  if (values.length < 4) return estimateNoise(values);
  const second = differenceNoise(values, 0, values.length, 2);
  const fourth = values.length >= 5 ? differenceNoise(values, 0, values.length, 4) : second;
  return Math.max(second > SLOPE_IN_DIFFERENCES * fourth ? fourth : second, gridStep(values, 0) / Math.sqrt(12));
}

/** The variance of a difference of white noise, in sigma^2: the sum of the squared binomial weights (1 1, 1 2 1, 1 3 3 1, 1 4 6 4 1). */
const DIFFERENCE_VARIANCE = { 1: 2, 2: 6, 3: 20, 4: 70 } as const;

type DifferenceOrder = keyof typeof DIFFERENCE_VARIANCE;

/** White noise's standard deviation from the MAD of the differences of `order` 1 to 4 over [start, end), at most 20000 of them. */
function differenceNoise(values: ArrayLike<number>, start: number, end: number, order: DifferenceOrder): number {
  return medianInPlace(absoluteDifferences(values, start, end, order)) / (0.6745 * Math.sqrt(DIFFERENCE_VARIANCE[order]));
}

/**
 * |first| to |fourth differences| over [start, end), at most 20000 of them (evenly strided). A function of its own for
 * the reason deviationsFrom is: a fit reads the noise of one record several times.
 */
function absoluteDifferences(values: ArrayLike<number>, start: number, end: number, order: DifferenceOrder): Float64Array {
  const stride = Math.max(1, Math.floor((end - start) / 20000));
  // The first difference reads i - 1 and i, the second i - 1 to i + 1, the third i - 2 to i + 1, the fourth i - 2 to
  // i + 2: each inside [start, end).
  const first = order >= 3 ? start + 2 : start + 1;
  const last = order === 1 ? end : order === 4 ? end - 2 : end - 1;
  const diffs = new Float64Array(Math.max(0, Math.ceil((last - first) / stride)));
  let count = 0;
  if (order === 1) for (let i = first; i < last; i += stride) diffs[count++] = Math.abs(values[i] - values[i - 1]);
  else if (order === 2) for (let i = first; i < last; i += stride) diffs[count++] = Math.abs(values[i + 1] - 2 * values[i] + values[i - 1]);
  else if (order === 3) for (let i = first; i < last; i += stride) diffs[count++] = Math.abs(values[i + 1] - 3 * values[i] + 3 * values[i - 1] - values[i - 2]);
  else for (let i = first; i < last; i += stride) diffs[count++] = Math.abs(values[i + 2] - 4 * values[i + 1] + 6 * values[i] - 4 * values[i - 1] + values[i - 2]);
  return diffs;
}

/**
 * The quantisation step q of a record's first STEP_SAMPLES from `start` (0 off a grid); q / sqrt(12) is the noise a
 * quantised record has at least.
 */
function gridStep(values: ArrayLike<number>, start: number): number {
  return quantisationStep(values.length > STEP_SAMPLES ? stretchOf(values, start, start + STEP_SAMPLES) : values);
}

/**
 * A record's head, where its starting level and noise are read: the first 1 % of the record (its median is
 * the starting level while at least half of it lies before the event)...
 */
export const HEAD_FRACTION = 0.01;
/** ...and, for the noise, at least this many samples. */
const HEAD_MIN = 16;
/** How many times the first-difference estimate the spread of the record's head may be taken for noise. */
const HEAD_NOISE_CAP = 4;
/** Below this many times the difference estimate, a head's spread is sampling error (about 2 sd for 16 white samples). */
const HEAD_NOISE_GATE = 1.5;

/** Normal scale of a median absolute deviation, 1 / 0.6745: the standard deviation it stands for with normal samples. */
export const MAD_TO_SIGMA = 1.4826;

/**
 * MAD_TO_SIGMA times the median absolute deviation from the median: the standard deviation of normal samples, robustly.
 * `room` holds the one copy it works on (a caller reading many stretches passes the same room to each): a median
 * depends only on which values there are, so the deviations overwrite the copy the selection left rearranged.
 */
export function robustSpread(values: ArrayLike<number>, room = new Float64Array(values.length)): number {
  const copy = copyOf(values, room);
  deviationsFrom(copy, medianInPlace(copy));
  return MAD_TO_SIGMA * medianInPlace(copy);
}

/**
 * |value - centre| in place. A loop of its own: optimised while it ran inside robustSpread (on-stack replacement, in
 * the first of the event search's 33 calls), the code stopped where the rest had not yet run, and was entered and
 * thrown away again at every later call (20 times on a 10^6-sample record), the rest then run unoptimised.
 */
function deviationsFrom(values: Float64Array, centre: number): void {
  for (let i = 0; i < values.length; i++) values[i] = Math.abs(values[i] - centre);
}

/**
 * Noise level of a record that may start flat: the first-difference estimate, or the robust spread
 * of the record's head where that is clearly larger. Noise from a bandwidth-limited front end
 * is alike from one sample to the next, so its first differences read it low (2.2x at a neighbour
 * correlation of 0.8); a flat head shows it whole. A head inside the response would read high, so its
 * spread counts for at most HEAD_NOISE_CAP times the difference estimate.
 */
export function recordNoise(values: ArrayLike<number>, ofMeans = false): number {
  const fromDifferences = ofMeans ? estimateNoiseOfMeans(values) : estimateNoise(values);
  const head = stretchOf(values, 0, Math.max(HEAD_MIN, Math.floor(values.length * HEAD_FRACTION)));
  if (holdsSignal(head)) return fromDifferences;
  const spread = robustSpread(head);
  return spread > HEAD_NOISE_GATE * fromDifferences ? Math.min(spread, HEAD_NOISE_CAP * fromDifferences) : fromDifferences;
}

/**
 * A head whose steps go one way this often is inside the response (a ramp, the slope of a ring), and its spread is the
 * signal's. Noise steps up or down alike (any stationary noise: its differences have no mean), so 13 or more of 15
 * steps one way has odds under 1 % on a flat head of the 16 samples the shortest head holds (binomial), and far less
 * on longer ones. A step between equal values counts neither way.
 */
const HEAD_TREND_SHARE = 0.85;
/**
 * A head whose steps turn (up after down, or down after up) at most this share of the time is a smooth curve: a peak
 * or a trough of the response, which goes one way and then the other. Steps of white noise turn two times in three
 * (consecutive differences share a sample), of noise correlated 0.8 from one sample to the next about half the time:
 * 2 turns or fewer in 14 has odds under 0.4 % on a flat head of 16 samples (binomial).
 */
const HEAD_TURN_SHARE = 0.15;

/** Whether a head's steps mostly go one way (HEAD_TREND_SHARE) or seldom turn (HEAD_TURN_SHARE): a head inside the response. */
function holdsSignal(head: ArrayLike<number>): boolean {
  let up = 0;
  let down = 0;
  let turns = 0;
  let last = 0;
  for (let i = 1; i < head.length; i++) {
    const way = Math.sign(head[i] - head[i - 1]);
    if (way === 0 || Number.isNaN(way)) continue;
    if (way > 0) up++;
    else down++;
    if (last !== 0 && way !== last) turns++;
    last = way;
  }
  const steps = up + down;
  return steps > 0 && (Math.max(up, down) >= HEAD_TREND_SHARE * steps || (steps >= 2 && turns <= HEAD_TURN_SHARE * (steps - 1)));
}

/** Share of the data's range below which a noise level is not trusted (a record with no measurable noise). */
const NOISE_FLOOR_SHARE = 1e-12;

/** The noise level a residual is compared against: the noise, but never zero for a noiseless record. */
export function noiseFloor(noise: number, range: number): number {
  return Math.max(noise, NOISE_FLOOR_SHARE * range);
}
