// Singular value decomposition that always ends: one-sided Jacobi with a sweep limit, refusing non-finite input.

/** A = U diag(values) V^T, values largest first; U's columns for a zero singular value are zero. */
export interface Svd {
  values: number[];
  /** m x n, column k the left singular vector of values[k]. */
  U: number[][];
  /** n x n, column k the right singular vector of values[k]. */
  V: number[][];
  /** False when the sweep limit was reached before every pair of columns was orthogonal. */
  converged: boolean;
}

/**
 * Jacobi converges quadratically once the columns are nearly orthogonal: about ten sweeps reach
 * machine precision on any matrix (Demmel and Veselic, SIAM J. Matrix Anal. Appl. 1992, from memory);
 * the limit only bounds the time on input no sweep can settle.
 */
const MAX_SWEEPS = 60;
/** Two columns count as orthogonal when their cosine is below m eps: the rounding of an m-term dot product. */
const EPS = Number.EPSILON;
/**
 * A column's squared norm is carried from rotation to rotation (a' = a - t g, b' = b + t g) and
 * summed afresh when it falls below this fraction of its old value: the update's rounding is
 * absolute, so a norm that shrank a lot is re-read rather than trusted.
 */
const NORM_REFRESH = 1e-2;

/**
 * The SVD of a (rows of equal length), or null when an entry is not finite. Why not ml-matrix's: its
 * Golub-Kahan loop has no iteration limit and was seen to run forever (a rank-one Hankel matrix,
 * NaN). The matrix is scaled by its largest entry first, so values near the overflow or underflow
 * limits are handled as ordinary ones. Wide matrices are decomposed as their transpose.
 *
 * A tall matrix is first reduced to its n x n triangle R by Householder QR (A = Q R); Jacobi then
 * rotates R's columns, whose inner products are A's (Q^T Q = I), so the rotations and the stopping
 * test are those of Jacobi on A itself, at n instead of m entries a column. U = Q U_R, formed on
 * first reading (U is a getter). Each sweep starts from norms summed afresh, so the last one, which
 * rotates nothing, tests every pair with exact norms whatever the carried ones drifted to.
 */
export function boundedSvd(a: readonly (ArrayLike<number>)[]): Svd | null {
  const m = a.length;
  const n = m === 0 ? 0 : a[0].length;
  let largest = 0;
  for (const row of a) {
    if (row.length !== n) throw new RangeError(`boundedSvd: rows of ${row.length} and ${n} entries`);
    for (let j = 0; j < n; j++) {
      const v = Math.abs(row[j]);
      if (!Number.isFinite(v)) return null;
      if (v > largest) largest = v;
    }
  }
  if (m < n) {
    const transposed = Array.from({ length: n }, (_, j) => Array.from({ length: m }, (_, i) => a[i][j]));
    const t = boundedSvd(transposed) as Svd;
    return {
      values: t.values,
      U: t.V,
      get V() {
        return t.U;
      },
      converged: t.converged,
    };
  }
  const scale = largest > 0 ? largest : 1;
  // The scaled matrix, column-major: entry (i, j) at j m + i. Overwritten by R (on and above the
  // diagonal) and the Householder vectors (below it, their leading 1 implied).
  const qr = new Float64Array(m * n);
  for (let i = 0; i < m; i++) {
    const row = a[i];
    for (let j = 0; j < n; j++) qr[j * m + i] = row[j] / scale;
  }
  let total = 0;
  for (let k = 0; k < m * n; k++) total += qr[k] * qr[k];
  const tau = householderQr(qr, m, n);

  // Columns of the working matrix (R, then rotated until orthogonal), column-major n x n; V likewise.
  const w = new Float64Array(n * n);
  for (let j = 0; j < n; j++) for (let i = 0; i <= j; i++) w[j * n + i] = qr[j * m + i];
  const v = new Float64Array(n * n);
  for (let j = 0; j < n; j++) v[j * n + j] = 1;
  const d = new Float64Array(n);
  const orthogonal = Math.max(m, 1) * EPS;
  // A column below rounding of the whole matrix is noise: rotating it shrinks it but never makes it orthogonal.
  const negligible = (EPS * EPS) * total;
  let converged = false;
  for (let sweep = 0; sweep < MAX_SWEEPS && !converged; sweep++) {
    converged = true;
    for (let j = 0; j < n; j++) d[j] = squaredNorm(w, j * n, n);
    for (let p = 0; p < n - 1; p++) {
      const op = p * n;
      // The largest column left first (de Rijk, SIAM J. Sci. Stat. Comput. 1989, from memory): about
      // one sweep in eight fewer on the pencil's Hankel matrices.
      let best = p;
      for (let q = p + 1; q < n; q++) if (d[q] > d[best]) best = q;
      if (best !== p) {
        swap(w, op, best * n, n);
        swap(v, op, best * n, n);
        const x = d[p];
        d[p] = d[best];
        d[best] = x;
      }
      for (let q = p + 1; q < n; q++) {
        const oq = q * n;
        const alpha = d[p];
        const beta = d[q];
        if (alpha <= negligible || beta <= negligible) continue;
        const gamma = dot(w, op, w, oq, n);
        if (gamma === 0 || Math.abs(gamma) <= orthogonal * Math.sqrt(alpha) * Math.sqrt(beta)) continue;
        converged = false;
        const zeta = (beta - alpha) / (2 * gamma);
        // |zeta| < 1 / (m eps^3) by the tests above, so zeta^2 cannot overflow (and Math.hypot is slow).
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        rotate(w, op, oq, n, c, s);
        rotate(v, op, oq, n, c, s);
        const alphaNext = alpha - t * gamma;
        const betaNext = beta + t * gamma;
        d[p] = alphaNext < NORM_REFRESH * alpha ? squaredNorm(w, op, n) : alphaNext;
        d[q] = betaNext < NORM_REFRESH * beta ? squaredNorm(w, oq, n) : betaNext;
      }
    }
  }
  const norms = Array.from({ length: n }, (_, k) => Math.sqrt(squaredNorm(w, k * n, n)));
  const order = norms.map((_, k) => k).sort((x, y) => norms[y] - norms[x]);
  // Left vectors, formed when first read (the pencil reads only V): R's normalized columns (zero for
  // a zero value), padded to m rows and taken through Q.
  let left: number[][] | null = null;
  const leftVectors = (): number[][] => {
    const u = new Float64Array(m * n);
    order.forEach((k, col) => {
      if (norms[k] > 0) for (let i = 0; i < n; i++) u[col * m + i] = w[k * n + i] / norms[k];
    });
    applyQ(qr, tau, m, n, u);
    const rows: number[][] = [];
    for (let i = 0; i < m; i++) {
      const row = new Array<number>(n);
      for (let col = 0; col < n; col++) row[col] = u[col * m + i];
      rows.push(row);
    }
    return rows;
  };
  return {
    values: order.map((k) => norms[k] * scale),
    get U() {
      return (left ??= leftVectors());
    },
    V: Array.from({ length: n }, (_, i) => order.map((k) => v[k * n + i])),
    converged,
  };
}

