// The ring frequency along a record: one short fit per window, to see a frequency that drifts (a switch's voltage-dependent capacitance).
//
// In each window the ring is c + e^(-alpha u) (A cos(omega u) + B sin(omega u)), u = t - window start, with alpha
// held at the whole record's value; A, B and c are solved linearly for each omega (variable projection) and omega
// minimises the residual. Its standard error is from the curvature of that profile, var(omega) = 2 s^2 / SSE''(omega),
// s^2 = SSE / (n - 4): the Gauss-Newton variance of omega with A, B and c free (the Schur complement of least squares).

import type { Quantity } from '../quantity';
import { firstAtOrAfter } from './peakFit';

export interface RingWindowFrequency {
  /** The window, s. */
  start: number;
  end: number;
  /** The ring frequency fitted in it, Hz, with its standard error. */
  frequency: Quantity;
  /** The ring's amplitude at the window's start (sqrt(A^2 + B^2)), in the trace's unit. */
  amplitude: number;
}

export interface RingAlong {
  /** Where the ring starts (the fit's t0) and where to stop looking, s. */
  start: number;
  end: number;
  /** The whole record's decay rate, s^-1 (held in each window), and ring frequency, rad/s (where each window's search starts). */
  alpha: number;
  omegaD: number;
  /** How many windows. Default 3. */
  windows?: number;
}

/** Fewer ring periods than this in a window leave its frequency too loose to compare. */
export const MIN_PERIODS_PER_WINDOW = 3;
/** Fewer samples than this in a window: too few for four parameters and a residual. */
const MIN_SAMPLES_PER_WINDOW = 16;
const DEFAULT_WINDOWS = 3;
/** Points a window's search works on at most: the profile is evaluated about 85 times, so a 10^6-sample record is averaged down (still 16 or more a period). */
const MAX_POINTS_PER_WINDOW = 1024;
/** Block means per ring period at least: a mean over 1/16 of a period keeps 99.4 % of the ring (sinc(pi/16)). */
const MIN_POINTS_PER_PERIOD = 16;
/** The search reaches this many frequency resolutions (2 pi / window length) either side of the record's frequency. */
const SEARCH_REACH = 2;
const SEARCH_POINTS = 41;
const GOLDEN_STEPS = 40;
/** Step of the curvature's finite difference, in frequency resolutions: small against the profile's width (about one). */
const CURVATURE_STEP = 0.02;

/**
 * The ring frequency in `ring.windows` equal windows between ring.start and ring.end, of samples in ascending time
 * (as a channel's). Windows holding fewer than MIN_PERIODS_PER_WINDOW periods or too few samples are left out, so
 * the answer may hold fewer (or none). Exported for any use case that needs the frequency at the same point of
 * several captures.
 */
export function ringFrequencyAlong(time: ArrayLike<number>, values: ArrayLike<number>, ring: RingAlong): RingWindowFrequency[] {
  return fittedWindows(ringWindowsAlong(time, values, ring));
}

/** Every window that is not left out, in order. */
export function fittedWindows(windows: RingWindows): RingWindowFrequency[] {
  const out: RingWindowFrequency[] = [];
  for (let w = 0; w < windows.count; w++) {
    const fitted = windows.fit(w);
    if (fitted) out.push(fitted);
  }
  return out;
}

/** The windows of ringFrequencyAlong, each fitted when first asked for: a caller comparing the two ends may need no others. */
export interface RingWindows {
  /** How many windows (0 when they would hold too few periods). */
  count: number;
  /** Window w (0-based), or null when it is left out. */
  fit(w: number): RingWindowFrequency | null;
}

