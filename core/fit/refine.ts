// Refines one layout from one start: Levenberg-Marquardt over the nonlinear parameters, the linear ones solved exactly.

import type { FitStatus } from './types';
import { fitCurve } from './fitCurve';
import { solveAmplitudes, Workspace } from './amplitudes';
import { LAYOUTS, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { RateCandidate } from './startingRates';
import type { Attempt } from './attempt';

/** A start that has not converged by then is crawling along a degenerate valley; a better start exists. */
const MAX_ITERATIONS = 60;
/** Lower bound of the scaled alpha and omega0 (units of the starting omega0): keeps both positive. */
const MIN_SCALED_RATE = 1e-9;
/** A start can hold a vanishing alpha (an almost undamped ring); the solver needs it inside its bounds. */
const MIN_SCALED_START_ALPHA = 1e-6;
/** How many recent parameter vectors' models are kept (the solver revisits the last few). */
const MODEL_CACHE_SIZE = 4;

/**
 * Levenberg-Marquardt over the nonlinear parameters only (alpha, omega0 and t0 where fitted), scaled
 * to order one; for each trial the levels and amplitudes follow by linear least squares (variable
 * projection, Golub and Pereyra 1973), so the solver never wanders in the linear directions.
 * The solver sees sample indices as its x, so each parameter vector costs one pass over the data.
 */
export function refine(set: FitSet, layout: ParameterLayout, start: RateCandidate, t0Start: number): Attempt {
  const { nonlinear } = LAYOUTS[layout];
  const rate = start.omega0;
  // Rates are scaled by the starting omega0, and t0 enters as 1 + (t0 - t0Start) omega0, so that every
  // solver variable starts near 1.
  const toPhysical = (u: readonly number[]) => nonlinear.map((name, j) => (name === 't0' ? t0Start + (u[j] - 1) / rate : u[j] * rate));
  const physical = (u: readonly number[]) => {
    const values = toPhysical(u);
    const at = (name: string) => values[nonlinear.indexOf(name)];
    return { values, alpha: at('alpha'), omega0: at('omega0'), t0: nonlinear.includes('t0') ? at('t0') : t0Start };
  };
  const workspace = new Workspace(set.time.length);
  // The solver asks point by point, alternating between two vectors for central differences,
  // so the model is kept for the last few parameter vectors it was asked about.
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
  const model = {
    names: [...nonlinear],
    evaluate: (u: readonly number[], index: number) => modelFor(u)[index],
  };
  const indices = Float64Array.from(set.time, (_, i) => i);
  const min = nonlinear.map((name) => (name === 't0' ? -Infinity : MIN_SCALED_RATE));
  const scaledStart: Record<string, number> = { alpha: Math.max(start.alpha / rate, MIN_SCALED_START_ALPHA), omega0: start.omega0 / rate, t0: 1 };
  const initial = nonlinear.map((name) => scaledStart[name]);
  const result = fitCurve(model, { x: indices, y: set.values }, initial, { min, maxIterations: MAX_ITERATIONS });
  const { values, alpha, omega0, t0 } = physical(result.parameters.map((p) => p.value));
  const linear = solveAmplitudes(layout, set.time, set.values, alpha, omega0, t0, workspace, set.block);
  return {
    layout,
    values: [...values, ...linear.coefficients],
    sse: Number.isFinite(linear.sse) ? linear.sse : Infinity,
    ...stallAsConvergence(result.status, result.message),
    iterations: result.iterations,
    warnings: result.warnings.filter((w) => !/covariance/i.test(w)),
  };
}

/**
 * The solver stalls when no step lowers chi^2 although its finite-difference gradient is not quite
 * zero. Here the model's derivatives include the linear solve, whose rounding makes that gradient
 * noisy at the minimum, so a stall after a successful descent is a minimum to the model's precision.
 */
function stallAsConvergence(status: FitStatus, message: string): { status: FitStatus; message: string } {
  return status === 'failed' && message.startsWith('stalled')
    ? { status: 'converged', message: 'no step lowers chi^2 further (minimum to the precision of the model derivatives)' }
    : { status, message };
}
