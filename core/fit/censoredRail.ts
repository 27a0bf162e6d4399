// Finds a converter rail the clipping detector cannot see: an extreme value the fitted response says the noise should
// have carried many samples beyond, where none lies (a slow peak that lingers at the rail, entered and left gently).

import type { Trace } from './trace';
import { POINT_CHUNK, type ModelRange, type PointModel } from './pointModel';
import { chiSquareTail } from '../chiSquare';
import { quantisationStep } from './noise';

/**
 * Fewest samples the fit must expect beyond an extreme value, where none lies, for that value to be a rail. With no
 * rail the number expected beyond the record's own extreme is about 1 (the smallest of n draws leaves 1 / (n + 1) of
 * the mass beyond it), and none where 20 are expected has odds e^-20 (Poisson); over 1000 captures of the robustness
 * corpus (seeds 1 and 2) no record without a rail came above 5.4, so 20 leaves room for noise that is not quite
 * normal. As many must stand at the extreme: the samples a rail cut off are piled there, so fewer means the noise
 * was read too high, not a rail.
 */
const CENSORED_EXPECTED = 20;
/**
 * A rail is also taken where the samples standing at the extreme, at least this many, are ones the fit says lie beyond
 * it: -sum ln(1 - p_i) over them (p_i each one's chance of lying beyond) reaches CENSORED_EXPECTED, so that none of
 * them lying beyond has odds e^-20 as above. The first peaks of a fast ring clipped for a sample or two each are too
 * few for the count above, each nearly sure to lie beyond; a level a few codes under the top code spreads its chances
 * over the whole level instead, and the samples at the top code carry little of them (our choice). Fewer than this
 * at an extreme spares the record the test (a lone sample at the record's extreme is no pile).
 */
const MIN_AT_RAIL = 3;

/**
 * Smallest bound on the shift of a fitted quantity, in its standard errors, for which an unseen rail is acted on.
 * Leaving out the samples near a rail costs what they tell: a rail that trims a level's noise 3 noise levels out
 * takes 0.0004 of a noise level from each of its samples, under a tenth of a standard error up to 68 000 samples,
 * yet the guard would leave the whole level out. A shift of a third of a standard error leaves a 3-se test failing
 * 0.43 % of the time instead of 0.27 %.
 */
const MATERIAL_SHIFT = 1 / 3;
/** Samples fitted further inside a rail than this many noise levels are skipped: their chance of crossing is under 1e-15. */
const TAIL_LIMIT = 8;
/**
 * The residual spread is read from at most about this many of the model's chunks, evenly spaced over a long window: 16
 * chunks hold 131 072 samples, which give a spread within 0.2 % (1 / sqrt(2 n)), far finer than the thresholds above
 * tell apart. Computing the model at every sample of a 10^6-sample record took 50 ms of a 0.75 s command.
 */
const SPREAD_CHUNKS = 16;

/** The fit window's samples [from, to): the extremes of the unclipped ones and how many stand at each. */
interface Extremes {
  from: number;
  to: number;
  lo: number;
  hi: number;
  atLo: number;
  atHi: number;
  /** Whether a sample flagged clipped lies at or beyond that extreme (a rail the detector found). */
  railLo: boolean;
  railHi: boolean;
}

/** One pass over the window's samples: their extremes, how many stand at each, and the extremes of the flagged samples. */
function windowExtremes(trace: Trace, { from, to }: { from: number; to: number }): Extremes | null {
  const { values, clipped } = trace;
  let lo = Infinity;
  let hi = -Infinity;
  let atLo = 0;
  let atHi = 0;
  let clippedLo = Infinity;
  let clippedHi = -Infinity;
  for (let i = from; i < to; i++) {
    const v = values[i];
    if (clipped?.[i]) {
      clippedLo = Math.min(clippedLo, v);
      clippedHi = Math.max(clippedHi, v);
      continue;
    }
    if (v === lo) atLo++;
    else if (v < lo) {
      lo = v;
      atLo = 1;
    }
    if (v === hi) atHi++;
    else if (v > hi) {
      hi = v;
      atHi = 1;
    }
  }
  if (!(hi > lo)) return null;
  return { from, to, lo, hi, atLo, atHi, railLo: clippedLo <= lo, railHi: clippedHi >= hi };
}

/** P(Z > z) for a standard normal Z: half the chi-square tail of z^2 with one degree of freedom. */
function normalTail(z: number): number {
  if (z === Infinity) return 0;
  if (z === -Infinity) return 1;
  const half = 0.5 * chiSquareTail(z * z, 1);
  return z >= 0 ? half : 1 - half;
}

/**
 * The noise of one sample about the fit: the residuals' mean square less the quantisation's q^2 / 12 (Sheppard's
 * correction; it reads the noise low below about half a code, which only makes the test below more cautious), over
 * SPREAD_CHUNKS of the window's chunks when it holds more.
 */
function sampleSpread(trace: Trace, ex: Extremes, model: PointModel, step: number): number {
  const { values, clipped } = trace;
  let sum = 0;
  let count = 0;
  // Sums are taken per chunk in locals: a double the closure writes on every sample is a fresh heap number each time.
  const visit = (first: number, y: Float64Array) => {
    let chunkSum = 0;
    for (let k = 0; k < y.length; k++) {
      const i = first + k;
      if (clipped?.[i] || !Number.isFinite(values[i])) continue;
      chunkSum += (values[i] - y[k]) ** 2;
      count++;
    }
    sum += chunkSum;
  };
  const chunks = Math.ceil((ex.to - ex.from) / POINT_CHUNK);
  const every = Math.max(1, Math.floor(chunks / SPREAD_CHUNKS));
  for (let c = 0; c < chunks; c += every) {
    const from = ex.from + c * POINT_CHUNK;
    model.forEachChunk(from, Math.min(ex.to, from + POINT_CHUNK), visit);
  }
  return Math.sqrt(Math.max(0, sum / count - (step * step) / 12));
}