export function ringWindowsAlong(time: ArrayLike<number>, values: ArrayLike<number>, ring: RingAlong): RingWindows {
  const count = ring.windows ?? DEFAULT_WINDOWS;
  const width = (ring.end - ring.start) / count;
  const period = (2 * Math.PI) / ring.omegaD;
  if (!(width >= MIN_PERIODS_PER_WINDOW * period)) return { count: 0, fit: () => null };
  const block = blockLength(time, ring, count, period);
  const fitted = new Map<number, RingWindowFrequency | null>();
  const fitAt = (w: number): RingWindowFrequency | null => {
    const start = ring.start + w * width;
    const end = start + width;
    const { u, y } = windowMeans(time, values, start, end, block);
    if (u.length < MIN_SAMPLES_PER_WINDOW) return null;
    const found = fitWindow(windowSeries(u, y, ring.alpha), ring.omegaD, width);
    return found && { start, end, ...found };
  };
  return {
    count,
    fit: (w) => {
      if (!fitted.has(w)) fitted.set(w, fitAt(w));
      return fitted.get(w) ?? null;
    },
  };
}

/**
 * Samples averaged per point, the same in every window (so amplitudes compare): enough to leave each window about
 * MAX_POINTS_PER_WINDOW points, never fewer than MIN_POINTS_PER_PERIOD per ring period. A mean over a block centred
 * on its time scales a ring by one factor in every block and shifts no phase, so the frequency is unchanged and its
 * standard error comes from the means' own scatter.
 */
function blockLength(time: ArrayLike<number>, ring: RingAlong, count: number, period: number): number {
  const inside = firstAtOrAfter(time, ring.end) - firstAtOrAfter(time, ring.start);
  const perWindow = inside / count;
  const perPeriod = (inside * period) / (ring.end - ring.start);
  return Math.max(1, Math.floor(Math.min(perWindow / MAX_POINTS_PER_WINDOW, perPeriod / MIN_POINTS_PER_PERIOD)));
}

/** The window's samples, u from its start, as means over consecutive blocks of `block` samples (a short last block dropped). */
function windowMeans(time: ArrayLike<number>, values: ArrayLike<number>, start: number, end: number, block: number): { u: Float64Array; y: Float64Array } {
  const from = firstAtOrAfter(time, start);
  const points = Math.floor((firstAtOrAfter(time, end) - from) / block);
  const u = new Float64Array(points);
  const y = new Float64Array(points);
  for (let k = 0, i = from; k < points; k++) {
    let sumT = 0;
    let sumY = 0;
    for (const last = i + block; i < last; i++) {
      sumT += time[i] - start;
      sumY += values[i];
    }
    u[k] = sumT / block;
    y[k] = sumY / block;
  }
  return { u, y };
}

/** A window's block means ready for the profile: y centred, and what does not depend on omega found once. */
interface WindowSeries {
  u: Float64Array;
  /** The means less their mean. Centred: the level is solved anyway, and SSE = y'y - x'r then loses no digits to a large offset. */
  y: Float64Array;
  /** e^(-alpha u), held across the search. */
  decay: Float64Array;
  sumY: number;
  sumSquares: number;
}

function windowSeries(u: Float64Array, means: Float64Array, alpha: number): WindowSeries {
  let total = 0;
  for (let i = 0; i < means.length; i++) total += means[i];
  const mean = total / means.length;
  const y = means.map((v) => v - mean);
  const decay = u.map((t) => Math.exp(-alpha * t));
  let sumY = 0;
  let sumSquares = 0;
  for (let i = 0; i < y.length; i++) {
    sumY += y[i];
    sumSquares += y[i] * y[i];
  }
  return { u, y, decay, sumY, sumSquares };
}

interface Profile {
  sse: number;
  amplitude: number;
}

