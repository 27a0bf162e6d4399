// The few dominant right singular vectors of a tall matrix, by Golub-Kahan bidiagonalization and implicit-shift bidiagonal QR.

import { dot } from './boundedSvd';
import { addScaled } from './vectorKernels';

/** Singular values (all of them, largest first) and the right singular vectors of the first few. */
export interface DominantRight {
  values: number[];
  /** n x count, column k the right singular vector of values[k]. */
  V: number[][];
}

/**
 * Bidiagonal QR takes about two steps a singular value (Golub and Van Loan, Matrix Computations, 4th ed.,
 * 2013, section 8.6, from memory); the limit only bounds the time on input no step settles.
 */
const MAX_STEPS_PER_VALUE = 30;
const EPS = Number.EPSILON;

/**
 * The singular values of a (m x n rows, m >= n) and the right singular vectors of its `count` largest, or
 * null when an entry is not finite or the iteration limit is reached. Golub and Reinsch (Numer. Math. 14,
 * 1970): Householder reflections make A bidiagonal (U B V_B^T), then Golub-Kahan steps with a Wilkinson
 * shift diagonalize B, every entry set to zero below eps ||B|| (backward stable: the vectors are as accurate
 * as one-sided Jacobi's, eps ||A|| over the gap to the next value). The left vectors are never formed, and
 * V's rotations are stored and replayed on the `count` wanted columns only: O(m n^2) in all, most of it the
 * bidiagonalization, instead of O(n^3) a sweep for Jacobi.
 */
export function dominantRightVectors(a: readonly ArrayLike<number>[], count: number): DominantRight | null {
  const m = a.length;
  const n = m === 0 ? 0 : a[0].length;
  if (m < n) throw new RangeError(`dominantRightVectors: ${m} rows for ${n} columns`);
  if (!(Number.isInteger(count) && count >= 0 && count <= n)) throw new RangeError(`dominantRightVectors: ${count} vectors of ${n}`);
  let largest = 0;
  for (const row of a) {
    if (row.length !== n) throw new RangeError(`dominantRightVectors: rows of ${row.length} and ${n} entries`);
    for (let j = 0; j < n; j++) {
      const v = Math.abs(row[j]);
      if (!Number.isFinite(v)) return null;
      if (v > largest) largest = v;
    }
  }
  const scale = largest > 0 ? largest : 1;
  // The scaled matrix, row-major; row k keeps right reflector k's vector right of the superdiagonal.
  const x = scratchMatrix(m * n);
  for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) x[i * n + j] = a[i][j] / scale;
  const d = new Float64Array(n);
  const e = new Float64Array(Math.max(n - 1, 0));
  const rightTau = bidiagonalize(x, m, n, d, e);

  // About n^2 rotations in all (two steps a value, each through half the matrix on average).
  const rotations = scratchRotations(Math.max(n * n, 1));
  if (!diagonalize(d, e, rotations)) return null;

  const order = Array.from({ length: n }, (_, k) => k).sort((p, q) => Math.abs(d[q]) - Math.abs(d[p]));
  const V: number[][] = Array.from({ length: n }, () => new Array<number>(count).fill(0));
  const column = new Float64Array(n);
  for (let c = 0; c < count; c++) {
    const k = order[c];
    column.fill(0);
    column[k] = d[k] < 0 ? -1 : 1;
    rotations.replay(column);
    applyRightReflectors(x, n, rightTau, column);
    for (let i = 0; i < n; i++) V[i][c] = column[i];
  }
  return { values: order.map((k) => Math.abs(d[k]) * scale), V };
}

/**
 * Householder reflector H = I - tau v v^T with H x = beta e_1 for the `length` entries of x from `offset`
 * at `stride`: v overwrites x after its first entry (v_0 = 1 implied); returns [beta, tau], tau = 0 when
 * x is already beta e_1.
 */
function reflector(x: Float64Array, offset: number, stride: number, length: number): [number, number] {
  const head = x[offset];
  // The norm of the rest, scaled by its largest entry so no square underflows.
  let big = 0;
  for (let i = 1; i < length; i++) big = Math.max(big, Math.abs(x[offset + i * stride]));
  if (big === 0) return [head, 0];
  let sum = (head / big) * (head / big);
  for (let i = 1; i < length; i++) sum += (x[offset + i * stride] / big) * (x[offset + i * stride] / big);
  const norm = big * Math.sqrt(sum);
  const beta = head >= 0 ? -norm : norm;
  const inverse = 1 / (head - beta);
  for (let i = 1; i < length; i++) x[offset + i * stride] *= inverse;
  return [beta, (beta - head) / beta];
}

/**
 * Reduces the row-major m x n x to upper bidiagonal form in place: diagonal d, superdiagonal e. Left
 * reflectors are dropped; right reflector k (columns k+1..n-1) is kept in row k, its tau returned.
 */
