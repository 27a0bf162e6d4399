// Fits a first-order layout: Levenberg-Marquardt over the decay rate (and t0 where fitted), the levels solved linearly.

import { fitCurve } from './fitCurve';
import { solveAmplitudes, Workspace } from './amplitudes';
import { projectedModel, stallAsConvergence } from './projectedModel';
import { firstOrderLayoutFor, LAYOUTS, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { beatsContinuous, scanEventTime, settleEventTime, showsJump } from './jumpStart';
import { indexRamp } from './indexVectors';
import { responseCovariance } from './responseCovariance';

/** A first-order attempt and the event time a layout that holds t0 is held at. */
export interface FirstOrderFit {
  attempt: Attempt;
  t0: number;
}

/**
 * The first-order fit that suits the record: from the first sample when no level precedes the event,
 * with a free start when a jump was found or stated; else continuous, unless the single decay itself
 * jumps (an RC circuit's charging current: a ring's continuous fit takes that jump for an unresolved
 * fast root, so the jump is looked for here too). A jump's event time is held between the samples
 * either side of it, found with the decay's own rate.
 */
export function fitFirstOrderRecord(
  set: FitSet,
  record: { hasPreEvent: boolean; jumpStart: boolean },
  t0Start: number,
  noise: number,
  ringDecayRate: number,
): FirstOrderFit | null {
  if (!record.hasPreEvent) {
    const fromStart = fitFirstOrder(set, firstOrderLayoutFor({ hasPreEvent: false, continuity: 'continuous' }), t0Start);
    return fromStart && { attempt: fromStart, t0: t0Start };
  }
  // The decay's own fit at the given event time gives the rate the jump's place is looked for with.
  const first = fitFirstOrder(set, record.jumpStart ? 'first-order-jump' : 'first-order', t0Start);
  if (!first) return null;
  // A jump is where the event was detected; a continuous fit's t0 can wander off it. The scan runs at the held decay's
  // rate and at the ring's slowest: a decay held to the level before meets a strong jump with a rate so fast that no
  // jump fits at it, while a ring's fast root stands in for the jump and leaves its slow one the decay's.
  const from = record.jumpStart ? attemptT0(first, t0Start) : t0Start;
  const scan = [attemptValue(first, 'alpha'), ringDecayRate]
    .filter((rate) => rate > 0 && Number.isFinite(rate))
    .map((rate) => scanEventTime(set, 'first-order-jump', { alpha: rate, omega0: rate }, t0Start, from))
    .reduce((x, y) => (y.sse < x.sse ? y : x));
  if (!record.jumpStart && !beatsContinuous(first, scan.sse, first.values.length + 1, set, scan.t0)) return { attempt: first, t0: t0Start };
  const fitted = fitFirstOrder(set, 'first-order-jump', scan.t0);
  // The scan's rate is not the jumping decay's own: at its own rate the least residual can lie a sample or more off.
  const settled = fitted && settleEventTime(set, fitted, scan.t0, noise, (at) => fitFirstOrder(set, 'first-order-jump', at));
  if (!settled) return { attempt: first, t0: t0Start };
  const { attempt: jumping, t0 } = settled;
  if (record.jumpStart) return jumping.sse < first.sse ? { attempt: jumping, t0 } : { attempt: first, t0: t0Start };
  if (showsJump(first, settled, set, noise)) return { attempt: jumping, t0 };
  return { attempt: first, t0: t0Start };
}

/**
 * From a start within a factor of 1.4 (the ladder below), the rate and t0 converge in under ten steps; a
 * record a single decay does not describe crawls, and its fit is only there to lose the comparison.
 */
const MAX_ITERATIONS = 30;
/** Starting rates step by this factor, from 1 / (4 spans) of the record... */
const RATE_STEP = 2;
const SLOWEST_START_SPANS = 4;
/** ...up to one time constant per this many sample intervals (a faster decay is a jump, not a response). */
const FASTEST_START_SAMPLES = 2;
/** Starts refined, best ranked first: the residual over the rate has one valley. */
const STARTS_REFINED = 1;
/** Lower bound of the scaled rate: keeps it positive. */
const MIN_SCALED_RATE = 1e-9;

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
  const projected = projectedModel(set, layout, (u) => {
    const { alpha, t0 } = physical(u);
    return { alpha, omega0: alpha, t0 };
  }, workspace);
  const curve = { names: [...nonlinear], evaluate: projected.evaluate, evaluateAll: projected.evaluateAll };
  const indices = indexRamp(set.time.length);
  const min = nonlinear.map((name) => (name === 't0' ? -Infinity : MIN_SCALED_RATE));
  const result = fitCurve(curve, { x: indices, y: set.values }, nonlinear.map(() => 1), { min, maxIterations: MAX_ITERATIONS, covariance: false });
  const fitted = result.parameters.map((p) => p.value);
  const { values } = physical(fitted);
  const linear = projected.solutionAt(fitted);
  return {
    layout,
    values: [...values, ...linear.coefficients],
    sse: Number.isFinite(linear.sse) ? linear.sse : Infinity,
    ...stallAsConvergence(result.status, result.message),
    iterations: result.iterations,
    warnings: result.warnings.filter((w) => !/covariance/i.test(w)),
  };
}

/** The tail starts this many fitted time constants after the event: a second root 3 times faster is down to e^-3 of its share there. */
const TAIL_START_TAUS = 1;
/** Fewest values a tail fit runs on. */
const MIN_TAIL_VALUES = 20;

/** The time constant of a record's tail and its standard error (NaN where the tail fit has no covariance), s. */
export interface TailTimeConstant {
  tau: number;
  stderr: number;
}

/**
 * The time constant of the record's tail alone (from one fitted tau after the event): a sum of two decays
 * reads slower there than over the whole record, a single one the same to within the tail's noise.
 */
export function tailTimeConstant(set: FitSet, decay: Attempt, t0: number): TailTimeConstant | null {
  const tau = 1 / attemptValue(decay, 'alpha');
  const from = set.time.findIndex((t) => t >= attemptT0(decay, t0) + TAIL_START_TAUS * tau);
  if (from < 0 || set.time.length - from < MIN_TAIL_VALUES) return null;
  const time = set.time.subarray(from);
  const values = set.values.subarray(from);
  const tail: FitSet = { ...set, time, values, window: { start: time[0], end: set.window.end }, samplesUsed: time.length };
  const layout = 'first-order-free';
  const fit = fitFirstOrder(tail, layout, time[0]);
  if (!fit) return null;
  const alpha = attemptValue(fit, 'alpha');
  const { covariance } = responseCovariance(tail, layout, fit.values, time[0], fit.sse / Math.max(1, time.length - fit.values.length));
  const ia = LAYOUTS[layout].index.alpha;
  return { tau: 1 / alpha, stderr: covariance ? Math.sqrt(covariance[ia][ia]) / (alpha * alpha) : NaN };
}