/** SSE of the best A, B, c at this omega (3x3 normal equations). */
function profile(w: WindowSeries, omega: number): Profile {
  const { u, y, decay } = w;
  let cc = 0;
  let cs = 0;
  let sc = 0;
  let ss = 0;
  let ssum = 0;
  let cy = 0;
  let sy = 0;
  for (let i = 0; i < u.length; i++) {
    const c = decay[i] * Math.cos(omega * u[i]);
    const s = decay[i] * Math.sin(omega * u[i]);
    cc += c * c; cs += c * s; sc += c; ss += s * s; ssum += s; // prettier-ignore
    cy += c * y[i]; sy += s * y[i]; // prettier-ignore
  }
  const m = [
    [cc, cs, sc],
    [cs, ss, ssum],
    [sc, ssum, u.length],
  ];
  const r = [cy, sy, w.sumY];
  const x = solve3(m, r);
  if (!x) return { sse: Infinity, amplitude: 0 };
  // SSE = y'y - x'r at the least-squares solution.
  const sse = Math.max(0, w.sumSquares - (x[0] * r[0] + x[1] * r[1] + x[2] * r[2]));
  return { sse, amplitude: Math.hypot(x[0], x[1]) };
}

function fitWindow(w: WindowSeries, omegaGuess: number, width: number): Omit<RingWindowFrequency, 'start' | 'end'> | null {
  const { u } = w;
  const resolution = (2 * Math.PI) / width;
  const sse = (omega: number) => profile(w, omega).sse;
  // A grid over the reach, then golden-section refinement around its best point.
  let best = omegaGuess;
  let bestSse = Infinity;
  for (let k = 0; k < SEARCH_POINTS; k++) {
    const omega = omegaGuess + resolution * SEARCH_REACH * ((2 * k) / (SEARCH_POINTS - 1) - 1);
    const value = sse(omega);
    if (value < bestSse) [best, bestSse] = [omega, value];
  }
  const gridStep = (2 * SEARCH_REACH * resolution) / (SEARCH_POINTS - 1);
  let lo = best - gridStep;
  let hi = best + gridStep;
  const ratio = (Math.sqrt(5) - 1) / 2;
  let a = hi - ratio * (hi - lo);
  let b = lo + ratio * (hi - lo);
  let sseA = sse(a);
  let sseB = sse(b);
  for (let k = 0; k < GOLDEN_STEPS; k++) {
    if (sseA < sseB) {
      [hi, b, sseB] = [b, a, sseA];
      a = hi - ratio * (hi - lo);
      sseA = sse(a);
    } else {
      [lo, a, sseA] = [a, b, sseB];
      b = lo + ratio * (hi - lo);
      sseB = sse(b);
    }
  }
  const omega = (lo + hi) / 2;
  const at = profile(w, omega);
  const h = CURVATURE_STEP * resolution;
  const curvature = (sse(omega + h) - 2 * at.sse + sse(omega - h)) / (h * h);
  const dof = u.length - 4;
  if (!(curvature > 0) || !Number.isFinite(at.sse) || dof < 1) return null;
  const stderrOmega = Math.sqrt((2 * (at.sse / dof)) / curvature);
  const k = 1 / (2 * Math.PI);
  return { frequency: { value: omega * k, stderr: stderrOmega * k, unit: 'Hz' }, amplitude: at.amplitude };
}

/** Gaussian elimination with partial pivoting for a 3x3 system; null when singular. */
function solve3(m: number[][], r: number[]): number[] | null {
  const a = m.map((row, i) => [...row, r[i]]);
  for (let col = 0; col < 3; col++) {
    let pivot = col;
    for (let row = col + 1; row < 3; row++) if (Math.abs(a[row][col]) > Math.abs(a[pivot][col])) pivot = row;
    if (!(Math.abs(a[pivot][col]) > 0)) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let row = col + 1; row < 3; row++) {
      const f = a[row][col] / a[col][col];
      for (let j = col; j < 4; j++) a[row][j] -= f * a[col][j];
    }
  }
  const x = [0, 0, 0];
  for (let row = 2; row >= 0; row--) {
    let s = a[row][3];
    for (let j = row + 1; j < 3; j++) s -= a[row][j] * x[j];
    x[row] = s / a[row][row];
  }
  return x;
}
