// Widens a response fit's covariance along zeta's profile, so that each crossing of the profile lies within its level in standard errors.

import { boundedSvd } from './boundedSvd';
import { LAYOUTS, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import { zetaProfile } from './zetaProfile';

/** The profile is walked unless zeta lies this many local standard errors below 1 (a clear ring is a parabola)... */
const CLEAR_RING_SIGMAS = 3;
/**
 * ...or unless zeta's relative standard error is above this: a ring's damping is then read from few decay
 * times, and the residual rises more slowly towards faster decay than towards slower (the bound on alpha grows
 * about as alpha^1.5 in a record of fixed length), so the local curvature states errors too small on one side
 * (95 % intervals holding alpha 91.5 % of the time at 20 dB, zeta 0.7, where zeta is known to about 5 %).
 */
const NONLINEAR_RING_SHARE = 0.02;
/** Singular values of the equilibrated covariance below this share of the largest are taken as zero. */
const RANK_CUTOFF = 1e-12;
/** The level of the interval handed on for the regime: the regime's own rule (regime.ts) claims one 2 standard errors clear of 1. */
const REGIME_SIGMAS = 2;
/** A widening of zeta's standard error beyond this factor is worth a warning. */
const WARN_WIDENING = 1.5;

/**
 * Near critical damping and beyond it, the residual along zeta is lopsided: towards high zeta the fast
 * root leaves the record and the residual flattens out to that of a single decay, so the local curvature
 * states errors far too small there (a fit at zeta 1.65 +- 0.10 whose truth, 2.0, lay 4.6 residual
 * variances up the profile). The profile is walked (zetaProfile.ts) and, for each crossing v of the level
 * of k standard errors, the covariance C is widened along v just enough that v^T C^-1 v = k^2: C + beta v v^T
 * with beta = 1/k^2 - 1/m, m = v^T C^-1 v (Sherman-Morrison). Then every quantity (alpha, omega0, zeta, the
 * levels, t0) is stated at least as uncertain as the profile shows. Returns null where the profile is not
 * walked; a null covariance when the profile stays open towards a single decay (no finite error exists).
 */
export function widenAlongZetaProfile(
  set: FitSet,
  layout: ParameterLayout,
  values: readonly number[],
  t0Fixed: number,
  variance: number,
  covariance: number[][],
): { covariance: number[][] | null; zetaInterval: { low: number; high: number }; warnings: string[] } | null {
  const { index } = LAYOUTS[layout];
  if (index.alpha === undefined || index.omega0 === undefined) return null;
  const zeta = values[index.alpha] / values[index.omega0];
  const localSe = zetaStderr(values, covariance, index.alpha, index.omega0);
  if (!(zeta > 0 && Number.isFinite(zeta) && localSe >= 0)) return null;
  const clearRing = zeta + CLEAR_RING_SIGMAS * localSe < 1;
  if (clearRing && localSe < NONLINEAR_RING_SHARE * zeta) return null;
  const profile = zetaProfile(set, layout, values, t0Fixed, variance);
  const twoSigma = profile.interval.find((i) => i.sigmas === REGIME_SIGMAS) ?? profile.interval[0];
  if (profile.unbounded) {
    return {
      covariance: null,
      zetaInterval: { low: twoSigma.low, high: twoSigma.high },
      warnings: [
        `the fast root is not resolved: every zeta above ${twoSigma.low.toPrecision(3)}, up to a single decay, fits the record within 2 standard errors; alpha, omega0 and zeta have no finite uncertainty (the slow decay is what the record measures)`,
      ],
    };
  }
  let widened = covariance.map((row) => [...row]);
  // A clear ring's profile bends gently: it is matched at the 95 % level that intervals and verdicts use, where
  // matching the 3-sigma crossings too would state its errors about 15 % wide.
  const crossings = clearRing ? profile.crossings.filter((c) => c.sigmas === REGIME_SIGMAS) : profile.crossings;
  for (const { sigmas, values: at } of crossings) {
    widened = widenAlong(
      widened,
      at.map((v, j) => v - values[j]),
      sigmas,
    );
  }
  const warnings: string[] = [];
  const widenedSe = zetaStderr(values, widened, index.alpha, index.omega0);
  if (widenedSe > WARN_WIDENING * localSe) {
    const why = zeta < 1 ? 'the damping is read from few decay times' : 'the fast root is barely resolved';
    warnings.push(
      `the residual along zeta is far from a parabola (${why}): the uncertainties of alpha, omega0 and zeta were widened to the profile's reach, zeta ${twoSigma.low.toPrecision(3)} to ${twoSigma.high.toPrecision(3)} at 2 standard errors`,
    );
  }
  return { covariance: widened, zetaInterval: { low: twoSigma.low, high: twoSigma.high }, warnings };
}

/** Standard error of zeta = alpha / omega0 to first order. */
function zetaStderr(values: readonly number[], c: number[][], ia: number, iw: number): number {
  const [alpha, omega0] = [values[ia], values[iw]];
  const [ga, gw] = [1 / omega0, -alpha / (omega0 * omega0)];
  return Math.sqrt(ga * ga * c[ia][ia] + 2 * ga * gw * c[ia][iw] + gw * gw * c[iw][iw]);
}

/** C + beta v v^T with beta such that v lies `sigmas` standard errors out (unchanged when it already lies within). */
function widenAlong(c: number[][], v: number[], sigmas: number): number[][] {
  const scale = c.map((row, j) => Math.sqrt(row[j]));
  if (!scale.every((s) => s > 0 && Number.isFinite(s))) return c;
  const equilibrated = c.map((row, a) => row.map((x, b) => x / (scale[a] * scale[b])));
  const u = v.map((x, j) => x / scale[j]);
  const svd = boundedSvd(equilibrated);
  if (!svd || !svd.converged) return c;
  // m = u^T pinv(C~) u over the singular directions kept.
  let m = 0;
  svd.values.forEach((s, k) => {
    if (s <= RANK_CUTOFF * svd.values[0]) return;
    const projection = u.reduce((sum, x, j) => sum + x * svd.V[j][k], 0);
    m += (projection * projection) / s;
  });
  if (!(m > sigmas * sigmas)) return c;
  const beta = 1 / (sigmas * sigmas) - 1 / m;
  return c.map((row, a) => row.map((x, b) => x + beta * v[a] * v[b]));
}
