// boundedSvd against the plain one-sided Jacobi it replaced (kept below as the reference) and against
// numpy.linalg.svd (LAPACK gesdd; numpy 2.4.6, values computed once and pasted here), on random and
// structured matrices: Hankel matrices of noisy damped rings as the pencil builds them, rank-deficient,
// rank-one, tiny and huge scales, 1 x N, N x 1, zeros.

import { describe, expect, it } from 'vitest';
import { boundedSvd, type Svd } from '../../core/fit/boundedSvd';
import { createRandom } from '../../core/random';

const TOLERANCE = 1e-12;

/** The implementation before the QR preconditioning, norm updates and pivoting: Jacobi on A's columns. */
function referenceSvd(a: readonly number[][]): { values: number[]; V: number[][]; converged: boolean } {
  const m = a.length;
  const n = a[0].length;
  if (m < n) {
    const t = referenceSvd(Array.from({ length: n }, (_, j) => a.map((row) => row[j])));
    return { values: t.values, V: [], converged: t.converged };
  }
  const scale = Math.max(...a.flat().map(Math.abs)) || 1;
  const w = Array.from({ length: n }, (_, j) => Float64Array.from(a, (row) => row[j] / scale));
  const v = Array.from({ length: n }, (_, j) => Float64Array.from({ length: n }, (_, i) => (i === j ? 1 : 0)));
  const eps = Number.EPSILON;
  const negligible = eps * eps * w.reduce((sum, c) => sum + c.reduce((s, x) => s + x * x, 0), 0);
  let converged = false;
  for (let sweep = 0; sweep < 60 && !converged; sweep++) {
    converged = true;
    for (let p = 0; p < n - 1; p++)
      for (let q = p + 1; q < n; q++) {
        let [alpha, beta, gamma] = [0, 0, 0];
        for (let i = 0; i < m; i++) {
          alpha += w[p][i] * w[p][i];
          beta += w[q][i] * w[q][i];
          gamma += w[p][i] * w[q][i];
        }
        if (gamma === 0 || alpha <= negligible || beta <= negligible || Math.abs(gamma) <= m * eps * Math.sqrt(alpha) * Math.sqrt(beta)) continue;
        converged = false;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.hypot(1, zeta));
        const c = 1 / Math.hypot(1, t);
        const s = c * t;
        for (const x of [w, v])
          for (let i = 0; i < x[p].length; i++) [x[p][i], x[q][i]] = [c * x[p][i] - s * x[q][i], s * x[p][i] + c * x[q][i]];
      }
  }
  const norms = w.map((c) => Math.sqrt(c.reduce((s, x) => s + x * x, 0)));
  const order = norms.map((_, k) => k).sort((x, y) => norms[y] - norms[x]);
  return { values: order.map((k) => norms[k] * scale), V: Array.from({ length: n }, (_, i) => order.map((k) => v[k][i])), converged };
}

/** numpy.linalg.svd(A, compute_uv=False) for the matrices of the same names below. */
const NUMPY_VALUES = {
  ring: [39.95595402329296, 11.19766230035853, 10.97600240366934, 1.6269528559218018, 1.460956927071598, 0.01472235107665029, 0.01466988021895585, 0.013281281582941397, 0.01288818527713297, 0.012158954612283581, 0.011959621923903806, 0.011205065089172147, 0.011105257352148786, 0.010565533546118434, 0.010476227274220146, 0.010089036007959044, 0.00990195173205105, 0.00949196275449908, 0.009354800190712073, 0.009231892185788482, 0.009134360850099024, 0.009013739294457309, 0.008611586856620728, 0.008540289780521244, 0.008517990963853427, 0.008279748241738905, 0.007949918807716689, 0.007804921702324152, 0.007553908528138105, 0.007234199867109013, 0.007115130931589777, 0.006654377098411127, 0.00601246589343997, 0.005938372941162017, 0.0053958172680967035, 0.005175057339731716, 0.0045405902931769946, 0.004381985387564542, 0.0038969581734707285, 0.003587553831825414, 0.003388730211387637],
  random: [5.767383973865541, 5.054437021216795, 4.761335819505912, 4.273884252326943, 3.549943983138155, 3.2660955161319722, 2.463361086993716, 2.1232653848241894, 1.715830209468288],
  wide: [4.6098151903924185, 3.6305104767254686, 2.103422629277326, 1.7307031487268454],
};