/**
 * Householder QR in place on the column-major m x n (m >= n) matrix: R on and above the diagonal,
 * reflector k's vector below it (leading 1 implied), H_k = I - tau_k v v^T; tau_k = 0 is the identity.
 */
function householderQr(a: Float64Array, m: number, n: number): Float64Array {
  const tau = new Float64Array(n);
  for (let k = 0; k < n && k < m - 1; k++) {
    const ok = k * m;
    // Norm of the part below the diagonal, scaled by its largest entry so no square underflows.
    let big = 0;
    for (let i = k + 1; i < m; i++) big = Math.max(big, Math.abs(a[ok + i]));
    if (big === 0) continue;
    const head = a[ok + k];
    let sum = (head / big) * (head / big);
    for (let i = k + 1; i < m; i++) sum += (a[ok + i] / big) * (a[ok + i] / big);
    const norm = big * Math.sqrt(sum);
    const diagonal = head >= 0 ? -norm : norm;
    tau[k] = (diagonal - head) / diagonal;
    const inverse = 1 / (head - diagonal);
    for (let i = k + 1; i < m; i++) a[ok + i] *= inverse;
    a[ok + k] = diagonal;
    for (let j = k + 1; j < n; j++) {
      const oj = j * m;
      const h = tau[k] * (a[oj + k] + dot(a, ok + k + 1, a, oj + k + 1, m - k - 1));
      a[oj + k] -= h;
      for (let i = k + 1; i < m; i++) a[oj + i] -= h * a[ok + i];
    }
  }
  return tau;
}

/** x <- Q x for the column-major m x n x, Q = H_0 ... H_{n-1} from householderQr. */
function applyQ(qr: Float64Array, tau: Float64Array, m: number, n: number, x: Float64Array): void {
  for (let k = Math.min(n, m - 1) - 1; k >= 0; k--) {
    if (tau[k] === 0) continue;
    const ok = k * m;
    for (let j = 0; j < n; j++) {
      const oj = j * m;
      const h = tau[k] * (x[oj + k] + dot(qr, ok + k + 1, x, oj + k + 1, m - k - 1));
      if (h === 0) continue;
      x[oj + k] -= h;
      for (let i = k + 1; i < m; i++) x[oj + i] -= h * qr[ok + i];
    }
  }
}

/** The inner product of x's entries p..p+length-1 and y's q..q+length-1 (x and y may be one array), in four running sums (no one chain of dependent adds). */
export function dot(x: Float64Array, p: number, y: Float64Array, q: number, length: number): number {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let i = 0;
  for (; i + 3 < length; i += 4) {
    s0 += x[p + i] * y[q + i];
    s1 += x[p + i + 1] * y[q + i + 1];
    s2 += x[p + i + 2] * y[q + i + 2];
    s3 += x[p + i + 3] * y[q + i + 3];
  }
  for (; i < length; i++) s0 += x[p + i] * y[q + i];
  return s0 + s1 + (s2 + s3);
}

function squaredNorm(x: Float64Array, offset: number, length: number): number {
  return dot(x, offset, x, offset, length);
}

function swap(x: Float64Array, p: number, q: number, length: number): void {
  for (let i = 0; i < length; i++) {
    const t = x[p + i];
    x[p + i] = x[q + i];
    x[q + i] = t;
  }
}

/** Columns at offsets p and q of x: (x_p, x_q) <- (c x_p - s x_q, s x_p + c x_q), element by element. */
function rotate(x: Float64Array, p: number, q: number, length: number, c: number, s: number): void {
  for (let i = 0; i < length; i++) {
    const xi = x[p + i];
    const yi = x[q + i];
    x[p + i] = c * xi - s * yi;
    x[q + i] = s * xi + c * yi;
  }
}
