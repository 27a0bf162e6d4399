// The linear part of the response (levels and amplitudes) by least squares for given alpha, omega0, t0.

import { fillDampedBasis, RunSteps, type BlockAverage } from '../response/secondOrder';
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
function solveNormal({ m, r, d, l, dead, z }: Scratch, k: number): number[] {
  for (let i = 0; i < k; i++) d[i] = m[i * k + i] > 0 ? Math.sqrt(m[i * k + i]) : 1;
  // The Cholesky factor of the scaled matrix m[i][j] / (d[i] d[j]), row-major; a dead pivot's column stays zero.
  l.fill(0);
  dead.fill(0);
  z.fill(0);
  for (let j = 0; j < k; j++) {
    let s = m[j * k + j] / (d[j] * d[j]);
    for (let p = 0; p < j; p++) s -= l[j * k + p] * l[j * k + p];
    if (s < 1e-14) {
      dead[j] = 1;
      continue;
    }
    l[j * k + j] = Math.sqrt(s);
    for (let i = j + 1; i < k; i++) {
      let t = m[i * k + j] / (d[i] * d[j]);
      for (let p = 0; p < j; p++) t -= l[i * k + p] * l[j * k + p];
      l[i * k + j] = t / l[j * k + j];
    }
  }
  for (let i = 0; i < k; i++) {
    if (dead[i]) continue;
    let s = r[i] / d[i];
    for (let p = 0; p < i; p++) s -= l[i * k + p] * z[p];
    z[i] = s / l[i * k + i];
  }
  const x = new Array<number>(k).fill(0);
  for (let i = k - 1; i >= 0; i--) {
    if (dead[i]) continue;
    let s = z[i];
    for (let p = i + 1; p < k; p++) s -= l[p * k + i] * x[p];
    x[i] = s / l[i * k + i];
  }
  for (let i = 0; i < k; i++) x[i] /= d[i];
  return x;
}

/** What one solve with k linear parameters works in: its k basis columns, the normal equations and their factor. */
interface Scratch {
  columns: readonly Float64Array[];
  m: Float64Array;
  r: Float64Array;
  d: Float64Array;
  l: Float64Array;
  dead: Uint8Array;
  z: Float64Array;
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
  /** The scratch of a solve with k linear parameters, at index k. */
  private readonly scratches: Scratch[] = [];
  /** The even runs of the time axis, found once per axis (a fit's axis does not change between its solves). */
  readonly runSteps = new RunSteps();
  constructor(readonly length: number) {
    this.ec = new Float64Array(length);
    this.es = new Float64Array(length);
    this.after = new Float64Array(length);
    this.model = new Float64Array(length);
  }

