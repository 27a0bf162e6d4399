// Isolated spikes: single samples that stand far off both neighbours (pickup, a glitch), which no response of the
// circuit makes and which a least-squares fit cannot absorb.

import { MAD_TO_SIGMA, median, quantisationStep } from './noise';

/**
 * A spike's height, in the local noise's standard deviations, from which it is taken for one: far beyond the largest
 * of a million normal samples (about 5), so that noise is never removed (our choice).
 */
export const SPIKE_SIGMAS = 10;
/**
 * How far the neighbours' fourth differences may stand from a lone spike's pattern, in their local standard
 * deviations: a step, a corner or a ring sampled a few times a period leaves far more (our choice).
 */
const PATTERN_SIGMAS = 5;
/** Samples either side of a candidate whose fourth differences give the local noise (a ring's curvature included). */
const LOCAL_SPAN = 24;
/** At most this many fourth differences give the record's noise level (evenly strided). */
const GLOBAL_SAMPLES = 20000;
/**
 * A fourth difference y[i-2] - 4 y[i-1] + 6 y[i] - 4 y[i+1] + y[i+2] of white noise has variance 70 sigma^2; a lone
 * spike of height h gives h, -4 h, 6 h, -4 h, h at i-2 ... i+2.
 */
const SPIKE_PATTERN = [1, -4, 6, -4, 1];

/**
 * Indices of the isolated single-sample spikes in `values`: a sample whose fourth difference is SPIKE_SIGMAS local
 * noise deviations or more (and at least that many quantisation steps) above the rest, that stands as far off each
 * neighbour on the same side, and whose four neighbours'
 * fourth differences are a lone spike's pattern within PATTERN_SIGMAS. A step, a ring's peak, two spikes side by side
 * or a burst are not taken (the fit then judges them). In increasing order.
 */
export function isolatedSpikes(values: Float64Array): number[] {
  const n = values.length;
  if (n < 2 * LOCAL_SPAN) return [];
  const d4 = (i: number) => values[i - 2] - 4 * values[i - 1] + 6 * values[i] - 4 * values[i + 1] + values[i + 2];
  const stride = Math.max(1, Math.floor((n - 4) / GLOBAL_SAMPLES));
  const sampled: number[] = [];
  for (let i = 2; i < n - 2; i += stride) sampled.push(Math.abs(d4(i)));
  // On a quantised record whose noise is below one step the median can be 0: a step is then the least a spike stands off.
  const floor = Math.max(MAD_TO_SIGMA * median(sampled), quantisationStep(values) * Math.sqrt(70));
  if (!(floor > 0)) return [];
  const spikes: number[] = [];
  // A spike of SPIKE_SIGMAS deviations has a fourth difference 6 times its height; the loop runs over every sample of
  // a long record before it is optimised, so the difference is written out in it.
  const least = 6 * SPIKE_SIGMAS * (floor / Math.sqrt(70));
  for (let i = 2; i < n - 2; i++) {
    const di = values[i - 2] - 4 * values[i - 1] + 6 * values[i] - 4 * values[i + 1] + values[i + 2];
    if (di < least && di > -least) continue;
    if (i > 2 && Math.abs(d4(i - 1)) > Math.abs(di)) continue;
    if (i < n - 3 && Math.abs(d4(i + 1)) > Math.abs(di)) continue;
    const spike = loneSpike(values, i, di / 6, floor, d4);
    if (spike) spikes.push(i);
  }
  return spikes;
}

/** Whether a spike of height h at i, taken away, leaves its neighbours' fourth differences at the local noise. */
function loneSpike(values: Float64Array, i: number, h: number, floor: number, d4: (i: number) => number): boolean {
  const n = values.length;
  const local: number[] = [];
  for (let j = Math.max(2, i - LOCAL_SPAN); j < Math.min(n - 2, i + LOCAL_SPAN + 1); j++) if (Math.abs(j - i) > 4) local.push(Math.abs(d4(j)));
  const sigma4 = Math.max(floor, MAD_TO_SIGMA * median(local));
  const sigma = sigma4 / Math.sqrt(70);
  if (Math.abs(h) < SPIKE_SIGMAS * sigma) return false;
  // It stands that far off each neighbour, on the same side: the last sample before a jump into a steep ring can leave
  // a spike's pattern of fourth differences while standing within the noise of the sample before it.
  const offLeft = values[i] - values[i - 1];
  const offRight = values[i] - values[i + 1];
  if (!(offLeft * offRight > 0 && Math.min(Math.abs(offLeft), Math.abs(offRight)) >= SPIKE_SIGMAS * sigma)) return false;
  for (let k = -2; k <= 2; k++) {
    const j = i + k;
    if (j < 2 || j >= n - 2) continue;
    if (Math.abs(d4(j) - SPIKE_PATTERN[k + 2] * h) > PATTERN_SIGMAS * sigma4) return false;
  }
  return true;
}
