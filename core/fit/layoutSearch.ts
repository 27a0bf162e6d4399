// Multi-start search across the layouts that apply: the best refined attempt of each.

import { LAYOUTS, type ParameterLayout } from './responseModel';
import { noiseFloor } from './noise';
import type { FitSet } from './fitSet';
import type { RateCandidate } from './startingRates';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { rankCandidates } from './candidateRanking';
import { refine } from './refine';
import { solveAmplitudes, Workspace } from './amplitudes';
import { shiftByHalfPeriods } from './halfPeriodShift';

/** Starts tried in the first layout; a richer layout gets its simpler one's solution and the best-ranked start. */
const MAX_STARTS = 3;
/**
 * A wrong minimum can leave only a little more than the noise, so an attempt counts as good enough
 * when its rms residual is within 1.02 + 4 / sqrt(n) of the noise: the margin shrinks with the record
 * as the spread of the residual's rms and of the noise estimate do (both about 1 / sqrt(n)).
 */
const GOOD_ENOUGH = { ratio: 1.02, spread: 4 };
/** Below this zeta an attempt is a ring, whose minimum the ranked starts and half-period shifts find. */
const RING_ZETA = 0.5;
/**
 * Damping ratios an attempt near or past critical damping may be refined from as well. There the residual
 * changes little along zeta (a fast root barely in the record), so a search can stop well short of the
 * minimum (zeta 1.007 where the record said 2). The starts keep 2 zeta / omega0, the sum of the two time
 * constants, which the record's delay fixes well.
 */
const DAMPING_STARTS = [1.5, 2, 3, 5, 8, 13];
/** Relative difference of two residual sums of squares that rounding in the linear solve can make. */
const SSE_ROUNDING = 1e-9;
/**
 * A richer layout whose alpha and omega0 lie within this share of the simpler one's, and its t0 within this many
 * radians of the ring (times omega0), found the same response: the simpler one is not refined again from it. On the
 * 120-file corpus batch such refinements came back to the simpler minimum every time (at most 3e-9 noise variances
 * lower), while the ones that mattered started from rates 1.6 radians or more of t0 away.
 */
const SAME_RESPONSE = { rateShare: 0.05, t0Radians: 0.5 };

/**
 * Several starts in the first layout, tried in rank order until one leaves no more than the noise;
 * a richer layout starts from the simpler one's solution and from the best-ranked candidate.
 * One best attempt per layout.
 */
export function searchLayouts(set: FitSet, layouts: ParameterLayout[], candidates: RateCandidate[], t0Start: number, noise: number): Attempt[] {
  const attempts: Attempt[] = [];
  const tolerance = GOOD_ENOUGH.ratio + GOOD_ENOUGH.spread / Math.sqrt(set.time.length);
  const goodEnough = (a: Attempt) => Math.sqrt(a.sse / set.time.length) <= tolerance * noiseFloor(noise, set.range);
  for (const [i, layout] of layouts.entries()) {
    const simpler = attempts[0];
    const starts: [RateCandidate, number][] = simpler
      ? [[{ alpha: attemptValue(simpler, 'alpha'), omega0: attemptValue(simpler, 'omega0'), source: 'nested layout' }, attemptT0(simpler, t0Start)]]
      : [];
    for (const c of rankCandidates(set, layout, candidates, t0Start).slice(0, i === 0 ? MAX_STARTS : 1)) starts.push([c, t0Start]);
    let best: Attempt | undefined;
    const found: Attempt[] = [];
    for (const [start, t0] of starts) {
      // A start that reaches the bowl of an earlier one's minimum returns that attempt.
      const attempt = refine(set, layout, start, t0, { known: found });
      found.push(attempt);
      if (!best || attempt.sse < best.sse) best = attempt;
      // A richer layout tries both of its starts: the simpler layout's minimum can pass for noise.
      if (!simpler && goodEnough(best)) break;
    }
    if (best) best = alongDamping(set, layout, best, t0Start);
    if (!best) continue;
    best = LAYOUTS[layout].fitsT0 ? shiftByHalfPeriods(set, best) : best;
    attempts.push(best);
    if (simpler && best.sse < simpler.sse * (1 - SSE_ROUNDING)) attempts[0] = fromRicher(set, simpler, best, t0Start);
  }
  return attempts;
}

/**
 * The simplest layout refined again from a richer layout's rates and event when the richer one fitted
 * better: a start can stop in a wrong minimum that leaves little more than the noise (a step too fast to
 * see at 20 dB), while the richer layout, started elsewhere, found the response the simpler one also holds.
 */
function fromRicher(set: FitSet, simpler: Attempt, richer: Attempt, t0Start: number): Attempt {
  if (sameResponse(simpler, richer, t0Start)) return simpler;
  const start: RateCandidate = { alpha: attemptValue(richer, 'alpha'), omega0: attemptValue(richer, 'omega0'), source: 'richer layout' };
  const refined = refine(set, simpler.layout, start, attemptT0(richer, t0Start), { known: [simpler] });
  return refined.sse < simpler.sse ? refined : simpler;
}

/**
 * The better of the attempt and its refinement from the DAMPING_STARTS point with the lowest residual
 * (a linear solve each, to choose), unless the attempt is a clear ring that converged.
 */
function alongDamping(set: FitSet, layout: ParameterLayout, attempt: Attempt, t0Start: number): Attempt {
  const alpha = attemptValue(attempt, 'alpha');
  const omega0 = attemptValue(attempt, 'omega0');
  const zeta = alpha / omega0;
  if (!(zeta > 0 && Number.isFinite(zeta)) || (zeta < RING_ZETA && attempt.status === 'converged')) return attempt;
  const t0 = attemptT0(attempt, t0Start);
  const workspace = new Workspace(set.time.length);
  const starts = DAMPING_STARTS.map((start) => {
    const w = (omega0 * start) / zeta;
    const candidate: RateCandidate = { alpha: start * w, omega0: w, source: `damping ratio ${start}` };
    return { candidate, sse: solveAmplitudes(layout, set.time, set.values, candidate.alpha, w, t0, workspace, set.block).sse };
  }).filter((s) => Number.isFinite(s.sse));
  if (starts.length === 0) return attempt;
  const chosen = starts.reduce((x, y) => (y.sse < x.sse ? y : x));
  const refined = refine(set, layout, chosen.candidate, t0, { known: [attempt] });
  // A converged refinement replaces an unfinished attempt it matches to within rounding.
  const matches = refined.status === 'converged' && attempt.status !== 'converged' && refined.sse <= attempt.sse * (1 + SSE_ROUNDING);
  return refined.sse < attempt.sse || matches ? refined : attempt;
}

/** Whether two attempts' rates and event times agree within SAME_RESPONSE. */
function sameResponse(x: Attempt, y: Attempt, t0Start: number): boolean {
  const omega0 = attemptValue(x, 'omega0');
  const near = (name: string) => Math.abs(attemptValue(x, name) - attemptValue(y, name)) <= SAME_RESPONSE.rateShare * attemptValue(x, name);
  return near('alpha') && near('omega0') && Math.abs(attemptT0(x, t0Start) - attemptT0(y, t0Start)) * omega0 <= SAME_RESPONSE.t0Radians;
}
