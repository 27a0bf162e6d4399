// Levenberg-Marquardt on scaled parameters: each damped step computed here, the loop deciding on it.

import type { NormalizedFitOptions } from './normalizeFitInput';
import { jacobianColumns } from './numericJacobian';
import { dotInOrder } from './vectorKernels';
import type { FitStatus } from './types';
import { sumOfSquares, weightedModel, weightedResiduals, type WeightedProblem } from './weightedProblem';

export interface MinimizeOutcome {
  p: number[];
  chiSquare: number;
  iterations: number;
  status: FitStatus;
  message: string;
}

/**
 * Damping, relative to the largest diagonal element of the normalised J^T J: divided by `down` on a
 * success; on a failure multiplied by a factor that starts at `up` and doubles with each failure in
 * a row, so a damping that fell very low climbs back in a few trials.
 */
const DAMPING = { start: 1e-3, min: 1e-15, max: 1e10, down: 3, up: 3 };
/** Finite-difference step for the trials' Jacobian, relative to the scaled value (floored near zero). */
const STEP = { relative: 1e-6, floor: 1e-3 };
/** Largest |cosine| between the residual vector and a Jacobian column accepted at a minimum... */
const GRADIENT_TOLERANCE = 1e-6;
/** ...unless the residuals are so small that rounding in y - f (a few eps |y|) blurs the cosine more. */
const ROUNDING = 10 * Number.EPSILON;

/*
 * Classic Levenberg-Marquardt: one damped Gauss-Newton trial at a time from the best point so far
 * (a central- or forward-difference Jacobian, Cholesky solve), kept only when it lowers chi^2. The damping then
 * falls after a success and rises after a failure (Marquardt's rule); a success counts as convergence
 * when chi^2 moved by less than the tolerance and the gradient vanishes. Parameters are divided by
 * their scales (u = p / s) and residuals by c, the largest column norm of the scaled Jacobian at the
 * start, so the additive damping means the same thing for every problem. A parameter resting on a
 * bound is held out of the trials (a clipped step would couple into the others) until the gradient
 * says it wants back into the box. The trials were first made by ml-levenberg-marquardt called for
 * one iteration; they are the same step, computed here so that a failed trial reuses the point's
 * Jacobian and normal equations. Running a library's own loop (which keeps uphill steps too, and stops only when chi^2
 * falls below an absolute threshold) in rounds reached the NIST certified values less often.
 */
export function minimizeScaled(
  problem: WeightedProblem,
  initial: readonly number[],
  scales: readonly number[],
  options: NormalizedFitOptions,
): MinimizeOutcome {
  const { maxIterations, tolerance } = options;
  let chi = sumOfSquares(weightedResiduals(problem, initial));
  if (!Number.isFinite(chi)) {
    return { p: [...initial], chiSquare: NaN, iterations: 0, status: 'failed', message: 'the model is not finite at the initial parameters' };
  }
  const box = scaledBox(scales, options);
  const toP = (u: readonly number[]) => box.unscale(u);
  const c = options.trialDifferences === 'forward' ? forwardResidualScale(problem, box, initial) : residualScale(problem, initial, scales, options);
  const trial = scaledTrial(problem, box, c, options.trialDifferences);

  let u: readonly number[] = box.scale(initial);
  let released = new Set<number>();
  let damping = DAMPING.start;
  let growth = DAMPING.up;
  let iterations = 0;
  const stationary = (): boolean => {
    const inward = inwardAtBound(problem, toP(u), scales, options);
    released = new Set(inward ?? []);
    return inward !== null && inward.length === 0;
  };
  while (iterations < maxIterations) {
    const p = toP(u);
    const free = u.map((_, j) => j).filter((j) => released.has(j) || !box.onBound(u, j));
    const next = trial(u, free, damping);
    iterations++;
    if (next !== null && next.chiSquare < chi) {
      const drop = (chi - next.chiSquare) / chi;
      u = next.u;
      chi = next.chiSquare;
      released.clear();
      damping = Math.max(damping / DAMPING.down, DAMPING.min);
      growth = DAMPING.up;
      if (chi === 0 || (drop <= tolerance && stationary())) {
        return { p: toP(u), chiSquare: chi, iterations, status: 'converged', message: `chi^2 changed by ${drop.toExponential(1)} (relative) in the last step` };
      }
      if (options.stopAt?.(toP(u), chi)) return { p: toP(u), chiSquare: chi, iterations, status: 'converged', message: 'stopped where the caller asked' };
    } else {
      damping *= growth;
      growth *= 2;
      if (damping > DAMPING.max) {
        if (stationary()) return { p, chiSquare: chi, iterations, status: 'converged', message: 'no step lowers chi^2 any further' };
        if (released.size === 0) return { p, chiSquare: chi, iterations, status: 'failed', message: 'stalled: no step lowers chi^2, yet the gradient is not zero' };
        damping = DAMPING.start;
        growth = DAMPING.up;
      }
    }
  }
  return { p: toP(u), chiSquare: chi, iterations, status: 'max-iterations', message: `stopped after ${maxIterations} iterations without meeting the tolerance` };
}

