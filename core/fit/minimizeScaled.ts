// Levenberg-Marquardt on scaled parameters: ml-levenberg-marquardt computes each damped step, this loop decides.

import { levenbergMarquardt } from 'ml-levenberg-marquardt';

import type { NormalizedFitOptions } from './normalizeFitInput';
import { numericJacobian } from './numericJacobian';
import type { FitStatus } from './types';
import { sumOfSquares, weightedResiduals, type WeightedProblem } from './weightedProblem';

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
/** Finite-difference step for the library's Jacobian, relative to the scaled value (floored near zero). */
const STEP = { relative: 1e-6, floor: 1e-3 };
/** Largest |cosine| between the residual vector and a Jacobian column accepted at a minimum... */
const GRADIENT_TOLERANCE = 1e-6;
/** ...unless the residuals are so small that rounding in y - f (a few eps |y|) blurs the cosine more. */
const ROUNDING = 10 * Number.EPSILON;

/*
 * Why the loop is ours: the library's own loop keeps every step, uphill ones too, and stops only
 * when chi^2 falls below an absolute threshold. Called for one iteration from the best point so
 * far, it returns the better of that point and the damped Gauss-Newton step from it: one classic
 * Levenberg-Marquardt trial, with the library's central-difference Jacobian and Cholesky solve.
 * The damping then falls after a success and rises after a failure (Marquardt's rule); a success
 * counts as convergence when chi^2 moved by less than the tolerance and the gradient vanishes.
 * Parameters enter the library divided by their scales (u = p / s) and residuals divided by c,
 * the largest column norm of the scaled Jacobian at the start, so the library's additive damping
 * means the same thing for every problem. A parameter resting on a bound is held out of the
 * trials (the library would couple its clipped step into the others) until the gradient says
 * it wants back into the box. Restarting the library's own loop in rounds was tried and reached
 * the NIST certified values less often than this.
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
  const trial = scaledTrial(problem, box, residualScale(problem, initial, scales, options));

  let u = box.scale(initial);
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

/** An error thrown by the caller's model, carried through the library untouched. */
class ModelFailure extends Error {
  constructor(readonly original: unknown) {
    super('model evaluation failed');
  }
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

type Trial = (u: readonly number[], free: readonly number[], damping: number) => { u: number[]; chiSquare: number } | null;

/** One library iteration over the free parameters in scaled units: the better point and its chi^2, or null if the trial broke down. */
function scaledTrial(problem: WeightedProblem, box: ScaledBox, c: number): Trial {
  const { model, x, sqrtWeight } = problem;
  const data = { x: Float64Array.from(x, (_, i) => i), y: problem.y.map((v) => v / c) };
  return (u, free, damping) => {
    const full = (w: readonly number[]): number[] => {
      const out = [...u];
      free.forEach((j, k) => (out[j] = w[k]));
      return out;
    };
    // The library's difference steps may cross a bound; the model only ever sees the clipped value.
    const curve = (w: number[]) => {
      const p = box.unscale(full(w));
      return (i: number) => {
        try {
          return (sqrtWeight[i] * model.evaluate(p, x[i])) / c;
        } catch (error) {
          throw new ModelFailure(error);
        }
      };
    };
    try {
      const result = levenbergMarquardt(data, curve, {
        initialValues: free.map((j) => u[j]),
        damping,
        maxIterations: 1,
        errorTolerance: 0,
        centralDifference: true,
        gradientDifference: free.map((j) => STEP.relative * Math.max(Math.abs(u[j]), STEP.floor)),
        minValues: free.map((j) => box.min[j]),
        maxValues: free.map((j) => box.max[j]),
      });
      return { u: full(result.parameterValues), chiSquare: result.parameterError * c * c };
    } catch (error) {
      if (error instanceof ModelFailure) throw error.original;
      // A NaN in the library's J^T J makes its Cholesky refuse the matrix: count it as a failed trial.
      return null;
    }
  };
}

/** Largest column norm of the scaled Jacobian at the start, so that max diag(J^T J / c^2) = 1 there. */
function residualScale(problem: WeightedProblem, p: readonly number[], scales: readonly number[], options: NormalizedFitOptions): number {
  const J = numericJacobian(problem, p, scales, options.min, options.max);
  let largest = 0;
  for (let j = 0; j < p.length; j++) {
    const column = Math.sqrt(sumOfSquares(J.map((row) => row[j]))) * scales[j];
    if (column > largest) largest = column;
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
  const J = numericJacobian(problem, p, scales, options.min, options.max);
  const inward: number[] = [];
  for (let j = 0; j < p.length; j++) {
    let dot = 0;
    let norm = 0;
    for (let i = 0; i < r.length; i++) {
      dot += J[i][j] * r[i];
      norm += J[i][j] * J[i][j];
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
