// Where the response starts in a record: the first clear departure from the level the record starts at.

import { blockMeans } from './blockMeans';
import { HEAD_FRACTION, median, robustSpread, stretchOf } from './noise';

export interface EventEstimate {
  /** Index of the first sample of the response (0 when the record starts inside it). */
  index: number;
  /** True when enough flat samples precede the event to fit t0 and the pre-event level. */
  hasPreEvent: boolean;
  /**
   * First sample surely inside the response: the first clear departure from the starting level, or 0 when
   * the record moves from its first sample. A fit without an event may start here.
   */
  responseFrom: number;
}

const NO_EVENT: EventEstimate = { index: 0, hasPreEvent: false, responseFrom: 0 };

/** Fewest flat samples before the event for t0 and the pre-event level to be fitted. */
export const MIN_PRE_EVENT = 10;
/** At the scale the event is looked for, its largest excursion must stand this many noise levels clear. */
const CONFIDENT_PEAK = 12;
/** Coarsest scale: at least this many block means over the record. */
const MIN_BLOCKS = 48;

/**
 * The event is where the record first leaves the level it starts at by well over the noise.
 * A record whose first samples already move (by more than the noise allows) starts inside the response.
 * When the response hardly stands out of the noise, the same test runs on means of 2, 4, 8... samples,
 * whose noise is lower, at the finest scale where the largest excursion stands clear of it.
 */
export function detectEvent(values: ArrayLike<number>, noise: number, step: number): EventEstimate {
  return detectEventAt(values, noise, step, true);
}

/** detectEvent, allowed (`retry`) or not to try again once with the noise read before the onset. */
function detectEventAt(values: ArrayLike<number>, noise: number, step: number, retry: boolean): EventEstimate {
  const n = values.length;
  for (let size = 1; size === 1 || n / size >= MIN_BLOCKS; size *= 2) {
    const y = size === 1 ? values : blockMeans(values, 0, n, size, Infinity);
    const blockNoise = noise / Math.sqrt(size);
    const blockStep = size === 1 ? step : 0;
    const found = detectAtScale(y, blockNoise, blockStep, Math.max(2, Math.ceil(MIN_PRE_EVENT / size)));
    if (found.peak < CONFIDENT_PEAK * blockNoise + 2 * blockStep) continue;
    // The last sample of the first block that stands clear: the response has begun by then.
    const responseFrom = found.first * size + size - 1;
    if (found.hasPreEvent) return { index: found.onset * size, hasPreEvent: true, responseFrom };
    // A stretch before the onset that is not flat at this noise level may be noise the estimate read low
    // (a bandwidth-limited front end): its own spread, where clearly larger, is tried once.
    const before = found.onset * size;
    if (retry && before >= 2 * MIN_PRE_EVENT) {
      const spread = robustSpread(stretchOf(values, 0, before));
      if (spread > NOISE_RETRY_GATE * noise) return detectEventAt(values, Math.min(spread, NOISE_RETRY_CAP * noise), step, false);
    }
    // A level too short to fit before the departure: the response surely runs from the departure on.
    return { index: 0, hasPreEvent: false, responseFrom: found.quietStart || found.onset > 0 ? responseFrom : 0 };
  }
  return detectByEnergy(values, noise);
}

/** A stretch's spread must exceed the noise estimate this much to be tried as the noise level... */
const NOISE_RETRY_GATE = 1.5;
/** ...and counts for at most this many times it (a stretch inside the response would read high). */
const NOISE_RETRY_CAP = 4;

/**
 * A ring about the starting level averages away in block means; its energy does not. The mean square
 * about the starting level over blocks of 16, 32... samples is noise^2 (spread noise^2 sqrt(2 / size))
 * before the event, and rises after it. Blocks of 16 or more keep the chi-square tail of a quiet block
 * short enough for a flat stretch to look flat.
 */
function detectByEnergy(values: ArrayLike<number>, noise: number): EventEstimate {
  const n = values.length;
  const baseline = median(stretchOf(values, 0, Math.max(MIN_PRE_EVENT, Math.floor(n * HEAD_FRACTION))));
  const variance = noise * noise;
  for (let size = 16; n / size >= MIN_BLOCKS; size *= 2) {
    const blocks = Math.floor(n / size);
    const energy = new Float64Array(blocks);
    for (let k = 0; k < blocks; k++) {
      let sum = 0;
      for (let i = k * size; i < (k + 1) * size; i++) sum += (values[i] - baseline) ** 2;
      energy[k] = sum / size - variance;
    }
    const spread = variance * Math.sqrt(2 / size);
    if (Math.max(...energy) < CONFIDENT_PEAK * spread) continue;
    const first = energy.findIndex((e) => e > 8 * spread);
    let onset = first;
    while (onset > 0 && energy[onset - 1] > 4 * spread) onset--;
    const minFlat = Math.max(2, Math.ceil(MIN_PRE_EVENT / size));
    const flat = energy.subarray(0, onset).every((e) => e <= 5 * spread);
    const responseFrom = flat && onset > 0 ? (first + 1) * size - 1 : 0;
    return { index: onset >= minFlat && flat ? onset * size : 0, hasPreEvent: onset >= minFlat && flat, responseFrom };
  }
  return NO_EVENT;
}