/** Scaled coordinates u = p / s and the bounds in them; a u clipped to a bound maps back to the bound exactly. */
interface ScaledBox {
  min: number[];
  max: number[];
  scale(p: readonly number[]): number[];
  unscale(u: readonly number[]): number[];
  onBound(u: readonly number[], j: number): boolean;
}

function scaledBox(scales: readonly number[], options: NormalizedFitOptions): ScaledBox {
  const min = options.min.map((v, j) => v / scales[j]);
  const max = options.max.map((v, j) => v / scales[j]);
  return {
    min,
    max,
    scale: (p) => p.map((v, j) => v / scales[j]),
    unscale: (u) =>
      u.map((v, j) => (v <= min[j] ? options.min[j] : v >= max[j] ? options.max[j] : v * scales[j])),
    onBound: (u, j) => u[j] <= min[j] || u[j] >= max[j],
  };
}

type Trial = (u: readonly number[], free: readonly number[], damping: number) => { u: readonly number[]; chiSquare: number } | null;

/**
 * One Levenberg-Marquardt trial over the free parameters in scaled units, the step the library computed:
 * Jacobian J of the model (central or forward differences) divided by c, (J^T J + damping I) d = J^T r by Cholesky
 * (Gaussian elimination where rounding leaves the matrix short of positive definite), the new point
 * clipped to the box. Returns the better of the point and the trial with its chi^2 (the point's own
 * chi^2, computed here, can differ from the caller's by rounding), or null if the trial broke down (a
 * non-finite Jacobian or step). The residuals and Jacobian columns at a point are kept until the point
 * moves: a failed trial only raises the damping, so the next one from the same point costs one model
 * pass instead of 2 per free parameter and 3 more.
 */
