// Matrix pencil estimate of the poles of a sum of damped exponentials (Hua and Sarkar, IEEE Trans. ASSP 38(5), 1990).

import { boundedSvd } from './boundedSvd';
import { dominantRightVectors, type DominantRight } from './dominantRightVectors';

export interface Pole {
  /** ln|z| per sample (negative for decay). */
  re: number;
  /** arg z per sample, rad, in (-pi, pi]. */
  im: number;
}

/** The most poles asked for: the eigenvalues are taken in closed form (a loop-free cubic at most). */
const MAX_MODES = 3;

/**
 * Poles (per sample) of `modes` damped exponentials fitted to uniformly sampled y, by the
 * total-least-squares pencil with pencil parameter L = N/3 and rank truncation to `modes`.
 * No poles when y is not finite, is constant, or the decomposition does not settle: every step
 * ends in a bounded number of operations.
 */
export function matrixPencil(y: ArrayLike<number>, modes: number): Pole[] {
  return matrixPencils(y, [modes])[0];
}

/**
 * matrixPencil of y for each number of modes in `orders`, decomposing each distinct Hankel matrix once (the
 * orders share it whenever N/3 is at least the largest): the same poles as one call per order.
 */
export function matrixPencils(y: ArrayLike<number>, orders: readonly number[]): Pole[][] {
  for (const modes of orders) {
    if (!(Number.isInteger(modes) && modes >= 1 && modes <= MAX_MODES)) throw new RangeError(`matrixPencil: modes must be 1..${MAX_MODES}, got ${modes}`);
  }
  const n = y.length;
  if (isConstant(y)) return orders.map(() => []);
  const samples = Float64Array.from(y);
  const decompositions = new Map<number, DominantRight | null>();
  return orders.map((modes) => {
    const pencil = Math.max(modes, Math.floor(n / 3));
    const rows = n - pencil;
    if (rows <= modes) return [];
    if (!decompositions.has(pencil)) {
      const hankel = Array.from({ length: rows }, (_, i) => samples.subarray(i, i + pencil + 1));
      decompositions.set(pencil, dominantRightVectors(hankel, Math.min(MAX_MODES, pencil + 1)));
    }
    const svd = decompositions.get(pencil) ?? null;
    if (!svd || !(svd.values[modes - 1] > 0)) return [];
    const v1 = svd.V.slice(0, pencil).map((row) => row.slice(0, modes));
    const v2 = svd.V.slice(1, pencil + 1).map((row) => row.slice(0, modes));
    // pinv(V1) V2 is modes x modes; its eigenvalues are the poles z.
    const system = leastSquares(v1, v2);
    if (!system) return [];
    return eigenvalues(system)
      .filter(([re, im]) => Number.isFinite(re) && Number.isFinite(im) && (re !== 0 || im !== 0))
      .map(([re, im]) => ({ re: 0.5 * Math.log(re * re + im * im), im: Math.atan2(im, re) }));
  });
}

function isConstant(y: ArrayLike<number>): boolean {
  for (let i = 1; i < y.length; i++) if (y[i] !== y[0]) return false;
  return true;
}

/** pinv(a) b through the SVD of a, singular values below the usual rank tolerance dropped; null if it does not settle. */
function leastSquares(a: number[][], b: number[][]): number[][] | null {
  const svd = boundedSvd(a);
  if (!svd || !svd.converged) return null;
  const k = a[0].length;
  const tolerance = Number.EPSILON * Math.max(a.length, k) * svd.values[0];
  const inverse = svd.values.map((s) => (s > tolerance ? 1 / s : 0));
  // x = V diag(1/s) U^T b
  const utb = Array.from({ length: k }, (_, r) => b[0].map((_, c) => a.reduce((sum, _, i) => sum + svd.U[i][r] * b[i][c], 0) * inverse[r]));
  return Array.from({ length: k }, (_, i) => b[0].map((_, c) => utb.reduce((sum, row, r) => sum + svd.V[i][r] * row[c], 0)));
}

/** Eigenvalues [re, im] of a real 1x1, 2x2 or 3x3 matrix from its characteristic polynomial. */
function eigenvalues(m: number[][]): [number, number][] {
  if (m.length === 1) return [[m[0][0], 0]];
  if (m.length === 2) return quadraticRoots(-(m[0][0] + m[1][1]), m[0][0] * m[1][1] - m[0][1] * m[1][0]);
  const trace = m[0][0] + m[1][1] + m[2][2];
  const minors = m[0][0] * m[1][1] - m[0][1] * m[1][0] + m[0][0] * m[2][2] - m[0][2] * m[2][0] + m[1][1] * m[2][2] - m[1][2] * m[2][1];
  const det =
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  return cubicRoots(-trace, minors, -det);
}

/** Roots of x^2 + b x + c. */
function quadraticRoots(b: number, c: number): [number, number][] {
  const h = -b / 2;
  const d = h * h - c;
  if (d < 0) return [[h, Math.sqrt(-d)], [h, -Math.sqrt(-d)]];
  // The larger root first, the smaller from the product: no cancellation.
  const big = h + (h >= 0 ? 1 : -1) * Math.sqrt(d);
  return [[big, 0], [big !== 0 ? c / big : 0, 0]];
}

/** Roots of x^3 + a x^2 + b x + c: one real root (Cardano or the trigonometric form, two Newton polishes), then the quadratic left. */
function cubicRoots(a: number, b: number, c: number): [number, number][] {
  const p = b - (a * a) / 3;
  const q = (2 * a * a * a) / 27 - (a * b) / 3 + c;
  const d = (q * q) / 4 + (p * p * p) / 27;
  let y: number;
  if (d > 0) {
    const s = Math.sqrt(d);
    y = Math.cbrt(-q / 2 + s) + Math.cbrt(-q / 2 - s);
  } else if (p === 0) {
    y = 0;
  } else {
    const r = Math.sqrt(-p / 3);
    y = 2 * r * Math.cos(Math.acos(Math.max(-1, Math.min(1, (3 * q) / (2 * p * r)))) / 3);
  }
  let x = y - a / 3;
  for (let k = 0; k < 2; k++) {
    const f = ((x + a) * x + b) * x + c;
    const df = (3 * x + 2 * a) * x + b;
    if (df !== 0 && Number.isFinite(f / df)) x -= f / df;
  }
  const e = a + x;
  return [[x, 0], ...quadraticRoots(e, b + x * e)];
}
