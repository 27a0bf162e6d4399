// Each ringing mode's (and the slow term's) share of a fitted response over a time axis, for drawing under the fit.

import { fillDampedBasis } from '../response/secondOrder';
import type { ModeTerms, ResponseFit } from './responseFit';

export interface ModeContribution {
  /** 'mode 1', 'mode 2'... in the order of fit.modes (dominant first), or 'slow term'. */
  label: string;
  values: Float64Array;
}

/**
 * The contribution of each ringing mode, dominant first, then of the slow term, at each given time: zero
 * before t0. With one mode and no slow term it is the fitted response minus its final value after t0; their
 * sum plus the final value is the fitted model. No contributions for a fit without modes.
 */
export function modeContributions(fit: Pick<ResponseFit, 'params' | 'modes' | 'modeTerms'>, times: ArrayLike<number>): ModeContribution[] {
  if (fit.modes.length === 0) return [];
  const { t0 } = fit.params;
  const terms: ModeTerms = fit.modeTerms ?? { rings: [{ alpha: fit.params.alpha, omega0: fit.params.omega0, a: fit.params.a, b: fit.params.b }], slow: null };
  const ec = new Float64Array(times.length);
  const es = new Float64Array(times.length);
  const out: ModeContribution[] = terms.rings.map((ring, k) => {
    fillDampedBasis(ring.alpha, ring.omega0, t0, times, ec, es);
    return { label: `mode ${k + 1}`, values: Float64Array.from(ec, (c, i) => ring.a * c + ring.b * es[i]) };
  });
  if (terms.slow) {
    const { rate, amplitude } = terms.slow;
    // The critically damped basis at omega0 = alpha: ec is e^(-alpha tau) exactly.
    fillDampedBasis(rate, rate, t0, times, ec, es);
    out.push({ label: 'slow term', values: Float64Array.from(ec, (c) => amplitude * c) });
  }
  return out;
}
