// Whether a response starts as an instant step would: a finite input edge or a front end's rise bends its first
// samples, and a start held to the level before then pulls alpha and omega0 off the ring's own.

import { chiSquareTail, pValueText } from '../chiSquare';
import { attemptValue, type Attempt } from './attempt';
import type { FitSet } from './fitSet';
import { correlationMatrix } from './covariance';
import { localCovariance } from './responseCovariance';

/**
 * The continuous start is rejected when the free start's alpha differs from it by more than chance at this level.
 * Under a true instant step both fits are consistent and the continuous one is the more precise, so the difference
 * of the two estimates has variance V_free - V_continuous (the Hausman specification test: J. A. Hausman,
 * Econometrica 46 (1978) 1251-1271, from memory), here on alpha alone, two-sided. Where a true step trips it (1
 * record in 1000), the free start is taken: consistent, a little wider. At 0.01 it caught more edges, but took the
 * free start on 1 % of ideal steps, picked when its alpha strays, which lowered their coverage by up to 1.5 points.
 */
const CONTINUOUS_START_P = 1e-3;
/**
 * The difference's variance is taken as at least this share of the free start's own: where the two fits are about
 * as precise, V_free - V_continuous is the small difference of two estimates and would make a chance difference look
 * significant (on the 120-file corpus batch, two ideal steps read 3.1 and 4.5 "standard errors" apart without it).
 */
const DIFFERENCE_FLOOR = 0.25;

/**
 * Below this p (and above CONTINUOUS_START_P) the held start is kept, but the two starts differ more than chance
 * usually allows: alpha's uncertainty then takes in their difference (startAllowance), rather than the answer
 * switching (which, picked when the free start strays, lowered coverage; see CONTINUOUS_START_P). A step through an
 * edge of a twentieth of the ring period read alpha 3.7 and 4.1 standard errors off at p = 0.002 and 0.018.
 */
const SUGGESTIVE_P = 0.05;

/** The held start's alpha against the free start's: their difference, in the test's standard errors, and its p. */
export interface StartComparison {
  /** alpha held - alpha free. */
  difference: number;
  z: number;
  p: number;
}

/**
 * The held start's alpha against the free start's, or null when a covariance could not be estimated. Both
 * variances are taken with the free fit's residual variance, the one that stays right when the held start is
 * wrong. Only alpha is compared: a finite edge moves the ring's start amplitude, which the held start ties to the
 * step and the decay then makes up for, and the free start holds t0, so its omega0 (which a fitted t0 would widen)
 * can come out the narrower of the two.
 */
export function compareStarts(set: FitSet, continuous: Attempt, continuousT0: number, free: Attempt, freeT0: number): StartComparison | null {
  const n = set.time.length;
  const dof = n - free.values.length;
  if (!(dof > 0) || !Number.isFinite(free.sse)) return null;
  const variance = free.sse / dof;
  const freeVariance = alphaVariance(localCovariance(set, free.layout, free.values, freeT0, variance));
  const continuousVariance = alphaVariance(localCovariance(set, continuous.layout, continuous.values, continuousT0, variance));
  if (freeVariance === null || continuousVariance === null) return null;
  const difference = attemptValue(continuous, 'alpha') - attemptValue(free, 'alpha');
  const z = difference / Math.sqrt(Math.max(freeVariance - continuousVariance, DIFFERENCE_FLOOR * freeVariance));
  return { difference, z, p: chiSquareTail(z * z, 1) };
}

/** The warning that replaces the held start with the free one when the two differ beyond CONTINUOUS_START_P, or null. */
export function continuousStartRejected(comparison: StartComparison | null): string | null {
  if (!comparison || !(comparison.p < CONTINUOUS_START_P)) return null;
  return (
    `the response does not start as an instant step would (a finite input edge or a front end's rise bends its first samples): ` +
    `held to the level before, alpha lay ${comparison.z.toFixed(1)} standard errors from the ring's own (${pValueText(comparison.p)}), ` +
    `so alpha and omega0 are fitted from a free initial value, t0 held at the event`
  );
}

/** Alpha's variance to add to the held start's, and the warning that says so, where the starts differ suggestively. */
export interface StartAllowance {
  alphaVariance: number;
  warning: string;
}

/** The allowance for a held start the free one differs from between CONTINUOUS_START_P and SUGGESTIVE_P, or null. */
export function startAllowance(comparison: StartComparison | null): StartAllowance | null {
  if (!comparison || !(comparison.p < SUGGESTIVE_P) || comparison.p < CONTINUOUS_START_P) return null;
  return {
    alphaVariance: comparison.difference * comparison.difference,
    warning:
      `the fit held to the level before and the one from a free initial value differ in alpha by ${Math.abs(comparison.z).toFixed(1)} ` +
      `standard errors (${pValueText(comparison.p)}; a finite input edge or a front end's rise can do this): alpha's uncertainty takes in the difference`,
  };
}

/**
 * The covariance with `alphaVariance` added to alpha's (its correlations with the rest recomputed), for the rates
 * derived from it to carry it; the covariance as it is where it holds no alpha.
 */
export function withAlphaAllowance<T extends { names: string[]; covariance: number[][] | null; correlation: number[][] | null }>(cov: T, alphaVariance: number): T {
  const i = cov.names.indexOf('alpha');
  const c = cov.covariance;
  if (!c || i < 0) return cov;
  const widened = c.map((row) => [...row]);
  widened[i][i] += alphaVariance;
  return { ...cov, covariance: widened, correlation: correlationMatrix(widened) };
}

/** Alpha's variance, or null when the covariance could not be estimated. */
function alphaVariance(cov: ReturnType<typeof localCovariance>): number | null {
  const i = cov.names.indexOf('alpha');
  const v = cov.covariance && i >= 0 ? cov.covariance[i][i] : NaN;
  return v > 0 && Number.isFinite(v) ? v : null;
}
