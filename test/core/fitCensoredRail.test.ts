// A converter rail the clipping detector cannot see (a slow overshoot that lingers at it, or fast peaks cut off a sample
// or two each) is found from the fit and left out; a rail that only trims the noise of a flat level is left alone.

import { describe, expect, it } from 'vitest';
import { detectClipping } from '../../core/capture/detectClipping';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { coefficientsFromInitial, evaluateResponse } from '../../core/response/secondOrder';

const CODES = 256;

interface RailRecord {
  seed: number;
  samples: number;
  zeta: number;
  /** Noise in converter codes. */
  noiseCodes: number;
  /** Where the top code's centre sits above the highest value of the clean response, in codes. */
  topAbovePeak: number;
  /** Where the bottom code's centre sits under the level before the step, in codes. */
  bottomBelowStart: number;
}

/**
 * A unit step from rest into a series RLC, the capacitor voltage (closed form of core/response/secondOrder.ts, zero
 * slope at the event), the record starting at the event and lasting 7.9 decay times of the slowest root; white noise,
 * then an 8-bit converter whose codes clamp at its rails.
 */
function railRecord(r: RailRecord) {
  const omega0 = 2 * Math.PI * 61e3;
  const alpha = r.zeta * omega0;
  const slowest = r.zeta < 1 ? alpha : alpha - Math.sqrt(alpha * alpha - omega0 * omega0);
  const dt = 7.9 / slowest / r.samples;
  const time = Float64Array.from({ length: r.samples }, (_, i) => i * dt);
  const { a, b } = coefficientsFromInitial(0, 0, 1, alpha);
  const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 1, alpha, omega0, a, b }, time);
  const peak = Math.max(...clean);
  const q = peak / (CODES - 1 - r.bottomBelowStart - r.topAbovePeak);
  const bottom = -r.bottomBelowStart * q;
  const random = createRandom(r.seed);
  const values = clean.map((v) => {
    const code = Math.min(CODES - 1, Math.max(0, Math.round((v + r.noiseCodes * q * random.normal() - bottom) / q)));
    return bottom + code * q;
  });
  return { trace: { time, values, clipped: detectClipping(values).clipped, unit: 'V' }, alpha, omega0 };
}

describe('fitResponse with a rail the clipping detector cannot see', () => {
  it('finds it from the fit, leaves it out, and keeps alpha and omega0 within 3 standard errors', () => {
    // zeta 0.79: a 1.7 % overshoot lingers about the top code, and the start about the bottom one, where 0.7 code of
    // noise crosses often (seed 1's capture #432 of the robustness corpus). Before, 3.9 to 7.8 standard errors off
    // with no warning but that t0 was not fitted.
    for (const seed of [1, 2, 3, 4]) {
      const { trace, alpha, omega0 } = railRecord({ seed, samples: 30000, zeta: 0.79, noiseCodes: 0.7, topAbovePeak: 0, bottomBelowStart: 0.36 });
      expect(trace.clipped.indexOf(1)).toBe(-1);
      const fit = fitResponse(trace);
      expect(fit.status).toBe('converged');
      expect(fit.warnings.join(' ')).toMatch(/highest value .* is taken as a converter rail/);
      expect(Math.abs(fit.alpha.value - alpha) / fit.alpha.stderr!).toBeLessThan(3);
      expect(Math.abs(fit.omega0.value - omega0) / fit.omega0.stderr!).toBeLessThan(3);
    }
  });

  it('finds the first peaks of a fast ring clipped a sample or two each, too few for the pile count, from how sure the fit is of each', () => {
    // A ring of 1.5 times the range at 6.25 samples a period: its first four peaks each way hold 1 or 2 samples at the
    // rail (runs too short for the clipping detector). Before, alpha read 10 % low on every seed, 2.3 standard errors.
    const alpha = 1.5e6;
    const omegaD = 2 * Math.PI * 16e6;
    for (const seed of [1, 2, 3, 4]) {
      const random = createRandom(seed);
      const time = Float64Array.from({ length: 4000 }, (_, i) => (i - 400) * 1e-8);
      const values = time.map((t) => {
        const v = (t >= 0 ? 3 * Math.exp(-alpha * t) * Math.cos(omegaD * t) : 0) + 0.015 * random.normal();
        return Math.min(2, Math.max(-2, Math.round(v / 0.02) * 0.02));
      });
      const trace = { time, values, clipped: detectClipping(values).clipped, unit: 'V' };
      expect(trace.clipped.indexOf(1)).toBe(-1);
      const fit = fitResponse(trace);
      expect(fit.warnings.join(' ')).toMatch(/highest value \(2 V, \d samples\) is taken as a converter rail: the fit puts the samples standing there beyond it/);
      expect(Math.abs(fit.alpha.value - alpha) / fit.alpha.stderr!).toBeLessThan(3);
      expect(Math.abs(fit.omega0.value - Math.hypot(alpha, omegaD)) / fit.omega0.stderr!).toBeLessThan(3);
    }
  });

  it('leaves alone a rail that trims a settled level 2.5 noise levels out, whose cut moves nothing measurably', () => {
    // zeta 2: no overshoot; about 40 samples of the final level are cut, which moves no quantity by 0.15 standard
    // errors, while leaving out every sample near the rail would take the whole level.
    const { trace } = railRecord({ seed: 5, samples: 30000, zeta: 2, noiseCodes: 2, topAbovePeak: 4.5, bottomBelowStart: 8 });
    const fit = fitResponse(trace);
    expect(fit.status).toBe('converged');
    expect(fit.warnings.join(' ')).not.toMatch(/converter rail/);
  });
});
