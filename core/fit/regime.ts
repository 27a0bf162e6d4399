// The damping regime a fitted zeta supports, with the evidence in words.

import type { Quantity } from '../quantity';
import type { Regime } from './responseFit';

/** A regime is claimed only when zeta lies this many standard errors clear of 1. */
const REGIME_SIGMAS = 2;

export function classifyRegime(zeta: Quantity): { regime: Regime; evidence: string } {
  const z = zeta.value;
  if (zeta.stderr === null) {
    const regime: Regime = z < 1 ? 'underdamped' : z > 1 ? 'overdamped' : 'critically damped';
    return { regime, evidence: `zeta = ${z.toPrecision(4)}; its uncertainty could not be estimated` };
  }
  const s = zeta.stderr;
  const text = `zeta = ${z.toPrecision(4)} ± ${s.toPrecision(2)}`;
  if (z + REGIME_SIGMAS * s < 1) return { regime: 'underdamped', evidence: `${text}: zeta + ${REGIME_SIGMAS} sigma < 1` };
  if (z - REGIME_SIGMAS * s > 1) return { regime: 'overdamped', evidence: `${text}: zeta - ${REGIME_SIGMAS} sigma > 1` };
  return { regime: 'critically damped', evidence: `${text}: 1 lies within ${REGIME_SIGMAS} sigma` };
}