/** 80 x 41: the pencil's Hankel matrix of 120 samples of two damped rings on a level, with noise. */
function ringHankel(seed: number, noise: number, rows = 80, columns = 41): number[][] {
  const random = createRandom(seed);
  const y = Array.from({ length: rows + columns - 1 }, (_, i) => 0.7 + Math.exp(-0.02 * i) * Math.cos(0.35 * i + 0.4) + 0.3 * Math.exp(-0.05 * i) * Math.cos(1.1 * i) + noise * random.normal());
  return Array.from({ length: rows }, (_, i) => y.slice(i, i + columns));
}

function randomMatrix(seed: number, m: number, n: number): number[][] {
  const random = createRandom(seed);
  return Array.from({ length: m }, () => Array.from({ length: n }, () => random.normal()));
}

function product(a: number[][], b: number[][]): number[][] {
  return a.map((row) => b[0].map((_, j) => row.reduce((s, x, k) => s + x * b[k][j], 0)));
}

const scaled = (a: number[][], factor: number): number[][] => a.map((row) => row.map((x) => x * factor));

const CASES: [string, number[][]][] = [
  ['ring Hankel 80 x 41, noise 1e-3', ringHankel(3, 1e-3)],
  ['ring Hankel 80 x 41, noise 1e-6', ringHankel(4, 1e-6)],
  ['ring Hankel 80 x 41, no noise (numerically rank 5)', ringHankel(5, 0)],
  ['random 17 x 9', randomMatrix(5, 17, 9)],
  ['random 4 x 11 (wide)', randomMatrix(6, 4, 11)],
  ['random 6 x 6', randomMatrix(7, 6, 6)],
  ['rank 3, 20 x 8', product(randomMatrix(8, 20, 3), randomMatrix(9, 3, 8))],
  ['rank one: constant Hankel 42 x 22', Array.from({ length: 42 }, () => new Array(22).fill(12.4))],
  ['rank one: outer product 9 x 5', product(randomMatrix(10, 9, 1), randomMatrix(11, 1, 5))],
  ['tiny scale 1e-300, 12 x 5', scaled(randomMatrix(12, 12, 5), 1e-300)],
  ['huge scale 1e300, 12 x 5', scaled(randomMatrix(12, 12, 5), 1e300)],
  ['graded columns 1 .. 1e-9, 10 x 6', randomMatrix(13, 10, 6).map((row) => row.map((x, j) => x * 10 ** (-2 * j)))],
  ['1 x 7', randomMatrix(14, 1, 7)],
  ['7 x 1', randomMatrix(15, 7, 1)],
  ['1 x 1', [[-3]]],
  ['zeros 5 x 3', Array.from({ length: 5 }, () => [0, 0, 0])],
  ['a zero column, 3 x 2', [[1, 0], [2, 0], [3, 0]]],
  ['symmetric 5 x 5 (a correlation matrix)', [[1, 0.9, 0.1, 0, 0.3], [0.9, 1, 0.2, 0.1, 0.3], [0.1, 0.2, 1, 0.95, 0], [0, 0.1, 0.95, 1, 0], [0.3, 0.3, 0, 0, 1]]],
];

