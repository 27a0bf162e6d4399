// A single decay faster than one sample interval is a jump the sampling cannot time: the fit says so and fails,
// where it once gave a time constant resting on one or two samples.
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';

/** A step to 1 at t = 0 overshooting by 3 with time constant `tau`, sampled every `dt`, 1 % noise. */
function decayingStep(tau: number, dt: number, seed: number) {
  const random = createRandom(seed);
  const n = 2000;
  const time = Float64Array.from({ length: n }, (_, i) => (i - 300) * dt);
  const values = time.map((t) => (t >= 0 ? 1 + 3 * Math.exp(-t / tau) : 0) + 0.01 * random.normal());
  return { time, values, unit: 'V' };
}

describe('a decay faster than the sampling', () => {
  it('fails, naming the time constant against the sample interval', () => {
    const fit = fitResponse(decayingStep(3e-9, 1e-8, 5));
    expect(fit.status).toBe('failed');
    expect(fit.message).toMatch(/^the single decay's time constant \([\d.]+ ns\) is shorter than the sample interval \(10 ns\): a jump the sampling cannot time/);
  });

  it('a two-sample glitch on a quiet baseline, fitted as a ring dying within a sample, fails the same way', () => {
    const random = createRandom(7);
    const time = Float64Array.from({ length: 450 }, (_, i) => i * 2e-9);
    const values = time.map((_, i) => 0.05 * random.normal() + (i === 60 ? 30 : i === 61 ? 20 : 0));
    const fit = fitResponse({ time, values, unit: 'V' });
    expect(fit.status).toBe('failed');
    expect(fit.message).toMatch(/^the response's slowest time constant \([\d.]+ ps\) is shorter than the sample interval \(2 ns\)/);
  });

  it('a decay of a few sample intervals is still measured', () => {
    const fit = fitResponse(decayingStep(5e-8, 1e-8, 6));
    expect(fit.status).toBe('converged');
    expect(fit.regime).toBe('first-order');
    expect(Math.abs(fit.tau!.value - 5e-8)).toBeLessThan(3 * fit.tau!.stderr!);
  });
});