/** Standard normal density. */
function normalDensity(z: number): number {
  return Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
}

/**
 * What a rail at an extreme (sign 1: above the highest value, -1: below the lowest) does under the fit: how many
 * samples the fit expects beyond it (a quantised sample lands beyond once its noise carries it past half a code
 * out), and a bound, in standard errors, on how far cutting them off there moves any fitted quantity. A sample
 * whose fitted value lies z noise levels inside the rail loses on average sigma (phi(z) - z Q(z)) of its noise
 * (the normal partial expectation); a least-squares fit moves any quantity by at most the norm of those losses
 * over sigma, in its standard errors (the projection onto the model's columns is no longer than the vector).
 */
function railEffect(trace: Trace, ex: Extremes, model: PointModel, sign: 1 | -1, step: number, spread: number): { expected: number; atRailSurprise: number; shift: number } {
  const { values, clipped } = trace;
  const rail = sign > 0 ? ex.hi : ex.lo;
  const edge = rail + (sign * step) / 2;
  let expected = 0;
  let atRailSurprise = 0;
  let shiftSquared = 0;
  // A chunk where the model stays over TAIL_LIMIT noise levels inside the edge adds nothing.
  const farInside = ({ lo, hi }: ModelRange) => (sign > 0 ? hi < edge - TAIL_LIMIT * spread : lo > edge + TAIL_LIMIT * spread);
  model.forEachChunk(
    ex.from,
    ex.to,
    (first, y) => {
      // Per chunk in locals, as in sampleSpread.
      let chunkExpected = 0;
      let chunkSurprise = 0;
      let chunkShift = 0;
      // A run of equal model values (a level before the event, a settled tail) has one z: its terms are computed once.
      let fitted = NaN;
      let z = 0;
      let beyond = 0;
      let loss = 0;
      for (let k = 0; k < y.length; k++) {
        const i = first + k;
        if (clipped?.[i] || !Number.isFinite(values[i])) continue;
        if (y[k] !== fitted) {
          fitted = y[k];
          z = (sign * (edge - fitted)) / spread;
          if (z <= TAIL_LIMIT) {
            beyond = normalTail(z);
            loss = (normalDensity(z) - z * beyond) ** 2;
          }
        }
        if (z > TAIL_LIMIT) continue;
        chunkExpected += beyond;
        if (values[i] === rail) chunkSurprise -= Math.log1p(-beyond);
        chunkShift += loss;
      }
      expected += chunkExpected;
      atRailSurprise += chunkSurprise;
      shiftSquared += chunkShift;
    },
    farInside,
  );
  return { expected, atRailSurprise, shift: Math.sqrt(shiftSquared) };
}

/**
 * The clipped flags with every sample at an unseen rail added, and a warning naming each; null when there is none.
 * An extreme is tested when no flagged sample already marks a rail on its side and at least MIN_AT_RAIL samples stand
 * at it; it is a rail when CENSORED_EXPECTED stand there and as many are expected beyond, or when those standing there
 * are, together, that unlikely not to lie beyond. `span` holds the fit window's samples [from, to); `model` is the
 * fitted response, read at them only when an extreme is tested.
 */
export function censoredRails(
  trace: Trace,
  span: { from: number; to: number },
  model: PointModel,
): { clipped: Uint8Array; warnings: string[] } | null {
  const ex = windowExtremes(trace, span);
  if (!ex) return null;
  const sides = ([1, -1] as const).filter((sign) => (sign > 0 ? !ex.railHi && ex.atHi >= MIN_AT_RAIL : !ex.railLo && ex.atLo >= MIN_AT_RAIL));
  if (sides.length === 0) return null;
  const step = quantisationStep(trace.values);
  const spread = sampleSpread(trace, ex, model, step);
  // Noise well under a code cannot be read from the residuals; it is cut off by a rail hardly at all.
  if (!(spread > 0)) return null;
  let clipped: Uint8Array | null = null;
  const warnings: string[] = [];
  for (const sign of sides) {
    const { expected, atRailSurprise, shift } = railEffect(trace, ex, model, sign, step, spread);
    const at = sign > 0 ? ex.atHi : ex.atLo;
    const piled = at >= CENSORED_EXPECTED && expected >= CENSORED_EXPECTED;
    if (!((piled || atRailSurprise >= CENSORED_EXPECTED) && shift >= MATERIAL_SHIFT)) continue;
    const rail = sign > 0 ? ex.hi : ex.lo;
    clipped ??= trace.clipped ? trace.clipped.slice() : new Uint8Array(trace.values.length);
    for (let i = 0; i < trace.values.length; i++) if (trace.values[i] === rail) clipped[i] = 1;
    const why = piled
      ? `the fit expects ${Math.round(expected)} samples beyond it and none lies there (their noise was cut off)`
      : `the fit puts the samples standing there beyond it, where none of them lies (by chance, odds under e^-${CENSORED_EXPECTED}: peaks cut off)`;
    warnings.push(`the ${sign > 0 ? 'highest' : 'lowest'} value (${rail} ${trace.unit}, ${at} samples) is taken as a converter rail: ${why}`);
  }
  return clipped ? { clipped, warnings } : null;
}
