// The linear part of the response (levels and amplitudes) by least squares for given alpha, omega0, t0.

import { fillDampedBasis, type BlockAverage } from '../response/secondOrder';
import { LAYOUTS, type ParameterLayout } from './responseModel';

export interface LinearSolution {
  /** The linear parameters of the layout, in the order of its descriptor's `linear`. */
  coefficients: number[];
  /** Residual sum of squares over the samples used. */
  sse: number;
}

/**
 * Solves the small normal equations after scaling them to unit diagonal, with Cholesky;
 * a vanishing pivot (a basis column the data cannot see) gives a zero coefficient.
 */
function solveNormal(m: Float64Array, r: Float64Array, k: number): number[] {
  const d = Array.from({ length: k }, (_, i) => (m[i * k + i] > 0 ? Math.sqrt(m[i * k + i]) : 1));
  const a = Array.from({ length: k }, (_, i) => Array.from({ length: k }, (_, j) => m[i * k + j] / (d[i] * d[j])));
  const b = Array.from({ length: k }, (_, i) => r[i] / d[i]);
  const l = a.map(() => new Array<number>(k).fill(0));
  const dead = new Array<boolean>(k).fill(false);
  for (let j = 0; j < k; j++) {
    let s = a[j][j];
    for (let p = 0; p < j; p++) s -= l[j][p] * l[j][p];
    if (s < 1e-14) {
      dead[j] = true;
      continue;
    }
    l[j][j] = Math.sqrt(s);
    for (let i = j + 1; i < k; i++) {
      let t = a[i][j];
      for (let p = 0; p < j; p++) t -= l[i][p] * l[j][p];
      l[i][j] = t / l[j][j];
    }
  }
  const z = new Array<number>(k).fill(0);
  for (let i = 0; i < k; i++) {
    if (dead[i]) continue;
    let s = b[i];
    for (let p = 0; p < i; p++) s -= l[i][p] * z[p];
    z[i] = s / l[i][i];
  }
  const x = new Array<number>(k).fill(0);
  for (let i = k - 1; i >= 0; i--) {
    if (dead[i]) continue;
    let s = z[i];
    for (let p = i + 1; p < k; p++) s -= l[p][i] * x[p];
    x[i] = s / l[i][i];
  }
  return x.map((v, i) => v / d[i]);
}

/** Scratch arrays for one time axis, reused across the many solves of a fit. */
export class Workspace {
  readonly ec: Float64Array;
  readonly es: Float64Array;
  /** Share of each value's samples at or after t0 (see fillDampedBasis). */
  readonly after: Float64Array;
  readonly model: Float64Array;
  /** Basis columns of the linear part, as many as the largest layout solved so far needed. */
  private readonly columns: Float64Array[] = [];
  constructor(readonly length: number) {
    this.ec = new Float64Array(length);
    this.es = new Float64Array(length);
    this.after = new Float64Array(length);
    this.model = new Float64Array(length);
  }

  /** The first `count` basis columns. */
  basisColumns(count: number): Float64Array[] {
    while (this.columns.length < count) this.columns.push(new Float64Array(this.length));
    return this.columns.slice(0, count);
  }
}

/**
 * Linear parameters minimising the squared error for fixed alpha, omega0 and t0; the model values
 * are left in workspace.model. In a layout without a pre-event level, values with samples before t0 are
 * not part of the fit.
 */
export function solveAmplitudes(
  layout: ParameterLayout,
  time: ArrayLike<number>,
  values: ArrayLike<number>,
  alpha: number,
  omega0: number,
  t0: number,
  workspace: Workspace = new Workspace(time.length),
  block: BlockAverage | null = null,
): LinearSolution {
  const descriptor = LAYOUTS[layout];
  const k = descriptor.linear.length;
  const n = time.length;
  const { ec, es, after, model } = workspace;
  fillDampedBasis(alpha, omega0, t0, time, ec, es, block, after);
  const columns = workspace.basisColumns(k);
  descriptor.fillColumns(columns, alpha, ec, es);
  mixPreLevel(columns, descriptor.preLevelColumn, after);
  const skipBefore = descriptor.preLevelColumn === null;
  const { m, r } = normalEquations(columns, values, n, after, skipBefore);
  const coefficients = solveNormal(m, r, k);
  // Column by column: each value still sums its terms in the order of the columns.
  model.fill(0, 0, n);
  for (let p = 0; p < k; p++) {
    const column = columns[p];
    const coefficient = coefficients[p];
    for (let i = 0; i < n; i++) model[i] += column[i] * coefficient;
  }
  let sse = 0;
  for (let i = 0; i < n; i++) {
    if (after[i] < 1 && skipBefore) continue;
    const d = values[i] - model[i];
    sse += d * d;
  }
  return { coefficients, sse };
}

/**
 * Turns the response basis into the basis at each value: the response row weighted by the share of the
 * value's samples at or after t0, plus the pre-event row (the level before the event) by the share before.
 */
function mixPreLevel(columns: readonly Float64Array[], preLevelColumn: number | null, after: Float64Array): void {
  for (const column of columns) for (let i = 0; i < column.length; i++) if (after[i] !== 1) column[i] *= after[i];
  if (preLevelColumn === null) return;
  const level = columns[preLevelColumn];
  for (let i = 0; i < level.length; i++) if (after[i] !== 1) level[i] += 1 - after[i];
}

/**
 * The normal equations m c = r of the basis columns against the values, over the first n values (without those
 * with samples before t0 when skipBefore), in one pass: every sum gathers its terms in the order of the values,
 * as a dot product per pair would.
 */
function normalEquations(
  columns: readonly Float64Array[],
  values: ArrayLike<number>,
  n: number,
  after: Float64Array,
  skipBefore: boolean,
): { m: Float64Array; r: Float64Array } {
  const k = columns.length;
  const m = new Float64Array(k * k);
  const r = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    if (skipBefore && after[i] < 1) continue;
    const y = values[i];
    for (let p = 0; p < k; p++) {
      const cp = columns[p][i];
      r[p] += cp * y;
      for (let q = p; q < k; q++) m[p * k + q] += cp * columns[q][i];
    }
  }
  for (let p = 0; p < k; p++) for (let q = 0; q < p; q++) m[p * k + q] = m[q * k + p];
  return { m, r };
}
