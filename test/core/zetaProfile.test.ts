// zeta's residual-profile interval near critical damping: as wide as the data allow, even when the walk's steps are far longer.

import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { generatedTrace, secondOrderShape } from './trust/responseRecords';

/** Reads "zeta = z, low to high at 2 sigma (residual profile)" from the regime evidence. */
function profiledInterval(evidence: string): { low: number; high: number } | null {
  const match = /, ([\d.e+-]+) to ([\d.e+-]+) at 2 sigma \(residual profile\)/.exec(evidence);
  return match ? { low: Number(match[1]), high: Number(match[2]) } : null;
}

describe('zeta profile near critical damping', () => {
  // A step at zeta 0.997 with 46 dB of signal to noise: zeta is fixed to about 0.3 %, so 1 lies within reach
  // and the profile is walked, and the interval is far finer than the profile's first step of 3 % in ln(zeta). For a parabolic profile the 2-sigma interval is
  // zeta ± 2 standard errors (Seber and Wild, Nonlinear Regression, 1989, 5.2: the profile and the
  // linearised intervals agree where the model is locally linear).
  const omega0 = 2 * Math.PI * 1e6;
  const zeta = 0.997;
  const trace = generatedTrace(
    { seed: 71, samples: 4000, dt: 2e-9, noise: 5e-3 },
    secondOrderShape({ t0: 1e-6, yPre: 0, yFinal: 1, alpha: zeta * omega0, omega0, a: -1, b: -zeta * omega0 }),
  );

  it('reports a 2-sigma interval about as wide as 2 standard errors each side, holding the truth', () => {
    const fit = fitResponse(trace);
    expect(fit.status).toBe('converged');
    const interval = profiledInterval(fit.regimeEvidence);
    if (interval === null) throw new Error(`the profile was not walked: ${fit.regimeEvidence}`);
    const stderr = fit.zeta.stderr as number;
    const halfWidth = (interval.high - interval.low) / 2;
    expect(halfWidth).toBeGreaterThan(0.6 * 2 * stderr);
    expect(halfWidth).toBeLessThan(1.6 * 2 * stderr);
    expect(Math.abs(fit.zeta.value - zeta)).toBeLessThan(3 * stderr);
  });
});