function scaledTrial(problem: WeightedProblem, box: ScaledBox, c: number, differences: 'central' | 'forward'): Trial {
  const n = problem.x.length;
  // Plain loops and copies: a typed array's map calls back per value, and Float64Array.from walks an iterator.
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[i] = problem.y[i] / c;
  /** Residuals y/c - f/c at u into `out`, and their sum of squares times c^2 (NaN if not finite). */
  const residualsAt = (u: readonly number[], out: Float64Array): number => {
    weightedModel(problem, box.unscale(u), out);
    let error = 0;
    for (let i = 0; i < n; i++) {
      out[i] = y[i] - out[i] / c;
      error += out[i] * out[i];
    }
    return error * c * c;
  };
  type Point = { u: readonly number[]; residuals: Float64Array; chiSquare: number; columns: Map<number, Float64Array>; normal: Map<string, { gram: Float64Array; gradient: Float64Array }> };
  let here: Point | null = null;
  // Vectors of the points the solver has left, handed out again: a fresh array of n values for every residual
  // vector and Jacobian column was most of a batch's garbage (each one a separately allocated buffer).
  const freed: Float64Array[] = [];
  const vector = (): Float64Array => freed.pop() ?? new Float64Array(n);
  const moveTo = (point: Point): Point => {
    if (here) freed.push(here.residuals, ...here.columns.values());
    return (here = point);
  };
  const up = new Float64Array(n);
  const down = new Float64Array(n);
  let spare: Float64Array = new Float64Array(n);
  /**
   * d(residual)/du_j at the current point by central differences, or by a forward difference from the point's own
   * residuals (one model pass per column; backward where the step would leave the box). Forward ones suit a
   * well-scaled model whose trials only need a direction (the response fit: an error of the step's size, 1e-6
   * relative, slows nothing there); a narrow valley like NIST's MGH17 needs central ones to reach its minimum.
   * The stationarity test always takes central differences.
   */
  const column = (j: number): Float64Array => {
    const point = here as NonNullable<typeof here>;
    const known = point.columns.get(j);
    if (known) return known;
    const size = forwardStep(point.u[j]);
    const shifted = [...point.u];
    const out = vector();
    if (differences === 'central') {
      shifted[j] = point.u[j] + size;
      residualsAt(shifted, up);
      shifted[j] = point.u[j] - size;
      residualsAt(shifted, down);
      for (let i = 0; i < n; i++) out[i] = (down[i] - up[i]) / (2 * size);
    } else {
      const h = inBox(point.u[j], size, box.max[j]);
      shifted[j] = point.u[j] + h;
      residualsAt(shifted, up);
      for (let i = 0; i < n; i++) out[i] = (point.residuals[i] - up[i]) / h;
    }
    point.columns.set(j, out);
    return out;
  };
  /** J^T J and J^T r over the free parameters at the point, kept with it: a failed trial from the same point only changes the damping. */
  const normalEquations = (point: NonNullable<typeof here>, free: readonly number[]): { gram: Float64Array; gradient: Float64Array } => {
    const key = free.join(',');
    const known = point.normal.get(key);
    if (known) return known;
    const k = free.length;
    const columns = free.map(column);
    const gram = new Float64Array(k * k);
    const gradient = new Float64Array(k);
    const residuals = point.residuals;
    for (let a = 0; a < k; a++) {
      for (let b = a; b < k; b++) gram[a * k + b] = gram[b * k + a] = dotInOrder(columns[a], columns[b], n);
      gradient[a] = dotInOrder(columns[a], residuals, n);
    }
    const equations = { gram, gradient };
    point.normal.set(key, equations);
    return equations;
  };
  return (u, free, damping) => {
    let point = here;
    if (point === null || point.u !== u) {
      const residuals = vector();
      point = moveTo({ u, residuals, chiSquare: residualsAt(u, residuals), columns: new Map(), normal: new Map() });
    }
    const k = free.length;
    const { gram, gradient } = normalEquations(point, free);
    const normal = gram.slice();
    for (let a = 0; a < k; a++) normal[a * k + a] += damping;
    const step = solveSymmetric(normal, gradient, k);
    if (step === null) return null;
    const next = [...u];
    free.forEach((j, a) => (next[j] = Math.min(Math.max(box.min[j], u[j] + step[a]), box.max[j])));
    const chiSquare = residualsAt(next, spare);
    if (!(chiSquare < point.chiSquare)) return { u, chiSquare: point.chiSquare };
    // The trial's residuals become those of the new point, should the caller move there.
    const residuals = spare;
    moveTo({ u: next, residuals, chiSquare, columns: new Map(), normal: new Map() });
    spare = vector();
    return { u: next, chiSquare };
  };
}

/** x with m x = b for a small symmetric m (row-major, k x k): Cholesky, or elimination with pivoting if m is not positive definite; null if not finite. */
function solveSymmetric(m: Float64Array, b: Float64Array, k: number): number[] | null {
  for (let i = 0; i < k * k; i++) if (!Number.isFinite(m[i])) return null;
  const l = new Float64Array(k * k);
  let positive = true;
  for (let j = 0; j < k && positive; j++) {
    let d = m[j * k + j];
    for (let p = 0; p < j; p++) d -= l[j * k + p] * l[j * k + p];
    if (!(d > 0)) positive = false;
    l[j * k + j] = Math.sqrt(d);
    for (let i = j + 1; i < k; i++) {
      let s = m[i * k + j];
      for (let p = 0; p < j; p++) s -= l[i * k + p] * l[j * k + p];
      l[i * k + j] = s / l[j * k + j];
    }
  }
  const x = positive ? choleskySolve(l, b, k) : eliminate(m, b, k);
  return x.every(Number.isFinite) ? x : null;
}

function choleskySolve(l: Float64Array, b: Float64Array, k: number): number[] {
  const z = new Array<number>(k).fill(0);
  for (let i = 0; i < k; i++) {
    let s = b[i];
    for (let p = 0; p < i; p++) s -= l[i * k + p] * z[p];
    z[i] = s / l[i * k + i];
  }
  for (let i = k - 1; i >= 0; i--) {
    let s = z[i];
    for (let p = i + 1; p < k; p++) s -= l[p * k + i] * z[p];
    z[i] = s / l[i * k + i];
  }
  return z;
}

