// Checks the arguments of fitCurve once and turns them into a fully specified internal form.

import { FitInputError } from './fitInputError';
import type { CurveData, CurveModel, FitOptions } from './types';
import type { WeightedProblem } from './weightedProblem';

/** FitOptions with every default filled in (defaults are documented on FitOptions). */
export interface NormalizedFitOptions {
  maxIterations: number;
  min: number[];
  max: number[];
  tolerance: number;
  svdCutoff: number;
  trialDifferences: 'central' | 'forward';
  stopAt: ((p: readonly number[], chiSquare: number) => boolean) | null;
}

export interface NormalizedFitInput {
  problem: WeightedProblem;
  initial: number[];
  options: NormalizedFitOptions;
}

export const DEFAULT_MAX_ITERATIONS = 400;
export const DEFAULT_TOLERANCE = 1e-12;
export const DEFAULT_SVD_CUTOFF = 1e-10;

/** Validate model, data, start and options; throws FitInputError naming the first problem found. */
export function normalizeFitInput(
  model: CurveModel,
  data: CurveData,
  initial: readonly number[],
  options: FitOptions = {},
): NormalizedFitInput {
  const p = model.names.length;
  if (p === 0) throw new FitInputError('model.names', 'the model has no parameters');
  if (initial.length !== p) {
    throw new FitInputError('initial', `has ${initial.length} values but the model has ${p} parameters (${model.names.join(', ')})`);
  }
  initial.forEach((v, j) => {
    if (!Number.isFinite(v)) throw new FitInputError('initial', `${model.names[j]} = ${v} is not a finite number`, j);
  });

  const n = data.x.length;
  if (data.y.length !== n) throw new FitInputError('data.y', `has ${data.y.length} values but data.x has ${n}`);
  if (data.weights !== undefined && data.weights.length !== n) {
    throw new FitInputError('data.weights', `has ${data.weights.length} values but data.x has ${n}`);
  }
  const weights = data.weights;
  // Checked and counted first, then copied: no list of the kept rows, no call per value (a fit runs this on every refinement).
  let kept = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(data.x[i])) throw new FitInputError('data.x', `${data.x[i]} is not a finite number`, i);
    if (!Number.isFinite(data.y[i])) throw new FitInputError('data.y', `${data.y[i]} is not a finite number`, i);
    const w = weights === undefined ? 1 : weights[i];
    if (!(Number.isFinite(w) && w >= 0)) throw new FitInputError('data.weights', `${w} is not a finite number >= 0`, i);
    if (w > 0) kept++;
  }
  if (kept <= p) {
    throw new FitInputError('data', `${kept} points with positive weight; ${p} parameters need at least ${p + 1}`);
  }

  const x = new Float64Array(kept);
  const y = new Float64Array(kept);
  const sqrtWeight = new Float64Array(kept);
  for (let i = 0, k = 0; i < n; i++) {
    const w = weights === undefined ? 1 : weights[i];
    if (!(w > 0)) continue;
    const root = Math.sqrt(w);
    x[k] = data.x[i];
    y[k] = root * data.y[i];
    sqrtWeight[k++] = root;
  }
  const problem: WeightedProblem = { model, x, y, sqrtWeight };
  return { problem, initial: [...initial], options: normalizeOptions(options, model.names, initial) };
}

function normalizeOptions(options: FitOptions, names: string[], initial: readonly number[]): NormalizedFitOptions {
  const p = names.length;
  const maxIterations = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  if (!(Number.isInteger(maxIterations) && maxIterations >= 1)) {
    throw new FitInputError('options.maxIterations', `${maxIterations} is not a positive integer`);
  }
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  if (!(tolerance > 0 && tolerance < 1)) throw new FitInputError('options.tolerance', `${tolerance} is not between 0 and 1`);
  const svdCutoff = options.svdCutoff ?? DEFAULT_SVD_CUTOFF;
  if (!(svdCutoff > 0 && svdCutoff < 1)) throw new FitInputError('options.svdCutoff', `${svdCutoff} is not between 0 and 1`);

  const bound = (field: 'min' | 'max', fill: number): number[] => {
    const given = options[field];
    if (given === undefined) return new Array<number>(p).fill(fill);
    if (given.length !== p) throw new FitInputError(`options.${field}`, `has ${given.length} values but the model has ${p} parameters`);
    given.forEach((v, j) => {
      if (Number.isNaN(v) || v === -fill) throw new FitInputError(`options.${field}`, `${names[j]}: ${v} is not a usable bound`, j);
    });
    return [...given];
  };
  const min = bound('min', -Infinity);
  const max = bound('max', Infinity);
  for (let j = 0; j < p; j++) {
    if (!(min[j] < max[j])) throw new FitInputError('options.min', `${names[j]}: lower bound ${min[j]} is not below upper bound ${max[j]}`, j);
    if (initial[j] < min[j] || initial[j] > max[j]) {
      throw new FitInputError('initial', `${names[j]} = ${initial[j]} is outside its bounds [${min[j]}, ${max[j]}]`, j);
    }
  }
  const trialDifferences = options.trialDifferences ?? 'central';
  if (trialDifferences !== 'central' && trialDifferences !== 'forward') throw new FitInputError('options.trialDifferences', `${String(trialDifferences)} is not 'central' or 'forward'`);
  const stopAt = options.stopAt ?? null;
  if (stopAt !== null && typeof stopAt !== 'function') throw new FitInputError('options.stopAt', 'is not a function');
  return { maxIterations, min, max, tolerance, svdCutoff, trialDifferences, stopAt };
}