/** max |A - U diag(s) V^T|, max |V^T V - I|, max over nonzero values of |U^T U - I|. */
function residuals(a: number[][], svd: Svd): { reconstruction: number; vOrthogonality: number; uOrthogonality: number } {
  const [m, n] = [a.length, a[0].length];
  const k = Math.min(m, n);
  let reconstruction = 0;
  for (let i = 0; i < m; i++)
    for (let j = 0; j < n; j++) {
      let sum = 0;
      for (let r = 0; r < k; r++) sum += svd.U[i][r] * svd.values[r] * svd.V[j][r];
      reconstruction = Math.max(reconstruction, Math.abs(sum - a[i][j]));
    }
  const gram = (x: number[][], cols: number[]) =>
    Math.max(0, ...cols.flatMap((p) => cols.map((q) => Math.abs(x.reduce((s, row) => s + row[p] * row[q], 0) - (p === q ? 1 : 0)))));
  const vCols = Array.from({ length: svd.V[0]?.length ?? 0 }, (_, c) => c);
  const uCols = svd.values.map((s, c) => (s > 1e-8 * svd.values[0] ? c : -1)).filter((c) => c >= 0);
  return { reconstruction, vOrthogonality: gram(svd.V, vCols), uOrthogonality: gram(svd.U, uCols) };
}

describe('boundedSvd against the previous Jacobi and against A itself', () => {
  it.each(CASES)('%s', (_name, a) => {
    const [m, n] = [a.length, a[0].length];
    const svd = boundedSvd(a)!;
    const reference = referenceSvd(a);
    expect(svd.converged).toBe(true);
    expect(reference.converged).toBe(true);
    expect(svd.values).toHaveLength(Math.min(m, n));
    expect(svd.U).toHaveLength(m);
    expect(svd.U.every((row) => row.length === Math.min(m, n))).toBe(true);
    expect(svd.V).toHaveLength(n);
    expect(svd.V.every((row) => row.length === Math.min(m, n))).toBe(true);
    const largest = svd.values[0];
    const unit = largest > 0 ? largest : 1;
    for (let k = 0; k < svd.values.length; k++) {
      expect(Math.abs(svd.values[k] - reference.values[k]) / unit).toBeLessThan(TOLERANCE);
      if (k > 0) expect(svd.values[k]).toBeLessThanOrEqual(svd.values[k - 1]);
    }
    const { reconstruction, vOrthogonality, uOrthogonality } = residuals(a, svd);
    expect(reconstruction / unit).toBeLessThan(TOLERANCE);
    expect(vOrthogonality).toBeLessThan(TOLERANCE);
    expect(uOrthogonality).toBeLessThan(TOLERANCE);
    // U's columns for a zero singular value are zero.
    svd.values.forEach((s, c) => {
      if (s === 0) expect(svd.U.every((row) => row[c] === 0)).toBe(true);
    });
  });

  it('the tall ring Hankel matrix keeps its right vectors: the dominant ones agree with the previous Jacobi up to sign', () => {
    const a = ringHankel(3, 1e-3);
    const svd = boundedSvd(a)!;
    const reference = referenceSvd(a);
    for (let k = 0; k < 5; k++) {
      const cosine = svd.V.reduce((s, row, i) => s + row[k] * reference.V[i][k], 0);
      expect(Math.abs(cosine)).toBeGreaterThan(1 - 1e-10);
    }
  });

  it.each([
    ['ring', ringHankel(3, 1e-3)],
    ['random', randomMatrix(5, 17, 9)],
    ['wide', randomMatrix(6, 4, 11)],
  ] as const)('agrees with numpy.linalg.svd on the %s matrix', (name, a) => {
    const values = boundedSvd(a)!.values;
    const expected = NUMPY_VALUES[name];
    expect(values).toHaveLength(expected.length);
    values.forEach((s, k) => expect(Math.abs(s - expected[k]) / expected[0]).toBeLessThan(TOLERANCE));
  });

  it('refuses non-finite entries, tall or wide', () => {
    expect(boundedSvd([[1, 2], [NaN, 3], [4, 5]])).toBeNull();
    expect(boundedSvd([[1, 2, -Infinity], [3, 4, 5]])).toBeNull();
  });

  it('reads U once: the left vectors are formed on first reading and kept', () => {
    const svd = boundedSvd(randomMatrix(16, 8, 3))!;
    expect(svd.U).toBe(svd.U);
  });
});
