// Refines one model with several modes from one start: Levenberg-Marquardt over the rates (and t0), the rest solved linearly.

import { fitCurve } from './fitCurve';
import { indexedModel, sameValues, stallAsConvergence } from './projectedModel';
import { ModesWorkspace, solveModes, type ModeLinear, type ModeRates, type ModeSpec, type ModesSolution } from './modesModel';
import type { FitSet } from './fitSet';
import { gridNyquist } from './modesStarts';
import type { FitStatus } from './types';
import { indexRamp } from './indexVectors';

/** A start that has not converged by then is crawling along a degenerate valley (as in refine.ts). */
const MAX_ITERATIONS = 80;
/** Lower bound of each scaled rate (units of its own start): keeps every rate positive. */
const MIN_SCALED_RATE = 1e-9;
/** A ring's start may hold a vanishing alpha; the solver needs it inside its bounds. */
const MIN_SCALED_START_ALPHA = 1e-4;
/** How many recent parameter vectors' models are kept (the solver revisits the last few, as in projectedModel.ts). */
const MODEL_CACHE_SIZE = 4;

/** One refined model: its rates, linear parameters, residual and how the solver ended. */
export interface ModesFit {
  spec: ModeSpec;
  rates: ModeRates;
  linear: ModeLinear;
  sse: number;
  status: FitStatus;
  message: string;
  iterations: number;
}

/**
 * Levenberg-Marquardt over each ring's alpha and omega0 (scaled by its own starting omega0), the slow rate
 * (by its start) and t0 where fitted (1 + (t0 - t0 start) omega0 of the first ring); for each trial the
 * levels and amplitudes follow by linear least squares (variable projection, Golub and Pereyra 1973).
 * omega0 is held below twice the Nyquist rate of the values fitted (or twice its start): above it a ring aliases onto a slower one.
 * t0 is refitted where the one-ring layout fits it (a response continuous at the event: t0 trades against every
 * ring's phase, so holding it at the one-ring value would leave its uncertainty out of every mode's), and held
 * where the one-ring layout holds it (a jump, or no samples before the event), as that fit does.
 */
export function refineModes(set: FitSet, spec: ModeSpec, start: ModeRates): ModesFit {
  const scales = [...start.rings.map((ring) => ring.omega0), ...(spec.slow ? [start.slowRate] : [])];
  const reference = start.rings[0].omega0;
  const nyquist = gridNyquist(set);
  const physical = (u: readonly number[]): ModeRates => ({
    rings: start.rings.map((_, k) => ({ alpha: u[2 * k] * scales[k], omega0: u[2 * k + 1] * scales[k] })),
    slowRate: spec.slow ? u[2 * spec.rings] * scales[spec.rings] : 0,
    t0: spec.fitsT0 ? start.t0 + (u[u.length - 1] - 1) / reference : start.t0,
  });
  const initial = [
    ...start.rings.flatMap((ring) => [Math.max(ring.alpha / ring.omega0, MIN_SCALED_START_ALPHA), 1]),
    ...(spec.slow ? [1] : []),
    ...(spec.fitsT0 ? [1] : []),
  ];
  const min = initial.map((_, j) => (spec.fitsT0 && j === initial.length - 1 ? -Infinity : MIN_SCALED_RATE));
  // A start already above that (a one-ring fit of a near-instant step) keeps room to move.
  const max = initial.map((_, j) => (j < 2 * spec.rings && j % 2 === 1 ? Math.max(2 * nyquist / scales[Math.floor(j / 2)], 2) : Infinity));
  const names = initial.map((_, j) => `u${j}`);
  const workspace = new ModesWorkspace(set.time.length);
  // Keyed by value: the solver asks again for points it holds in new arrays (its accepted step, the final point).
  const cache: { key: number[]; solution: ModesSolution }[] = [];
  const solutionAt = (u: readonly number[]): ModesSolution => {
    const hit = cache.find((entry) => sameValues(entry.key, u));
    if (hit) return hit.solution;
    const solution = solveModes(set, spec, physical(u), workspace);
    if (cache.length >= MODEL_CACHE_SIZE) cache.pop();
    cache.unshift({ key: [...u], solution });
    return solution;
  };
  const indices = indexRamp(set.time.length);
  const weights = fittedWeights(set, spec, start.t0);
  const result = fitCurve({ names, ...indexedModel((u) => solutionAt(u).model) }, { x: indices, y: set.values, weights }, initial, {
    min,
    max,
    maxIterations: MAX_ITERATIONS,
    covariance: false,
    trialDifferences: 'forward',
  });
  const best = result.parameters.map((p) => p.value);
  const rates = physical(best);
  const solution = solutionAt(best);
  return {
    spec,
    rates,
    linear: solution.linear,
    sse: solution.sse,
    ...stallAsConvergence(result.status, result.message),
    iterations: result.iterations,
  };
}

/**
 * Weight 1 on every value the model is fitted to; without samples before t0, the values before the start
 * are left out (weight 0), as the linear solve leaves them out (t0 is then held, never fitted).
 */
function fittedWeights(set: FitSet, spec: ModeSpec, t0: number): Float64Array | undefined {
  if (spec.start !== 'no-pre-event') return undefined;
  const reach = set.block ? ((set.block.samples - 1) / 2) * set.block.spacing : 0;
  return Float64Array.from(set.time, (t) => (t - reach >= t0 ? 1 : 0));
}