  /** The scratch of a solve with `count` linear parameters: the first `count` basis columns, always the same list. */
  scratch(count: number): Scratch {
    const kept = this.scratches[count];
    if (kept) return kept;
    while (this.columns.length < count) this.columns.push(new Float64Array(this.length));
    const made = {
      columns: this.columns.slice(0, count),
      m: new Float64Array(count * count),
      r: new Float64Array(count),
      d: new Float64Array(count),
      l: new Float64Array(count * count),
      dead: new Uint8Array(count),
      z: new Float64Array(count),
    };
    this.scratches[count] = made;
    return made;
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
  const eventEnd = fillDampedBasis(alpha, omega0, t0, time, ec, es, block, after, workspace.runSteps.of(time));
  const scratch = workspace.scratch(k);
  const { columns } = scratch;
  descriptor.fillColumns(columns, alpha, ec, es);
  mixPreLevel(columns, descriptor.preLevelColumn, after, eventEnd);
  const skipBefore = descriptor.preLevelColumn === null;
  normalEquations(columns, values, n, after, skipBefore, scratch.m, scratch.r);
  const coefficients = solveNormal(scratch, k);
  return { coefficients, sse: modelAndSse(columns, coefficients, values, n, after, skipBefore, model) };
}

/**
 * The model values into `model` and their residual sum of squares (without the values with samples before t0 when
 * skipBefore). Each value sums its terms in the order of the columns, starting from 0 (for the layouts' 2 to 4
 * columns a loop of its own with them in local variables: the same sums in the same order).
 */
function modelAndSse(
  columns: readonly Float64Array[],
  x: readonly number[],
  values: ArrayLike<number>,
  n: number,
  after: Float64Array,
  skipBefore: boolean,
  model: Float64Array,
): number {
  const k = columns.length;
  const [c0, c1, c2, c3] = columns;
  const [x0, x1, x2, x3] = x;
  if (k === 2) for (let i = 0; i < n; i++) model[i] = 0 + c0[i] * x0 + c1[i] * x1;
  else if (k === 3) for (let i = 0; i < n; i++) model[i] = 0 + c0[i] * x0 + c1[i] * x1 + c2[i] * x2;
  else if (k === 4) for (let i = 0; i < n; i++) model[i] = 0 + c0[i] * x0 + c1[i] * x1 + c2[i] * x2 + c3[i] * x3;
  else {
    for (let i = 0; i < n; i++) {
      let value = 0;
      for (let p = 0; p < k; p++) value += columns[p][i] * x[p];
      model[i] = value;
    }
  }
  let sse = 0;
  for (let i = 0; i < n; i++) {
    if (after[i] < 1 && skipBefore) continue;
    const d = values[i] - model[i];
    sse += d * d;
  }
  return sse;
}

/**
 * Turns the response basis into the basis at each value: the response row weighted by the share of the
 * value's samples at or after t0, plus the pre-event row (the level before the event) by the share before.
 * Only values before eventEnd change (the share is 1 from there on: see fillDampedBasis).
 */
function mixPreLevel(columns: readonly Float64Array[], preLevelColumn: number | null, after: Float64Array, eventEnd: number): void {
  for (const column of columns) for (let i = 0; i < eventEnd; i++) if (after[i] !== 1) column[i] *= after[i];
  if (preLevelColumn === null) return;
  const level = columns[preLevelColumn];
  for (let i = 0; i < eventEnd; i++) if (after[i] !== 1) level[i] += 1 - after[i];
}

/**
 * The normal equations m c = r of the basis columns against the values, over the first n values (without those
 * with samples before t0 when skipBefore), in one pass into m and r: every sum gathers its terms in the order of
 * the values, as a dot product per pair would.
 */
function normalEquations(
  columns: readonly Float64Array[],
  values: ArrayLike<number>,
  n: number,
  after: Float64Array,
  skipBefore: boolean,
  m: Float64Array,
  r: Float64Array,
): void {
  const k = columns.length;
  // The layouts have 2 to 4 linear parameters: their sums in local variables, one pass each (the same sums in the same order).
  if (k === 2) twoColumns(columns, values, n, after, skipBefore, m, r);
  else if (k === 3) threeColumns(columns, values, n, after, skipBefore, m, r);
  else if (k === 4) fourColumns(columns, values, n, after, skipBefore, m, r);
  else {
    m.fill(0);
    r.fill(0);
    anyColumns(columns, values, n, after, skipBefore, m, r);
  }
  for (let p = 0; p < k; p++) for (let q = 0; q < p; q++) m[p * k + q] = m[q * k + p];
}

type Kernel = (columns: readonly Float64Array[], values: ArrayLike<number>, n: number, after: Float64Array, skipBefore: boolean, m: Float64Array, r: Float64Array) => void;

const anyColumns: Kernel = (columns, values, n, after, skipBefore, m, r) => {
  const k = columns.length;
  for (let i = 0; i < n; i++) {
    if (skipBefore && after[i] < 1) continue;
    const y = values[i];
    for (let p = 0; p < k; p++) {
      const cp = columns[p][i];
      r[p] += cp * y;
      for (let q = p; q < k; q++) m[p * k + q] += cp * columns[q][i];
    }
  }
};

const twoColumns: Kernel = (columns, values, n, after, skipBefore, m, r) => {
  const [c0, c1] = columns;
  let r0 = 0, r1 = 0, m00 = 0, m01 = 0, m11 = 0; // prettier-ignore
  for (let i = 0; i < n; i++) {
    if (skipBefore && after[i] < 1) continue;
    const y = values[i];
    const a0 = c0[i];
    const a1 = c1[i];
    r0 += a0 * y; m00 += a0 * a0; m01 += a0 * a1; // prettier-ignore
    r1 += a1 * y; m11 += a1 * a1; // prettier-ignore
  }
  r[0] = r0; r[1] = r1; // prettier-ignore
  m[0] = m00; m[1] = m01; m[3] = m11; // prettier-ignore
};

const threeColumns: Kernel = (columns, values, n, after, skipBefore, m, r) => {
  const [c0, c1, c2] = columns;
  let r0 = 0, r1 = 0, r2 = 0, m00 = 0, m01 = 0, m02 = 0, m11 = 0, m12 = 0, m22 = 0; // prettier-ignore
  for (let i = 0; i < n; i++) {
    if (skipBefore && after[i] < 1) continue;
    const y = values[i];
    const a0 = c0[i];
    const a1 = c1[i];
    const a2 = c2[i];
    r0 += a0 * y; m00 += a0 * a0; m01 += a0 * a1; m02 += a0 * a2; // prettier-ignore
    r1 += a1 * y; m11 += a1 * a1; m12 += a1 * a2; // prettier-ignore
    r2 += a2 * y; m22 += a2 * a2; // prettier-ignore
  }
  r[0] = r0; r[1] = r1; r[2] = r2; // prettier-ignore
  m[0] = m00; m[1] = m01; m[2] = m02; m[4] = m11; m[5] = m12; m[8] = m22; // prettier-ignore
};

const fourColumns: Kernel = (columns, values, n, after, skipBefore, m, r) => {
  const [c0, c1, c2, c3] = columns;
  let r0 = 0, r1 = 0, r2 = 0, r3 = 0; // prettier-ignore
  let m00 = 0, m01 = 0, m02 = 0, m03 = 0, m11 = 0, m12 = 0, m13 = 0, m22 = 0, m23 = 0, m33 = 0; // prettier-ignore
  for (let i = 0; i < n; i++) {
    if (skipBefore && after[i] < 1) continue;
    const y = values[i];
    const a0 = c0[i];
    const a1 = c1[i];
    const a2 = c2[i];
    const a3 = c3[i];
    r0 += a0 * y; m00 += a0 * a0; m01 += a0 * a1; m02 += a0 * a2; m03 += a0 * a3; // prettier-ignore
    r1 += a1 * y; m11 += a1 * a1; m12 += a1 * a2; m13 += a1 * a3; // prettier-ignore
    r2 += a2 * y; m22 += a2 * a2; m23 += a2 * a3; // prettier-ignore
    r3 += a3 * y; m33 += a3 * a3; // prettier-ignore
  }
  r[0] = r0; r[1] = r1; r[2] = r2; r[3] = r3; // prettier-ignore
  m[0] = m00; m[1] = m01; m[2] = m02; m[3] = m03; m[5] = m11; m[6] = m12; m[7] = m13; m[10] = m22; m[11] = m23; m[15] = m33; // prettier-ignore
};
