// A faint ring about the starting level after a quiet pre-trigger head, which the event search cannot find:
// the fit must place the event inside the record, not run a free response from the first sample through the head.

import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { coefficientsFromInitial, evaluateResponse, type ResponseParams } from '../../core/response/secondOrder';

/**
 * A ring that starts with a slope from the level it settles back to (a loop current or a tank voltage after a
 * step), 1328 samples at 13 per ring period, the event 108.4 samples in, white noise at 14 dB below the clean
 * peak-to-peak: no sample stands 12 noise levels clear, and the block energies stay low.
 */
function faintRing(seed: number): { time: Float64Array; values: Float64Array; truth: ResponseParams } {
  const omega0 = 2 * Math.PI * 5e6;
  const alpha = 0.037 * omega0;
  const dt = (2 * Math.PI) / Math.sqrt(omega0 * omega0 - alpha * alpha) / 13;
  const { a, b } = coefficientsFromInitial(0, 1e7, 0, alpha);
  const truth: ResponseParams = { t0: 108.4 * dt, yPre: 0, yFinal: 0, alpha, omega0, a, b };
  const time = Float64Array.from({ length: 1328 }, (_, i) => i * dt);
  const clean = evaluateResponse(truth, time);
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of clean) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const sigma = (hi - lo) * 10 ** (-14 / 20);
  const random = createRandom(seed);
  const values = clean.map((v) => v + sigma * random.normal());
  return { time, values, truth };
}

describe('a faint ring after a quiet head the event search does not find', () => {
  it.each([1, 2, 3, 4, 5, 6])('seed %d: the event is fitted inside the record and alpha and omega0 lie within 3 standard errors', (seed) => {
    const { time, values, truth } = faintRing(5300 + seed);
    const fit = fitResponse({ time, values, unit: 'A', name: 'I_loop' });
    expect(fit.t0.stderr).not.toBeNull();
    expect(fit.t0.value).toBeGreaterThan(time[0]);
    expect(Math.abs(fit.alpha.value - truth.alpha)).toBeLessThan(3 * (fit.alpha.stderr as number));
    expect(Math.abs(fit.omega0.value - truth.omega0)).toBeLessThan(3 * (fit.omega0.stderr as number));
  });
});
