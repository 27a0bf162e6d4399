// The fitted model at any times, from what a fit summary keeps: one ring from its params, several modes from their terms.
// Evaluated here from the response's basis (not the fit's code), so the report writer loads no fitting code.

import { evaluateResponse, fillDampedBasis } from '../response/secondOrder';
import type { FitSummary } from './fitSummary';

/**
 * The whole fitted response at each time: the level before t0, then the final level plus every ring's
 * e^(-alpha tau) (a C + b S) and the slow term's amplitude e^(-rate tau) when the fit kept its terms (several
 * modes, as modeContributions draws them), else the one ring of `params`.
 */
export function fittedModel(fit: Pick<FitSummary, 'params' | 'modeTerms'>, times: Float64Array): Float64Array {
  const { params, modeTerms } = fit;
  if (!modeTerms) return evaluateResponse(params, times);
  const y = Float64Array.from(times, (t) => (t < params.t0 ? params.yPre : params.yFinal));
  const ec = new Float64Array(times.length);
  const es = new Float64Array(times.length);
  const add = (alpha: number, omega0: number, a: number, b: number) => {
    fillDampedBasis(alpha, omega0, params.t0, times, ec, es);
    for (let i = 0; i < times.length; i++) if (times[i] >= params.t0) y[i] += a * ec[i] + b * es[i];
  };
  for (const ring of modeTerms.rings) add(ring.alpha, ring.omega0, ring.a, ring.b);
  // At omega0 = alpha the basis is critically damped: its C term is e^(-rate tau) exactly.
  if (modeTerms.slow) add(modeTerms.slow.rate, modeTerms.slow.rate, modeTerms.slow.amplitude, 0);
  return y;
}
