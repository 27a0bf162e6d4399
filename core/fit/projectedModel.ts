// The model the solver sees under variable projection: a sample index in, the linear solve's value there out.

import { solveAmplitudes, type LinearSolution, type Workspace } from './amplitudes';
import type { ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { CurveModel, FitStatus } from './types';

/**
 * How many recent parameter vectors' solves are kept. The solver comes back to a point after up to 2 per parameter
 * other ones (its start after the residual scale's central differences, its end after the stationarity test's), and
 * a point that no trial can leave after about ten failed trials; the refinement asks for the end point's amplitudes.
 */
const MODEL_CACHE_SIZE = 12;

/** The nonlinear parameters a solver vector stands for. */
export type PhysicalRates = (u: readonly number[]) => { alpha: number; omega0: number; t0: number };

/** The projected model of a refinement, and the linear solve at any solver vector (the last few kept). */
export type ProjectedModel = Pick<CurveModel, 'evaluate' | 'evaluateAll'> & { solutionAt(u: readonly number[]): LinearSolution };

/**
 * y at sample `index` for solver vector u: the layout's levels and amplitudes solved for the rates and t0
 * that u stands for. The solver asks for whole vectors (evaluateAll) or point by point, and comes back to
 * the same values (a new array each time), so the solves of the last few vectors are kept by value and each
 * vector costs one pass over the data.
 */
export function projectedModel(set: FitSet, layout: ParameterLayout, physical: PhysicalRates, workspace: Workspace): ProjectedModel {
  const cache: { key: number[]; model: Float64Array; solution: LinearSolution }[] = [];
  const solved = (u: readonly number[]) => {
    const at = cache.findIndex((entry) => sameValues(entry.key, u));
    if (at >= 0) {
      const hit = cache[at];
      if (at > 0) cache.copyWithin(1, 0, at)[0] = hit;
      return hit;
    }
    const { alpha, omega0, t0 } = physical(u);
    const solution = solveAmplitudes(layout, set.time, set.values, alpha, omega0, t0, workspace, set.block);
    const entry = cache.length < MODEL_CACHE_SIZE ? { key: [], model: new Float64Array(set.time.length), solution } : (cache.pop() as (typeof cache)[0]);
    entry.key = [...u];
    entry.solution = solution;
    entry.model.set(workspace.model);
    cache.unshift(entry);
    return entry;
  };
  return { ...indexedModel((u) => solved(u).model), solutionAt: (u) => solved(u).solution };
}

/** Whether two parameter vectors hold the same values (Object.is: a cache must tell -0 from 0 and find NaN). */
export function sameValues(a: readonly number[], b: readonly number[]): boolean {
  if (a.length !== b.length) return false;
  for (let j = 0; j < a.length; j++) if (!Object.is(a[j], b[j])) return false;
  return true;
}

/** A model known as whole vectors over the sample indices, as the solver's point and vector evaluations. */
export function indexedModel(modelFor: (u: readonly number[]) => Float64Array): Pick<CurveModel, 'evaluate' | 'evaluateAll'> {
  return {
    evaluate: (u, index) => modelFor(u)[index],
    evaluateAll: (u, indices, out) => {
      const model = modelFor(u);
      for (let i = 0; i < indices.length; i++) out[i] = model[indices[i]];
    },
  };
}

/**
 * The solver stalls when no step lowers chi^2 although its finite-difference gradient is not quite
 * zero. Here the model's derivatives include the linear solve, whose rounding makes that gradient
 * noisy at the minimum, so a stall after a successful descent is a minimum to the model's precision.
 */
export function stallAsConvergence(status: FitStatus, message: string): { status: FitStatus; message: string } {
  return status === 'failed' && message.startsWith('stalled')
    ? { status: 'converged', message: 'no step lowers chi^2 further (minimum to the precision of the model derivatives)' }
    : { status, message };
}
