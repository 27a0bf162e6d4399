// A single decay read from an overdamped step whose fast root the record cannot resolve: tau's error allows for the
// pull of that root even when the tail's own reading happens to agree with the whole record's.

import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { coefficientsFromInitial, evaluateResponse } from '../../core/response/secondOrder';

/**
 * A unit step from rest into a series RLC, the capacitor voltage (closed form of core/response/secondOrder.ts, zero
 * slope at the event): zeta 1.63 at 9 MHz, white noise 15 dB under the step, 12000 samples, 22 % of them before the
 * event and 6 slow decay times after it. The slowest time constant is 1 / (alpha - sqrt(alpha^2 - omega0^2)).
 */
function overdampedStep(seed: number) {
  const omega0 = 2 * Math.PI * 9e6;
  const alpha = 1.63 * omega0;
  const slowest = alpha - Math.sqrt(alpha * alpha - omega0 * omega0);
  const samples = 12000;
  const dt = 6 / slowest / (0.78 * samples);
  const time = Float64Array.from({ length: samples }, (_, i) => (i - 0.22 * samples) * dt);
  const { a, b } = coefficientsFromInitial(0, 0, 1, alpha);
  const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 1, alpha, omega0, a, b }, time);
  const random = createRandom(seed);
  const noise = 10 ** (-15 / 20);
  return { trace: { time, values: clean.map((v) => v + noise * random.normal()), unit: 'V' }, tau: 1 / slowest };
}

describe('a single decay whose record may hide a faster root', () => {
  it('keeps tau within 3 standard errors of the slowest time constant where the tail agreed by chance', () => {
    // The whole record's tau reads 2.6 % slow on average (the fast root's share). Seeds 13 and 62 are the two of 200
    // that stood beyond 3 standard errors before (3.0 with no warning, like seed 2's corpus capture #110, and 4.4): their
    // tails read close to the whole record, so the distance allowed almost nothing (stated 2.1 %, now 6.1 %).
    // Over those 200 seeds none is now beyond 2.
    for (const seed of [13, 62]) {
      const { trace, tau } = overdampedStep(seed);
      const fit = fitResponse(trace);
      expect(fit.regime).toBe('first-order');
      expect(Math.abs(fit.tau!.value - tau) / fit.tau!.stderr!).toBeLessThan(3);
    }
  });
});
