// Multi-start search across the layouts that apply: the best refined attempt of each.

import { LAYOUTS, type ParameterLayout } from './responseModel';
import { noiseFloor } from './noise';
import type { FitSet } from './fitSet';
import type { RateCandidate } from './startingRates';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import { rankCandidates } from './candidateRanking';
import { refine } from './refine';
import { shiftByHalfPeriods } from './halfPeriodShift';

/** Starts tried in the first layout; a richer layout gets its simpler one's solution and the best-ranked start. */
const MAX_STARTS = 3;
/**
 * A wrong minimum can leave only a little more than the noise, so an attempt counts as good enough
 * when its rms residual is within 1.02 + 4 / sqrt(n) of the noise: the margin shrinks with the record
 * as the spread of the residual's rms and of the noise estimate do (both about 1 / sqrt(n)).
 */
const GOOD_ENOUGH = { ratio: 1.02, spread: 4 };

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
    for (const [start, t0] of starts) {
      const attempt = refine(set, layout, start, t0);
      if (!best || attempt.sse < best.sse) best = attempt;
      // A richer layout tries both of its starts: the simpler layout's minimum can pass for noise.
      if (!simpler && goodEnough(best)) break;
    }
    if (best) attempts.push(LAYOUTS[layout].fitsT0 ? shiftByHalfPeriods(set, best) : best);
  }
  return attempts;
}
