// Parameter covariance from a weighted Jacobian: SVD of J^T J with a relative cut-off, why it failed when it does, and the sandwich form.

import { FitInputError } from './fitInputError';
import { DEFAULT_SVD_CUTOFF } from './normalizeFitInput';
import { boundedSvd } from './boundedSvd';

export interface CovarianceEstimate {
  /** residualVariance * (J^T J)^-1, or null when not estimable or no variance was given. */
  covariance: number[][] | null;
  /** Square roots of the covariance diagonal, or null with it. */
  stderr: number[] | null;
  /** Correlation matrix (independent of the variance), or null when not estimable. */
  correlation: number[][] | null;
  /** Singular values of the column-equilibrated J^T J (unit diagonal), largest first. */
  singularValues: number[];
  /** Unit vectors in column-equilibrated parameters along which the data give no information. */
  degenerateDirections: number[][];
  warnings: string[];
}

/**
 * Covariance of least-squares parameters from the Jacobian at the solution.
 * J[i][j] = d(sqrt(w_i) f_i)/dp_j (weights already applied, one row per data row). The columns are
 * first scaled to unit length so the cut-off measures collinearity, not units; singular values of
 * that J^T J below cutoff * largest make the covariance not estimable, and the warning names the
 * parameters that dominate each lost direction. residualVariance is chi^2/(n - p) for unknown noise,
 * 1 for known weights, or null to get only the correlation.
 */
export function covarianceFromJacobian(
  J: readonly (Float64Array | number[])[],
  residualVariance: number | null,
  cutoff: number = DEFAULT_SVD_CUTOFF,
  names?: readonly string[],
): CovarianceEstimate {
  const n = J.length;
  const p = n === 0 ? 0 : J[0].length;
  if (p === 0 || n < p) throw new FitInputError('J', `is ${n} x ${p}; need at least as many rows as columns and one column`);
  J.forEach((row, i) => {
    if (row.length !== p) throw new FitInputError('J', `row has ${row.length} columns, row 0 has ${p}`, i);
  });
  if (!(cutoff > 0 && cutoff < 1)) throw new FitInputError('cutoff', `${cutoff} is not between 0 and 1`);
  if (residualVariance !== null && !(Number.isFinite(residualVariance) && residualVariance >= 0)) {
    throw new FitInputError('residualVariance', `${residualVariance} is not a finite number >= 0`);
  }
  const label = (j: number): string => names?.[j] ?? `p${j}`;
  const empty = (warning: string, singularValues: number[] = [], directions: number[][] = []): CovarianceEstimate => ({
    covariance: null,
    stderr: null,
    correlation: null,
    singularValues,
    degenerateDirections: directions,
    warnings: [warning],
  });

  const gram = new Float64Array(p * p);
  for (const row of J) {
    for (let a = 0; a < p; a++) {
      for (let b = a; b < p; b++) gram[a * p + b] += row[a] * row[b];
    }
  }
  const norm = Array.from({ length: p }, (_, j) => Math.sqrt(gram[j * p + j]));
  if (!norm.every(Number.isFinite)) return empty('covariance not estimable: the Jacobian has non-finite entries (the model is not finite near the solution)');
  const equilibrated = Array.from({ length: p }, (_, a) =>
    Array.from({ length: p }, (_, b) => {
      const [lo, hi] = a <= b ? [a, b] : [b, a];
      return norm[a] > 0 && norm[b] > 0 ? gram[lo * p + hi] / (norm[a] * norm[b]) : 0;
    }),
  );

  const svd = boundedSvd(equilibrated);
  if (!svd) return empty('covariance not estimable: the Jacobian has non-finite entries (the model is not finite near the solution)');
  if (!svd.converged) return empty('covariance not estimable: the decomposition of J^T J did not settle');
  const sigma = svd.values;
  const vectors = sigma.map((_, k) => svd.V.map((row) => row[k]));
  const kept = sigma.map((s) => s > cutoff * sigma[0]);

  if (!kept.every(Boolean)) {
    const directions = vectors.filter((_, k) => !kept[k]);
    const described = directions.map((v) => describeDirection(v, label)).join(', nor ');
    return empty(
      `covariance not estimable: the data do not ${described}; singular value${directions.length > 1 ? 's' : ''} below ${cutoff} of the largest`,
      sigma,
      directions,
    );
  }

  const inverse = Array.from({ length: p }, (_, a) =>
    Array.from({ length: p }, (_, b) => vectors.reduce((s, v, k) => s + (v[a] * v[b]) / sigma[k], 0)),
  );
  const correlation = correlationMatrix(inverse);
  if (residualVariance === null) {
    return { covariance: null, stderr: null, correlation, singularValues: sigma, degenerateDirections: [], warnings: [] };
  }
  const covariance = inverse.map((row, a) => row.map((v, b) => (residualVariance * v) / (norm[a] * norm[b])));
  return {
    covariance,
    stderr: covariance.map((row, j) => Math.sqrt(row[j])),
    correlation,
    singularValues: sigma,
    degenerateDirections: [],
    warnings: [],
  };
}

/**
 * The sandwich covariance bread * meat * bread of a least-squares estimate whose errors are not white:
 * bread = (J^T J)^-1, meat = J^T S J with S the errors' covariance (Huber 1967, White 1980; for serially
 * correlated errors Newey and West, Econometrica 1987 — from memory). Returns it with its correlation.
 */
export function sandwichCovariance(bread: readonly number[][], meat: readonly number[][]): { covariance: number[][]; correlation: number[][] } {
  const p = bread.length;
  const product = (x: readonly number[][], y: readonly number[][]) =>
    x.map((row) => Array.from({ length: p }, (_, b) => row.reduce((s, v, k) => s + v * y[k][b], 0)));
  const full = product(product(bread, meat), bread);
  // Symmetric in exact arithmetic; averaging removes the rounding.
  const covariance = full.map((row, a) => row.map((v, b) => (v + full[b][a]) / 2));
  return { covariance, correlation: correlationMatrix(covariance) };
}

/** The correlations of a covariance matrix: each entry over the square root of its two variances, 1 on the diagonal. */
export function correlationMatrix(c: readonly number[][]): number[][] {
  return c.map((row, a) => row.map((v, b) => (a === b ? 1 : v / Math.sqrt(c[a][a] * c[b][b]))));
}

/** 'tell a and b apart (lost direction 0.707 a - 0.707 b)' from the largest components of a unit null vector. */
function describeDirection(v: readonly number[], label: (j: number) => string): string {
  const largest = Math.max(...v.map(Math.abs));
  const sign = v.find((c) => Math.abs(c) === largest)! < 0 ? -1 : 1;
  const parts = v
    .map((c, j) => ({ c: sign * c, j, size: Number(Math.abs(c).toPrecision(3)) }))
    .filter(({ size }) => size >= 0.25 * largest)
    .sort((a, b) => b.size - a.size || a.j - b.j)
    .slice(0, 4);
  if (parts.length === 1) return `determine ${label(parts[0].j)} (the model barely depends on it)`;
  const who = parts.map(({ j }) => label(j));
  const combination = parts
    .map(({ c, j, size }, k) => `${k === 0 ? (c < 0 ? '-' : '') : c < 0 ? ' - ' : ' + '}${size} ${label(j)}`)
    .join('');
  return `tell ${who.slice(0, -1).join(', ')} and ${who[who.length - 1]} apart (lost direction ${combination})`;
}
