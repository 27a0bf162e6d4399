// Fits a first-order layout: Levenberg-Marquardt over the decay rate (and t0 where fitted), the levels solved linearly.

import { fitCurve } from './fitCurve';
import { solveAmplitudes, Workspace } from './amplitudes';
import { LAYOUTS, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { Attempt } from './attempt';

/** One nonlinear parameter and t0 converge in a few dozen steps from a start within a factor of 2. */
const MAX_ITERATIONS = 100;
/** Starting rates step by this factor, from 1 / (4 spans) of the record... */
const RATE_STEP = 2;
const SLOWEST_START_SPANS = 4;
/** ...up to one time constant per this many sample intervals (a faster decay is a jump, not a response). */
const FASTEST_START_SAMPLES = 2;
/** Starts refined, best ranked first: the residual over the rate has one valley, so two are enough. */
const STARTS_REFINED = 2;
/** Lower bound of the scaled rate: keeps it positive. */
const MIN_SCALED_RATE = 1e-9;
/** How many recent parameter vectors' models are kept (the solver revisits the last few). */
const MODEL_CACHE_SIZE = 4;

/**
 * The best first-order attempt of a layout, or null when none reaches a finite residual. Starting rates
 * on a geometric ladder over the record's span are ranked by the residual after the linear solve, and
 * the best are refined (variable projection over the rate and t0, as refine.ts does for a ring).
 */
export function fitFirstOrder(set: FitSet, layout: ParameterLayout, t0Start: number): Attempt | null {
  const span = set.window.end - Math.min(t0Start, set.window.start);
  const dt = set.block?.spacing ?? set.dt;
  if (!(span > 0) || !(dt > 0)) return null;
  const workspace = new Workspace(set.time.length);
  const starts: { rate: number; sse: number }[] = [];
  for (let rate = 1 / (SLOWEST_START_SPANS * span); rate <= 1 / (FASTEST_START_SAMPLES * dt); rate *= RATE_STEP) {
    const { sse } = solveAmplitudes(layout, set.time, set.values, rate, rate, t0Start, workspace, set.block);
    if (Number.isFinite(sse)) starts.push({ rate, sse });
  }
  starts.sort((x, y) => x.sse - y.sse);
  let best: Attempt | null = null;
  for (const { rate } of starts.slice(0, STARTS_REFINED)) {
    const attempt = refineFirstOrder(set, layout, rate, t0Start, workspace);
    if (!best || attempt.sse < best.sse) best = attempt;
  }
  return best;
}

/** Levenberg-Marquardt over alpha (and t0), scaled to order one by the starting rate; the levels by linear least squares. */
function refineFirstOrder(set: FitSet, layout: ParameterLayout, rate: number, t0Start: number, workspace: Workspace): Attempt {
  const { nonlinear } = LAYOUTS[layout];
  const toPhysical = (u: readonly number[]) => nonlinear.map((name, j) => (name === 't0' ? t0Start + (u[j] - 1) / rate : u[j] * rate));
  const physical = (u: readonly number[]) => {
    const values = toPhysical(u);
    return { values, alpha: values[0], t0: nonlinear.includes('t0') ? values[nonlinear.indexOf('t0')] : t0Start };
  };
  // The solver asks point by point, alternating between vectors for central differences: the models
  // of the last few vectors are kept.
  const cache: { key: readonly number[]; model: Float64Array }[] = [];
  const modelFor = (u: readonly number[]): Float64Array => {
    const hit = cache.find((entry) => entry.key === u);
    if (hit) return hit.model;
    const { alpha, t0 } = physical(u);
    solveAmplitudes(layout, set.time, set.values, alpha, alpha, t0, workspace, set.block);
    const entry = cache.length < MODEL_CACHE_SIZE ? { key: u, model: new Float64Array(set.time.length) } : (cache.pop() as (typeof cache)[0]);
    entry.key = u;
    entry.model.set(workspace.model);
    cache.unshift(entry);
    return entry.model;
  };
  const curve = { names: [...nonlinear], evaluate: (u: readonly number[], index: number) => modelFor(u)[index] };
  const indices = Float64Array.from(set.time, (_, i) => i);
  const min = nonlinear.map((name) => (name === 't0' ? -Infinity : MIN_SCALED_RATE));
  const result = fitCurve(curve, { x: indices, y: set.values }, nonlinear.map(() => 1), { min, maxIterations: MAX_ITERATIONS });
  const { values, alpha, t0 } = physical(result.parameters.map((p) => p.value));
  const linear = solveAmplitudes(layout, set.time, set.values, alpha, alpha, t0, workspace, set.block);
  const stalled = result.status === 'failed' && result.message.startsWith('stalled');
  return {
    layout,
    values: [...values, ...linear.coefficients],
    sse: Number.isFinite(linear.sse) ? linear.sse : Infinity,
    status: stalled ? 'converged' : result.status,
    message: stalled ? 'no step lowers chi^2 further (minimum to the precision of the model derivatives)' : result.message,
    iterations: result.iterations,
    warnings: result.warnings.filter((w) => !/covariance/i.test(w)),
  };
}