/** The event test on one sequence (samples or block means) with its own noise level and minimum flat stretch. */
function detectAtScale(
  values: ArrayLike<number>,
  noise: number,
  step: number,
  minFlat: number,
): { onset: number; first: number; hasPreEvent: boolean; quietStart: boolean; peak: number } {
  const n = values.length;
  const head = Math.max(minFlat, Math.floor(n * HEAD_FRACTION));
  const baseline = median(stretchOf(values, 0, head));
  let peak = 0;
  for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(values[i] - baseline));
  const quiet = 4 * noise + step;
  const threshold = Math.max(8 * noise + 2 * step, 0.1 * peak);
  let first = -1;
  for (let i = 0; i < n; i++) {
    if (Math.abs(values[i] - baseline) > threshold) {
      first = i;
      break;
    }
  }
  if (first < 0) return { onset: 0, first: 0, hasPreEvent: false, quietStart: false, peak };
  // The record starts flat unless its first samples move: one sample in the noise's tail does not count.
  let outside = 0;
  for (let i = 0; i < Math.min(first, minFlat); i++) if (Math.abs(values[i] - baseline) > quiet) outside++;
  const quietStart = outside <= 1;
  const onset = hingeOnset(values, quietStart ? departureReach(values, first, baseline, quiet, minFlat) : 0, first);
  return { onset, first, hasPreEvent: quietStart && onset >= minFlat, quietStart, peak };
}

/** Longest stretch the onset search fits at once; longer ones are fitted on block means. */
const HINGE_POINTS = 400;
/**
 * A departure from rest (quadratic) crosses 4 noise levels on its way to 8 after at most 1 / (sqrt 2 - 1) = 2.4
 * times its climb between the two; a linear one after at most once that climb. Four climbs back cover both
 * with room for a noisy last quiet sample.
 */
const CLIMBS_BACK = 4;

/**
 * Where the onset search begins: CLIMBS_BACK climbs (from the last quiet sample to the first clear one)
 * before the last quiet sample, and `minFlat` more for the level. Band-limited noise wanders over a long
 * flat stretch, and a slow departure fitted over all of it would start at the record's start.
 */
function departureReach(values: ArrayLike<number>, first: number, baseline: number, quiet: number, minFlat: number): number {
  let last = first - 1;
  while (last > 0 && Math.abs(values[last] - baseline) > quiet) last--;
  return Math.max(0, last - CLIMBS_BACK * (first - last) - minFlat);
}

/**
 * Where the record leaves its starting level, from the samples `start` to the first clear excursion
 * (index `first`): least squares of a level followed by a linear or a quadratic departure (a response
 * starts with a slope, or from rest), over every break point. Walking back to the last quiet sample
 * instead would place a slow start late by the time it takes to climb out of the noise.
 */
function hingeOnset(values: ArrayLike<number>, start: number, first: number): number {
  const size = Math.max(1, Math.ceil((first + 1 - start) / HINGE_POINTS));
  // The blocks end with the sample that crossed the threshold: the departure must be in the fit.
  const from = start + ((first + 1 - start) % size);
  const y = blockMeans(values, from, first + 1, size, Infinity);
  const n = y.length;
  if (n < 3) return first;
  let bestSse = Infinity;
  let bestBreak = 0;
  for (const power of [1, 2]) {
    for (let k = 0; k < n - 1; k++) {
      const sse = hingeResidual(y, k, power);
      if (sse < bestSse) {
        bestSse = sse;
        bestBreak = k;
      }
    }
  }
  return from + bestBreak * size;
}

/** Residual sum of squares of y = b (i <= k), b + c (i - k)^power (i > k), solved for b and c. */
function hingeResidual(y: Float64Array, k: number, power: number): number {
  const n = y.length;
  let sx = 0;
  let sxx = 0;
  let sy = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const x = i > k ? (i - k) ** power : 0;
    sx += x;
    sxx += x * x;
    sy += y[i];
    sxy += x * y[i];
    syy += y[i] * y[i];
  }
  const det = n * sxx - sx * sx;
  if (!(det > 0)) return Infinity;
  const c = (n * sxy - sx * sy) / det;
  const b = (sy - c * sx) / n;
  return syy - b * sy - c * sxy;
}