/** Gaussian elimination with partial pivoting (a singular matrix gives non-finite values, which the caller refuses). */
function eliminate(m: Float64Array, b: Float64Array, k: number): number[] {
  const a = Array.from({ length: k }, (_, i) => [...m.subarray(i * k, i * k + k), b[i]]);
  for (let col = 0; col < k; col++) {
    let pivot = col;
    for (let i = col + 1; i < k; i++) if (Math.abs(a[i][col]) > Math.abs(a[pivot][col])) pivot = i;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let i = col + 1; i < k; i++) {
      const f = a[i][col] / a[col][col];
      for (let j = col; j <= k; j++) a[i][j] -= f * a[col][j];
    }
  }
  const x = new Array<number>(k).fill(0);
  for (let i = k - 1; i >= 0; i--) {
    let s = a[i][k];
    for (let j = i + 1; j < k; j++) s -= a[i][j] * x[j];
    x[i] = s / a[i][i];
  }
  return x;
}

/** The step of a trial's difference in scaled coordinates. */
function forwardStep(u: number): number {
  return STEP.relative * Math.max(Math.abs(u), STEP.floor);
}

/** A forward step, or a backward one where it would leave the box. */
function inBox(u: number, size: number, max: number): number {
  return u + size <= max ? size : -size;
}

/**
 * residualScale from the forward differences the first trial takes (at the same points, so a model that keeps its
 * last few vectors' values computes them once): one model pass per parameter instead of two.
 */
function forwardResidualScale(problem: WeightedProblem, box: ScaledBox, initial: readonly number[]): number {
  const u = box.scale(initial);
  const here = weightedModel(problem, box.unscale(u));
  const moved = new Float64Array(here.length);
  let largest = 0;
  for (let j = 0; j < u.length; j++) {
    const shifted = [...u];
    const h = inBox(u[j], forwardStep(u[j]), box.max[j]);
    shifted[j] = u[j] + h;
    weightedModel(problem, box.unscale(shifted), moved);
    let sum = 0;
    for (let i = 0; i < moved.length; i++) sum += ((moved[i] - here[i]) / h) ** 2;
    const norm = Math.sqrt(sum);
    if (Number.isFinite(norm) && norm > largest) largest = norm;
  }
  return largest > 0 ? largest : 1;
}

/** Largest column norm of the scaled Jacobian at the start, so that max diag(J^T J / c^2) = 1 there. */
function residualScale(problem: WeightedProblem, p: readonly number[], scales: readonly number[], options: NormalizedFitOptions): number {
  let largest = 0;
  for (const [j, column] of jacobianColumns(problem, p, scales, options.min, options.max).entries()) {
    const norm = Math.sqrt(sumOfSquares(column)) * scales[j];
    if (norm > largest) largest = norm;
  }
  return largest > 0 ? largest : 1;
}

/**
 * The stationarity test. Returns null when the gradient does not vanish for some parameter
 * inside the box; otherwise the parameters on a bound whose gradient points back into the box
 * (empty at a true constrained minimum). The gradient component of p_j is measured as the cosine
 * between the residuals and the Jacobian column.
 */
function inwardAtBound(problem: WeightedProblem, p: readonly number[], scales: readonly number[], options: NormalizedFitOptions): number[] | null {
  const r = weightedResiduals(problem, p);
  const rNorm = Math.sqrt(sumOfSquares(r));
  if (rNorm === 0) return [];
  const limit = Math.max(GRADIENT_TOLERANCE, (ROUNDING * Math.sqrt(sumOfSquares(problem.y))) / rNorm);
  const J = jacobianColumns(problem, p, scales, options.min, options.max);
  const inward: number[] = [];
  for (let j = 0; j < p.length; j++) {
    const column = J[j];
    let dot = 0;
    let norm = 0;
    for (let i = 0; i < r.length; i++) {
      dot += column[i] * r[i];
      norm += column[i] * column[i];
    }
    if (!Number.isFinite(dot) || !Number.isFinite(norm)) return null;
    if (norm === 0) continue;
    // J is the model's derivative, so cosine > 0 means raising p_j would lower chi^2.
    const cosine = dot / (Math.sqrt(norm) * rNorm);
    if (Math.abs(cosine) <= limit) continue;
    const atMin = p[j] <= options.min[j];
    const atMax = p[j] >= options.max[j];
    if ((cosine > 0 && atMax) || (cosine < 0 && atMin)) continue;
    if (!atMin && !atMax) return null;
    inward.push(j);
  }
  return inward;
}