function bidiagonalize(x: Float64Array, m: number, n: number, d: Float64Array, e: Float64Array): Float64Array {
  const rightTau = new Float64Array(n);
  const w = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const [diagonal, tau] = reflector(x, k * n + k, n, m - k);
    d[k] = diagonal;
    if (tau !== 0 && k + 1 < n) {
      // Columns k+1.. of rows k..: A <- A - tau v (v^T A), row by row so the inner loops run along rows.
      w.fill(0, k + 1, n);
      for (let i = k; i < m; i++) addScaled(w, k + 1, x, i * n + k + 1, n - k - 1, i === k ? 1 : x[i * n + k]);
      for (let i = k; i < m; i++) addScaled(x, i * n + k + 1, w, k + 1, n - k - 1, -tau * (i === k ? 1 : x[i * n + k]));
    }
    if (k + 2 < n) {
      const [superdiagonal, t] = reflector(x, k * n + k + 1, 1, n - k - 1);
      e[k] = superdiagonal;
      rightTau[k] = t;
      if (t !== 0) {
        const u = k * n + k + 1;
        for (let i = k + 1; i < m; i++) {
          const row = i * n + k + 1;
          const h = t * (x[row] + dot(x, row + 1, x, u + 1, n - k - 2));
          x[row] -= h;
          addScaled(x, row + 1, x, u + 1, n - k - 2, -h);
        }
      }
    } else if (k + 1 < n) {
      e[k] = x[k * n + k + 1];
    }
  }
  return rightTau;
}

/** column <- V_B column, V_B = P_0 P_1 ... P_{n-3} the right reflectors (P_k acting on entries k+1..). */
function applyRightReflectors(x: Float64Array, n: number, tau: Float64Array, column: Float64Array): void {
  for (let k = n - 3; k >= 0; k--) {
    if (tau[k] === 0) continue;
    const u = k * n + k + 1;
    let s = column[k + 1];
    for (let j = 1; j < n - k - 1; j++) s += x[u + j] * column[k + 1 + j];
    const h = tau[k] * s;
    column[k + 1] -= h;
    for (let j = 1; j < n - k - 1; j++) column[k + 1 + j] -= h * x[u + j];
  }
}

/**
 * The matrix and the rotation log are kept from one call to the next (a thread runs one decomposition at a
 * time): the search's pencils are thousands of small matrices, and a fresh matrix and log for each, the log
 * often grown by copying, were a tenth of a batch's garbage. Larger ones than this many values are not kept.
 */
const MAX_KEPT_VALUES = 1 << 18;
let keptMatrix = new Float64Array(0);
let keptRotations: RotationLog | null = null;

/** A matrix of `size` values to overwrite. */
function scratchMatrix(size: number): Float64Array {
  if (size > MAX_KEPT_VALUES) return new Float64Array(size);
  if (keptMatrix.length < size) keptMatrix = new Float64Array(size);
  return keptMatrix.subarray(0, size);
}

/** An empty rotation log with room for `capacity` rotations. */
function scratchRotations(capacity: number): RotationLog {
  if (capacity > MAX_KEPT_VALUES) return new RotationLog(capacity);
  if (!keptRotations || keptRotations.capacity < capacity) keptRotations = new RotationLog(capacity);
  keptRotations.clear();
  return keptRotations;
}

/** Right rotations applied to V: columns (p, q) <- (c v_p + s v_q, -s v_p + c v_q), in order. */
class RotationLog {
  private count = 0;
  private pairs: Int32Array;
  private cs: Float64Array;

  constructor(capacity: number) {
    this.pairs = new Int32Array(2 * capacity);
    this.cs = new Float64Array(2 * capacity);
  }

  get capacity(): number {
    return this.cs.length / 2;
  }

  clear(): void {
    this.count = 0;
  }

  push(p: number, q: number, c: number, s: number): void {
    if (2 * this.count === this.cs.length) {
      const pairs = new Int32Array(2 * this.pairs.length);
      pairs.set(this.pairs);
      this.pairs = pairs;
      const cs = new Float64Array(2 * this.cs.length);
      cs.set(this.cs);
      this.cs = cs;
    }
    const at = 2 * this.count++;
    this.pairs[at] = p;
    this.pairs[at + 1] = q;
    this.cs[at] = c;
    this.cs[at + 1] = s;
  }

  /** x <- G_1 G_2 ... G_T x: the column of the rotated V = G_1 ... G_T that x picks out. */
  replay(x: Float64Array): void {
    const { pairs, cs } = this;
    for (let at = 2 * this.count - 2; at >= 0; at -= 2) {
      const p = pairs[at];
      const q = pairs[at + 1];
      const xp = x[p];
      const xq = x[q];
      x[p] = cs[at] * xp - cs[at + 1] * xq;
      x[q] = cs[at + 1] * xp + cs[at] * xq;
    }
  }
}

/** Below this (or above its inverse) y^2 + z^2 may underflow (overflow): such rotations take Math.hypot, which is slow. */
const SQUARE_SAFE = 1e-150;
/**
 * The last rotation's cosine and sine, set by givens: in a typed array, because a module variable given a
 * fraction holds a fresh heap number each time (no array a call either: a step makes thousands).
 */
const rotation = new Float64Array([1, 0]);
const COSINE = 0;
const SINE = 1;

