// Orders the starting rates of a layout by the residual each leaves once the linear part is solved exactly.

import { solveAmplitudes, Workspace } from './amplitudes';
import type { ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import type { RateCandidate } from './startingRates';

/** Samples the ranking looks at, at most: a cheap solve per candidate is enough to order them. */
const RANKING_SAMPLES = 4000;
/** Damping ratios (alpha / omega0) near critical, where the pencil may put the poles on the wrong side. */
const NEAR_CRITICAL = { from: 0.4, to: 2.5 };
/** Damping ratios a start near critical damping is also tried at: one in each regime and the boundary. */
const REGIME_STARTS = [0.8, 1, 1.25];
/** Candidates closer than this share of omega0 in both alpha and omega0 count as one. */
const DISTINCT_SHARE = 0.02;

/** The candidate rates, best first, with near duplicates dropped. */
export function rankCandidates(set: FitSet, layout: ParameterLayout, candidates: RateCandidate[], t0: number): RateCandidate[] {
  const stride = Math.max(1, Math.floor(set.time.length / RANKING_SAMPLES));
  const time = set.time.filter((_, i) => i % stride === 0);
  const values = set.values.filter((_, i) => i % stride === 0);
  const workspace = new Workspace(time.length);
  const expanded: RateCandidate[] = [];
  for (const c of candidates) {
    expanded.push(c);
    const zeta = c.alpha / c.omega0;
    if (zeta > NEAR_CRITICAL.from && zeta < NEAR_CRITICAL.to) {
      for (const z of REGIME_STARTS) expanded.push({ alpha: z * c.omega0, omega0: c.omega0, source: `${c.source}, zeta ${z}` });
    }
  }
  const scored = expanded
    .map((c) => ({ c, sse: solveAmplitudes(layout, time, values, c.alpha, c.omega0, t0, workspace, set.block).sse }))
    .filter((s) => Number.isFinite(s.sse))
    .sort((x, y) => x.sse - y.sse);
  const distinct: RateCandidate[] = [];
  for (const { c } of scored) {
    const near = distinct.some(
      (d) => Math.abs(d.alpha - c.alpha) < DISTINCT_SHARE * d.omega0 && Math.abs(d.omega0 - c.omega0) < DISTINCT_SHARE * d.omega0,
    );
    if (!near) distinct.push(c);
  }
  return distinct;
}
