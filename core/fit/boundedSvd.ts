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
 * The SVD of a (rows of equal length), or null when an entry is not finite. Why not ml-matrix's: its
 * Golub-Kahan loop has no iteration limit and was seen to run forever (a rank-one Hankel matrix,
 * NaN). The matrix is scaled by its largest entry first, so values near the overflow or underflow
 * limits are handled as ordinary ones. Wide matrices are decomposed as their transpose.
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
    return { values: t.values, U: t.V, V: t.U, converged: t.converged };
  }
  const scale = largest > 0 ? largest : 1;
  // Columns of the working matrix, rotated until orthogonal.
  const w = Array.from({ length: n }, (_, j) => Float64Array.from({ length: m }, (_, i) => a[i][j] / scale));
  const v = Array.from({ length: n }, (_, j) => Float64Array.from({ length: n }, (_, i) => (i === j ? 1 : 0)));
  const orthogonal = Math.max(m, 1) * EPS;
  // A column below rounding of the whole matrix is noise: rotating it shrinks it but never makes it orthogonal.
  const negligible = (EPS * EPS) * w.reduce((sum, column) => sum + column.reduce((s, x) => s + x * x, 0), 0);
  let converged = false;
  for (let sweep = 0; sweep < MAX_SWEEPS && !converged; sweep++) {
    converged = true;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const wp = w[p];
        const wq = w[q];
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < m; i++) {
          alpha += wp[i] * wp[i];
          beta += wq[i] * wq[i];
          gamma += wp[i] * wq[i];
        }
        if (gamma === 0 || alpha <= negligible || beta <= negligible || Math.abs(gamma) <= orthogonal * Math.sqrt(alpha) * Math.sqrt(beta)) continue;
        converged = false;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.hypot(1, zeta));
        const c = 1 / Math.hypot(1, t);
        const s = c * t;
        rotate(wp, wq, c, s);
        rotate(v[p], v[q], c, s);
      }
    }
  }
  const norms = w.map((column) => Math.sqrt(column.reduce((sum, x) => sum + x * x, 0)));
  const order = norms.map((_, k) => k).sort((x, y) => norms[y] - norms[x]);
  return {
    values: order.map((k) => norms[k] * scale),
    U: Array.from({ length: m }, (_, i) => order.map((k) => (norms[k] > 0 ? w[k][i] / norms[k] : 0))),
    V: Array.from({ length: n }, (_, i) => order.map((k) => v[k][i])),
    converged,
  };
}

/** (x, y) <- (c x - s y, s x + c y), element by element. */
function rotate(x: Float64Array, y: Float64Array, c: number, s: number): void {
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const yi = y[i];
    x[i] = c * xi - s * yi;
    y[i] = s * xi + c * yi;
  }
}