/** r = hypot(y, z), with the rotation's cosine and sine set so that c y + s z = r and -s y + c z = 0. */
function givens(y: number, z: number): number {
  if (z === 0) {
    rotation[COSINE] = 1;
    rotation[SINE] = 0;
    return y;
  }
  let r = Math.sqrt(y * y + z * z);
  if (!(r > SQUARE_SAFE && r < 1 / SQUARE_SAFE)) r = Math.hypot(y, z);
  const inverse = 1 / r;
  rotation[COSINE] = y * inverse;
  rotation[SINE] = z * inverse;
  return r;
}

/**
 * Drives the superdiagonal e of the bidiagonal (d, e) to zero, logging the right rotations; false when the
 * step limit is reached first.
 */
function diagonalize(d: Float64Array, e: Float64Array, rotations: RotationLog): boolean {
  const n = d.length;
  let norm = 0;
  for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(d[i]) + (i < n - 1 ? Math.abs(e[i]) : 0));
  const negligible = EPS * norm;
  for (let steps = 0; steps <= MAX_STEPS_PER_VALUE * n; steps++) {
    for (let i = 0; i < n - 1; i++) if (Math.abs(e[i]) <= negligible || Math.abs(e[i]) <= EPS * (Math.abs(d[i]) + Math.abs(d[i + 1]))) e[i] = 0;
    let hi = n - 1;
    while (hi > 0 && e[hi - 1] === 0) hi--;
    if (hi === 0) return true;
    let lo = hi - 1;
    while (lo > 0 && e[lo - 1] !== 0) lo--;
    let zero = -1;
    for (let i = lo; i <= hi; i++) if (Math.abs(d[i]) <= negligible) zero = i;
    if (zero < 0) golubKahanStep(d, e, lo, hi, rotations);
    else if (zero < hi) zeroRow(d, e, zero, hi);
    else zeroColumn(d, e, lo, hi, rotations);
  }
  return false;
}

/** d[i] = 0 in the block ending at hi: left rotations of rows i+1..hi against row i clear e[i] (V is untouched). */
function zeroRow(d: Float64Array, e: Float64Array, i: number, hi: number): void {
  d[i] = 0;
  let f = e[i];
  e[i] = 0;
  for (let j = i + 1; j <= hi && f !== 0; j++) {
    d[j] = givens(d[j], f);
    const c = rotation[COSINE];
    const s = rotation[SINE];
    if (j < hi) {
      f = -s * e[j];
      e[j] = c * e[j];
    }
  }
}

/** d[hi] = 0: right rotations of columns hi-1..lo against column hi clear e[hi-1]. */
function zeroColumn(d: Float64Array, e: Float64Array, lo: number, hi: number, rotations: RotationLog): void {
  d[hi] = 0;
  let f = e[hi - 1];
  e[hi - 1] = 0;
  for (let j = hi - 1; j >= lo && f !== 0; j--) {
    d[j] = givens(d[j], f);
    const c = rotation[COSINE];
    const s = rotation[SINE];
    rotations.push(j, hi, c, s);
    if (j > lo) {
      f = -s * e[j - 1];
      e[j - 1] = c * e[j - 1];
    }
  }
}

/** One implicit QR step on the unreduced block lo..hi with the Wilkinson shift of B^T B's trailing 2 x 2. */
function golubKahanStep(d: Float64Array, e: Float64Array, lo: number, hi: number, rotations: RotationLog): void {
  const before = hi - 1 > lo ? e[hi - 2] : 0;
  const t11 = d[hi - 1] * d[hi - 1] + before * before;
  const t12 = d[hi - 1] * e[hi - 1];
  const t22 = d[hi] * d[hi] + e[hi - 1] * e[hi - 1];
  const half = (t11 - t22) / 2;
  const root = Math.sqrt(half * half + t12 * t12);
  const denominator = half + (half >= 0 ? root : -root);
  const shift = denominator !== 0 ? t22 - (t12 * t12) / denominator : t22;
  let y = d[lo] * d[lo] - shift;
  let z = d[lo] * e[lo];
  for (let k = lo; k < hi; k++) {
    // Right rotation of columns k, k+1: clears the bulge z above (k-1, k+1), leaves one below at (k+1, k).
    const r = givens(y, z);
    let c = rotation[COSINE];
    let s = rotation[SINE];
    if (k > lo) e[k - 1] = r;
    rotations.push(k, k + 1, c, s);
    const dk = c * d[k] + s * e[k];
    e[k] = -s * d[k] + c * e[k];
    const below = s * d[k + 1];
    d[k + 1] = c * d[k + 1];
    // Left rotation of rows k, k+1: clears it, leaves one at (k, k+2).
    d[k] = givens(dk, below);
    c = rotation[COSINE];
    s = rotation[SINE];
    const ek = e[k];
    e[k] = c * ek + s * d[k + 1];
    d[k + 1] = -s * ek + c * d[k + 1];
    if (k + 1 < hi) {
      y = e[k];
      z = s * e[k + 1];
      e[k + 1] = c * e[k + 1];
    }
  }
}
