// The ring frequency along a record: one short fit per window, to see a frequency that drifts (a switch's voltage-dependent capacitance).
//
// In each window the ring is c + e^(-alpha u) (A cos(omega u) + B sin(omega u)), u = t - window start, with alpha
// held at the whole record's value; A, B and c are solved linearly for each omega (variable projection) and omega
// minimises the residual. Its standard error is from the curvature of that profile, var(omega) = 2 s^2 / SSE''(omega),
// s^2 = SSE / (n - 4): the Gauss-Newton variance of omega with A, B and c free (the Schur complement of least squares).

import type { Quantity } from '../quantity';

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
 * The ring frequency in `ring.windows` equal windows between ring.start and ring.end. Windows holding fewer than
 * MIN_PERIODS_PER_WINDOW periods or too few samples are left out, so the answer may hold fewer (or none).
 * Exported for any use case that needs the frequency at the same point of several captures.
 */
export function ringFrequencyAlong(time: ArrayLike<number>, values: ArrayLike<number>, ring: RingAlong): RingWindowFrequency[] {
  const count = ring.windows ?? DEFAULT_WINDOWS;
  const width = (ring.end - ring.start) / count;
  const period = (2 * Math.PI) / ring.omegaD;
  if (!(width >= MIN_PERIODS_PER_WINDOW * period)) return [];
  const block = blockLength(time, ring, count, period);
  const out: RingWindowFrequency[] = [];
  for (let w = 0; w < count; w++) {
    const start = ring.start + w * width;
    const end = start + width;
    const { u, y } = windowMeans(time, values, start, end, block);
    if (u.length < MIN_SAMPLES_PER_WINDOW) continue;
    // Centred: the level is solved anyway, and SSE = y'y - x'r then loses no digits to a large offset.
    const mean = y.reduce((sum, v) => sum + v, 0) / y.length;
    const fitted = fitWindow(u, y.map((v) => v - mean), ring.alpha, ring.omegaD, width);
    if (fitted) out.push({ start, end, ...fitted });
  }
  return out;
}

/**
 * Samples averaged per point, the same in every window (so amplitudes compare): enough to leave each window about
 * MAX_POINTS_PER_WINDOW points, never fewer than MIN_POINTS_PER_PERIOD per ring period. A mean over a block centred
 * on its time scales a ring by one factor in every block and shifts no phase, so the frequency is unchanged and its
 * standard error comes from the means' own scatter.
 */
function blockLength(time: ArrayLike<number>, ring: RingAlong, count: number, period: number): number {
  let inside = 0;
  for (let i = 0; i < time.length; i++) if (time[i] >= ring.start && time[i] < ring.end) inside++;
  const perWindow = inside / count;
  const perPeriod = (inside * period) / (ring.end - ring.start);
  return Math.max(1, Math.floor(Math.min(perWindow / MAX_POINTS_PER_WINDOW, perPeriod / MIN_POINTS_PER_PERIOD)));
}

/** The window's samples, u from its start, as means over consecutive blocks of `block` samples (a short last block dropped). */
function windowMeans(time: ArrayLike<number>, values: ArrayLike<number>, start: number, end: number, block: number): { u: number[]; y: number[] } {
  const u: number[] = [];
  const y: number[] = [];
  let sumT = 0;
  let sumY = 0;
  let held = 0;
  for (let i = 0; i < time.length; i++) {
    if (!(time[i] >= start && time[i] < end)) continue;
    sumT += time[i] - start;
    sumY += values[i];
    if (++held === block) {
      u.push(sumT / block);
      y.push(sumY / block);
      sumT = sumY = held = 0;
    }
  }
  return { u, y };
}

interface Profile {
  sse: number;
  amplitude: number;
}

/** SSE of the best A, B, c at this omega (3x3 normal equations). */
function profile(u: number[], y: number[], alpha: number, omega: number): Profile {
  const g = [0, 0, 0, 0, 0, 0];
  const r = [0, 0, 0];
  let yy = 0;
  for (let i = 0; i < u.length; i++) {
    const e = Math.exp(-alpha * u[i]);
    const c = e * Math.cos(omega * u[i]);
    const s = e * Math.sin(omega * u[i]);
    g[0] += c * c; g[1] += c * s; g[2] += c; g[3] += s * s; g[4] += s; g[5] += 1; // prettier-ignore
    r[0] += c * y[i]; r[1] += s * y[i]; r[2] += y[i]; // prettier-ignore
    yy += y[i] * y[i];
  }
  const m = [
    [g[0], g[1], g[2]],
    [g[1], g[3], g[4]],
    [g[2], g[4], g[5]],
  ];
  const x = solve3(m, r);
  if (!x) return { sse: Infinity, amplitude: 0 };
  // SSE = y'y - x'r at the least-squares solution.
  const sse = Math.max(0, yy - (x[0] * r[0] + x[1] * r[1] + x[2] * r[2]));
  return { sse, amplitude: Math.hypot(x[0], x[1]) };
}

function fitWindow(u: number[], y: number[], alpha: number, omegaGuess: number, width: number): Omit<RingWindowFrequency, 'start' | 'end'> | null {
  const resolution = (2 * Math.PI) / width;
  const sse = (omega: number) => profile(u, y, alpha, omega).sse;
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
  const at = profile(u, y, alpha, omega);
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
