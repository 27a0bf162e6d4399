// The linear part of the response (levels and amplitudes) by least squares for given alpha, omega0, t0.

import { fillDampedBasis, type BlockAverage } from '../response/secondOrder';
import { LAYOUT_NAMES, nonlinearCount, type ParameterLayout } from './responseModel';

export interface LinearSolution {
  /** The linear parameters of the layout, in LAYOUT_NAMES order after the nonlinear ones. */
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
  constructor(readonly length: number) {
    this.ec = new Float64Array(length);
    this.es = new Float64Array(length);
    this.after = new Float64Array(length);
    this.model = new Float64Array(length);
  }
}

/**
 * The linear basis row of a layout at one value: the pre-event row weighted by the share of its samples
 * before t0, plus the response row (from the damped basis there) weighted by the share at or after it.
 */
function basisRow(layout: ParameterLayout, alpha: number, after: number, ec: number, es: number, g: Float64Array): void {
  responseRow(layout, alpha, ec, es, g);
  if (after === 1) return;
  for (let p = 0; p < g.length; p++) g[p] *= after;
  // Every layout's first linear parameter is the level before the event ('free' has none: its values start at t0).
  if (layout !== 'free') g[0] += 1 - after;
}

function responseRow(layout: ParameterLayout, alpha: number, ec: number, es: number, g: Float64Array): void {
  switch (layout) {
    case 'smooth': {
      const shape = ec + alpha * es;
      g[0] = shape;
      g[1] = 1 - shape;
      return;
    }
    case 'step':
      g[0] = ec;
      g[1] = 1 - ec;
      g[2] = es;
      return;
    case 'free-pre':
      g[0] = 0;
      g[1] = 1;
      g[2] = ec;
      g[3] = es;
      return;
    case 'free':
      g[0] = 1;
      g[1] = ec;
      g[2] = es;
      return;
  }
}

/**
 * Linear parameters minimising the squared error for fixed alpha, omega0 and t0; the model values
 * are left in workspace.model. In the 'free' layout values with samples before t0 are not part of the fit.
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
  const k = LAYOUT_NAMES[layout].length - nonlinearCount(layout);
  const n = time.length;
  const { ec, es, after, model } = workspace;
  fillDampedBasis(alpha, omega0, t0, time, ec, es, block, after);
  const m = new Float64Array(k * k);
  const r = new Float64Array(k);
  const g = new Float64Array(k);
  const skipBefore = layout === 'free';
  for (let i = 0; i < n; i++) {
    if (after[i] < 1 && skipBefore) continue;
    basisRow(layout, alpha, after[i], ec[i], es[i], g);
    const y = values[i];
    for (let p = 0; p < k; p++) {
      r[p] += g[p] * y;
      for (let q = p; q < k; q++) m[p * k + q] += g[p] * g[q];
    }
  }
  for (let p = 0; p < k; p++) for (let q = 0; q < p; q++) m[p * k + q] = m[q * k + p];
  const coefficients = solveNormal(m, r, k);
  let sse = 0;
  for (let i = 0; i < n; i++) {
    basisRow(layout, alpha, after[i], ec[i], es[i], g);
    let y = 0;
    for (let p = 0; p < k; p++) y += g[p] * coefficients[p];
    model[i] = y;
    if (after[i] < 1 && skipBefore) continue;
    const d = values[i] - y;
    sse += d * d;
  }
  return { coefficients, sse };
}
