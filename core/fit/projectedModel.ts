// The model the solver sees under variable projection: a sample index in, the linear solve's value there out.

import { solveAmplitudes, type Workspace } from './amplitudes';
import type { ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { CurveModel, FitStatus } from './types';

/** How many recent parameter vectors' models are kept (the solver revisits the last few). */
const MODEL_CACHE_SIZE = 4;

/** The nonlinear parameters a solver vector stands for. */
export type PhysicalRates = (u: readonly number[]) => { alpha: number; omega0: number; t0: number };

/**
 * y at sample `index` for solver vector u: the layout's levels and amplitudes solved for the rates and t0
 * that u stands for. The solver asks for whole vectors (evaluateAll) or point by point, alternating between
 * vectors for central differences, so the models of the last few vectors are kept and each vector costs one
 * pass over the data.
 */
export function projectedModel(set: FitSet, layout: ParameterLayout, physical: PhysicalRates, workspace: Workspace): Pick<CurveModel, 'evaluate' | 'evaluateAll'> {
  const cache: { key: readonly number[]; model: Float64Array }[] = [];
  const modelFor = (u: readonly number[]): Float64Array => {
    const hit = cache.find((entry) => entry.key === u);
    if (hit) return hit.model;
    const { alpha, omega0, t0 } = physical(u);
    solveAmplitudes(layout, set.time, set.values, alpha, omega0, t0, workspace, set.block);
    const entry = cache.length < MODEL_CACHE_SIZE ? { key: u, model: new Float64Array(set.time.length) } : (cache.pop() as (typeof cache)[0]);
    entry.key = u;
    entry.model.set(workspace.model);
    cache.unshift(entry);
    return entry.model;
  };
  return indexedModel(modelFor);
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
