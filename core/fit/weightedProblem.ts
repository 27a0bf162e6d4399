// A fit problem reduced to unit weights: rows scaled by sqrt(weight), zero-weight rows dropped.

import type { CurveModel } from './types';

export interface WeightedProblem {
  model: CurveModel;
  /** Abscissae of the rows kept (positive weight). */
  x: Float64Array;
  /** sqrt(weight) * y. */
  y: Float64Array;
  sqrtWeight: Float64Array;
}

/** sqrt(w_i) f(p, x_i) for every kept row. */
export function weightedModel(problem: WeightedProblem, p: readonly number[], out?: Float64Array): Float64Array {
  const f = out ?? new Float64Array(problem.x.length);
  const { model, x, sqrtWeight } = problem;
  if (model.evaluateAll) {
    model.evaluateAll(p, x, f);
    for (let i = 0; i < f.length; i++) f[i] = sqrtWeight[i] * f[i];
  } else {
    for (let i = 0; i < f.length; i++) f[i] = sqrtWeight[i] * model.evaluate(p, x[i]);
  }
  return f;
}

/** Weighted residuals sqrt(w_i) (y_i - f(p, x_i)). */
export function weightedResiduals(problem: WeightedProblem, p: readonly number[]): Float64Array {
  const r = weightedModel(problem, p);
  for (let i = 0; i < r.length; i++) r[i] = problem.y[i] - r[i];
  return r;
}

/** Sum of squares of a vector (NaN if any element is not finite). */
export function sumOfSquares(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return Number.isFinite(s) ? s : NaN;
}
