// Refines one layout from one start: Levenberg-Marquardt over the nonlinear parameters, the linear ones solved exactly.

import { fitCurve } from './fitCurve';
import { Workspace } from './amplitudes';
import { projectedModel, stallAsConvergence } from './projectedModel';
import { LAYOUTS, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { RateCandidate } from './startingRates';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { indexRamp } from './indexVectors';

/** A start that has not converged by then is crawling along a degenerate valley; a better start exists. */
const MAX_ITERATIONS = 60;
/** Lower bound of the scaled alpha and omega0 (units of the starting omega0): keeps both positive. */
const MIN_SCALED_RATE = 1e-9;
/** A start can hold a vanishing alpha (an almost undamped ring); the solver needs it inside its bounds. */
const MIN_SCALED_START_ALPHA = 1e-6;
/**
 * Lower bound of the scaled product of the time constants, (omega0 start / omega0)^2: omega0 at most 1000
 * times its start. Towards it the fast root runs off to infinity (the single-decay limit); the bound keeps
 * the split of the two roots in the response's basis (alpha - sqrt(alpha^2 - omega0^2)) well above rounding.
 */
const MIN_SCALED_PRODUCT = 1e-6;
/**
 * A refinement whose rates and event time come within this share of a converged attempt's (alpha and omega0
 * relative to themselves, t0 times omega0) is in that minimum's bowl, where the residual is quadratic: it would
 * only find the same minimum again, to within the solver's tolerance.
 */
const JOIN_SHARE = 1e-3;

export interface RefineOptions {
  /** Hold zeta = alpha / omega0 at this value and fit the rest (a point of zeta's profile). */
  fixedZeta?: number;
  /**
   * Attempts of this layout found from other starts (held at the same t0 where t0 is not fitted): a refinement
   * that comes within JOIN_SHARE of a converged one stops and returns that attempt itself.
   */
  known?: readonly Attempt[];
}

/** The solver's variables for the rates and how they map back to alpha and omega0. */
interface RateCoordinates {
  names: string[];
  start: number[];
  min: number[];
  toRates(u: readonly number[]): { alpha: number; omega0: number };
}

/**
 * Rates scaled by the starting omega0 for a ring. For an overdamped start, the sum and the product of the
 * two time constants, 2 alpha / omega0^2 and 1 / omega0^2 (scaled): the valley towards a single decay, where
 * alpha and omega0 both run off to infinity, is a straight line to a finite point in them, so the solver
 * walks it instead of crawling. With zeta held, omega0 alone.
 */
function rateCoordinates(start: RateCandidate, options: RefineOptions): RateCoordinates {
  const rate = start.omega0;
  const { fixedZeta } = options;
  if (fixedZeta !== undefined) {
    return { names: ['omega0'], start: [1], min: [MIN_SCALED_RATE], toRates: ([w]) => ({ alpha: fixedZeta * w * rate, omega0: w * rate }) };
  }
  const zeta = start.alpha / start.omega0;
  if (zeta > 1) {
    return {
      names: ['timeSum', 'timeProduct'],
      start: [2 * zeta, 1],
      min: [MIN_SCALED_RATE, MIN_SCALED_PRODUCT],
      toRates: ([sum, product]) => ({ alpha: (sum * rate) / (2 * product), omega0: rate / Math.sqrt(product) }),
    };
  }
  return {
    names: ['alpha', 'omega0'],
    start: [Math.max(zeta, MIN_SCALED_START_ALPHA), 1],
    min: [MIN_SCALED_RATE, MIN_SCALED_RATE],
    toRates: ([alpha, omega0]) => ({ alpha: alpha * rate, omega0: omega0 * rate }),
  };
}

/**
 * Levenberg-Marquardt over the nonlinear parameters only (the rates and t0 where fitted), scaled to
 * order one; for each trial the levels and amplitudes follow by linear least squares (variable
 * projection, Golub and Pereyra 1973), so the solver never wanders in the linear directions.
 * The solver sees sample indices as its x, so each parameter vector costs one pass over the data.
 */
export function refine(set: FitSet, layout: ParameterLayout, start: RateCandidate, t0Start: number, options: RefineOptions = {}): Attempt {
  const fitsT0 = LAYOUTS[layout].fitsT0;
  const rate = start.omega0;
  const rates = rateCoordinates(start, options);
  const k = rates.names.length;
  // t0 enters as 1 + (t0 - t0Start) omega0, so that every solver variable starts near 1.
  const physical = (u: readonly number[]) => ({ ...rates.toRates(u.slice(0, k)), t0: fitsT0 ? t0Start + (u[k] - 1) / rate : t0Start });
  const workspace = new Workspace(set.time.length);
  const projected = projectedModel(set, layout, physical, workspace);
  const model = { names: fitsT0 ? [...rates.names, 't0'] : rates.names, evaluate: projected.evaluate, evaluateAll: projected.evaluateAll };
  const indices = indexRamp(set.time.length);
  const min = fitsT0 ? [...rates.min, -Infinity] : rates.min;
  const initial = fitsT0 ? [...rates.start, 1] : rates.start;
  const others = (options.known ?? []).filter((a) => a.layout === layout);
  const known = others.filter((a) => a.status === 'converged');
  const bestKnown = others.reduce((x, a) => Math.min(x, a.sse), Infinity);
  const path: number[] = [];
  let joined: Attempt | null = null;
  let outpaced = false;
  const stopAt = (u: readonly number[], chiSquare: number) => {
    joined = known.find((a) => withinBowl(a, physical(u), t0Start)) ?? null;
    path.push(chiSquare);
    outpaced = joined === null && cannotWin(path, bestKnown);
    return joined !== null || outpaced;
  };
  const result = fitCurve(model, { x: indices, y: set.values }, initial, {
    min,
    maxIterations: MAX_ITERATIONS,
    covariance: false,
    trialDifferences: 'forward',
    stopAt: others.length > 0 ? stopAt : undefined,
  });
  if (joined) return joined;
  const fitted = result.parameters.map((p) => p.value);
  const { alpha, omega0, t0 } = physical(fitted);
  const linear = projected.solutionAt(fitted);
  const named: Record<string, number> = { alpha, omega0, t0 };
  return {
    layout,
    values: [...LAYOUTS[layout].nonlinear.map((name) => named[name]), ...linear.coefficients],
    sse: Number.isFinite(linear.sse) ? linear.sse : Infinity,
    ...(outpaced
      ? { status: 'max-iterations' as const, message: 'abandoned: at its pace it could not get below the residual of another start' }
      : stallAsConvergence(result.status, result.message)),
    iterations: result.iterations,
    warnings: [
      ...result.warnings.filter((w) => !/covariance|^time(Sum|Product) /i.test(w)),
      ...(rates.names.includes('timeProduct') && result.parameters[1].atBound
        ? ['the fast root ran to the solver\'s limit (omega0 1000 times its start): a single decay fits the record about as well']
        : []),
    ],
  };
}

/** Accepted steps a refinement takes before its progress is judged, and how many back its pace is measured over. */
const PACE = { after: 10, over: 5 };

/**
 * Whether a refinement crawling at its recent pace could not get below another start's residual in the steps
 * its iteration limit leaves: chi^2 less the last PACE.over steps' mean drop times the steps left (a crawl along
 * a degenerate valley only slows) stays above the best known residual.
 */
function cannotWin(path: readonly number[], best: number): boolean {
  const steps = path.length;
  if (steps < PACE.after || !Number.isFinite(best)) return false;
  const chi = path[steps - 1];
  const pace = (path[steps - 1 - PACE.over] - chi) / PACE.over;
  return chi - pace * (MAX_ITERATIONS - steps) > best;
}

/** Whether rates and an event time lie within JOIN_SHARE of an attempt's (see that constant). */
function withinBowl(attempt: Attempt, at: { alpha: number; omega0: number; t0: number }, heldT0: number): boolean {
  const alpha = attemptValue(attempt, 'alpha');
  const omega0 = attemptValue(attempt, 'omega0');
  return (
    Math.abs(at.alpha - alpha) <= JOIN_SHARE * alpha &&
    Math.abs(at.omega0 - omega0) <= JOIN_SHARE * omega0 &&
    Math.abs(at.t0 - attemptT0(attempt, heldT0)) * omega0 <= JOIN_SHARE
  );
}
