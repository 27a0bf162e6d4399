// The damping regime a fitted zeta supports, with the evidence in words.

import type { Quantity } from '../quantity';
import type { Regime } from './responseFit';

/** A regime is claimed only when zeta lies this many standard errors clear of 1. */
const REGIME_SIGMAS = 2;

/**
 * The regime zeta supports. Where zeta's residual profile was walked, its 2-sigma interval decides: the
 * profile is lopsided past critical damping, and a symmetric error widened to its long side would hide a
 * regime the data do settle.
 */
export function classifyRegime(zeta: Quantity, profiled?: { low: number; high: number }): { regime: Regime; evidence: string } {
  const z = zeta.value;
  if (profiled) {
    const text = `zeta = ${z.toPrecision(4)}, ${profiled.low.toPrecision(3)} to ${profiled.high.toPrecision(3)} at ${REGIME_SIGMAS} sigma (residual profile)`;
    if (profiled.high < 1) return { regime: 'underdamped', evidence: `${text}: below 1` };
    if (profiled.low > 1) return { regime: 'overdamped', evidence: `${text}: above 1` };
    return { regime: 'critically damped', evidence: `${text}: 1 lies within it` };
  }
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
