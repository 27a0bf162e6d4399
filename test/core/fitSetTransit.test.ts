// Block means of a long record in which no ring period shows are at most 1/8 of the response's transit: a fast decay in
// a long record keeps its shape in enough points for the fit to read it.
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { prepareFitSet } from '../../core/fit/fitSet';
import { evaluateResponse, type ResponseParams } from '../../core/response/secondOrder';
import { createRandom } from '../../core/random';

/** A step from rest at t0 = 1.2818 us through an overdamped response (zeta 1.52, slow time constant 26 ns), in `samples` 1 ns samples. */
function fastStepInLongRecord(samples: number, seed: number) {
  const omega0 = 2 * Math.PI * 16.348e6;
  const alpha = 1.5177 * omega0;
  const step = -5.0111;
  // From rest: y(t0+) = yPre and y'(t0+) = 0, so a = yPre - yFinal and b = alpha a (coefficientsFromInitial).
  const p: ResponseParams = { t0: 1.2818e-6, yPre: -0.8042, yFinal: -0.8042 + step, alpha, omega0, a: -step, b: -alpha * step };
  const time = Float64Array.from({ length: samples }, (_, i) => -0.37094e-6 + i * 1e-9);
  const random = createRandom(seed);
  const values = evaluateResponse(p, time).map((v) => v + 0.04717 * random.normal());
  return { trace: { time, values, unit: 'V' }, p };
}

describe('block means of a fast response in a long record', () => {
  it('span at most 1/8 of the transit: a step that settles in about 100 ns of 25 us is averaged over 7 samples, not 25', () => {
    const { trace } = fastStepInLongRecord(24593, 10);
    const set = prepareFitSet(trace, {});
    expect(set.block).not.toBeNull();
    // About 2.3 slow time constants (60 samples) lie away from both levels by a tenth of the step: blocks of 7.
    expect(set.block!.samples).toBeLessThanOrEqual(8);
    expect(set.decimation?.note).toMatch(/transit/);
  });

  it('let the fit read zeta, alpha and omega0 within their uncertainties (the 25-sample blocks read tau 27 ns +- 250 ms)', () => {
    const { trace, p } = fastStepInLongRecord(24593, 10);
    const fit = fitResponse(trace);
    expect(fit.status).toBe('converged');
    expect(fit.regime).toBe('overdamped');
    for (const name of ['alpha', 'omega0'] as const) {
      const q = fit[name];
      expect(q.stderr).not.toBeNull();
      expect(Math.abs(q.value - p[name])).toBeLessThan(3 * q.stderr!);
      expect(q.stderr! / p[name]).toBeLessThan(0.5);
    }
  });

  it('are never more than 4000 however short the transit', () => {
    const { trace } = fastStepInLongRecord(100_000, 11);
    const set = prepareFitSet(trace, {});
    expect(set.time.length).toBeLessThanOrEqual(4000);
    expect(set.time.length).toBeGreaterThan(3000);
  });
});
