// A single decay that jumps at the event (an RC circuit's charging current) on a long record fitted on block means:
// read as a single decay with its time constant, not as a ring whose fast root stands in for the jump.
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';

/** yPre before tj, then a jump to yPre + jump and a decay with time constant tau to yFinal; 1 ns samples, white noise. */
function chargingCurrent(spec: { samples: number; tj: number; tau: number; yPre: number; jump: number; yFinal: number; noise: number; seed: number }) {
  const time = Float64Array.from({ length: spec.samples }, (_, i) => i * 1e-9);
  const random = createRandom(spec.seed);
  const start = spec.yPre + spec.jump;
  const values = time.map((t) => (t < spec.tj ? spec.yPre : spec.yFinal + (start - spec.yFinal) * Math.exp(-(t - spec.tj) / spec.tau)) + spec.noise * random.normal());
  return { time, values, unit: 'A' };
}

describe('a single decay that jumps at the event, on block means', () => {
  it.each([
    // The decay held to the level before met the jump with a rate so fast that no jump fitted at it: the decay was
    // never fitted with its jump, and a ring whose fast root made the jump took the record (no tau, no uncertainty).
    ['a 5 A jump, tau 1.6 us over 10 us', { samples: 9964, tj: 2423.4e-9, tau: 1.606e-6, yPre: 0.35, jump: -5, yFinal: 0.2, noise: 0.05, seed: 26 }],
    // The jump's place, scanned at that held decay's rate, lay 10 samples early: the same ring took the record.
    ['a 3 A jump, tau 2.1 us over 32 us', { samples: 32337, tj: 6109.5e-9, tau: 2.13e-6, yPre: -0.5, jump: 3, yFinal: -0.15, noise: 0.04, seed: 2 }],
  ])('%s: read as a single decay, its tau within 3 standard errors', (_, spec) => {
    const fit = fitResponse(chargingCurrent(spec));
    expect(fit.decimation).not.toBeNull();
    expect(fit.status).toBe('converged');
    expect(fit.regime).toBe('first-order');
    expect(fit.jumpStart).toBe(true);
    const tau = fit.tau!;
    expect(Math.abs(tau.value - spec.tau)).toBeLessThan(3 * (tau.stderr ?? 0));
    expect((tau.stderr ?? Infinity) / spec.tau).toBeLessThan(0.1);
    expect(fit.t0.value).toBeGreaterThan(spec.tj - 1e-9);
    expect(fit.t0.value).toBeLessThan(spec.tj + 1e-9);
  });
});
