// A time axis far from zero (a logger's seconds since its start): the fit counts time from the first sample and gives
// its times back on the axis as it was, with the same rates and uncertainties as the same record timed from 0.
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { FitInputError } from '../../core/fit/fitInputError';
import { fitOrigin } from '../../core/fit/timeOrigin';
import { createRandom } from '../../core/random';

const N = 4000;
const DT = 2e-9;
/** A 10 V step into a 5 MHz ring at zeta 0.06 at t = 0, 1 µs into the record, 46 dB. */
function ringValues(seed: number): Float64Array {
  const zeta = 0.06;
  const omegaD = 2 * Math.PI * 5e6;
  const alpha = (zeta * omegaD) / Math.sqrt(1 - zeta * zeta);
  const random = createRandom(seed);
  return Float64Array.from({ length: N }, (_, i) => {
    const t = i * DT - 1e-6;
    const ring = t < 0 ? 0 : 10 * (1 - Math.exp(-alpha * t) * (Math.cos(omegaD * t) + (alpha / omegaD) * Math.sin(omegaD * t)));
    return ring + 0.05 * random.normal();
  });
}
const axis = (offset: number) => Float64Array.from({ length: N }, (_, i) => offset + (i * DT - 1e-6));

describe('a time axis far from zero', () => {
  it('fits as the same record timed from its trigger: rates, uncertainties and t0 (on its own axis)', () => {
    const values = ringValues(7);
    const near = fitResponse({ time: axis(0), values, unit: 'V', name: 'CH1' });
    for (const offset of [1234.5, 86_400]) {
      const far = fitResponse({ time: axis(offset), values, unit: 'V', name: 'CH1' });
      expect(far.status).toBe('converged');
      expect(far.warnings).toEqual(near.warnings);
      // Far from zero the axis holds each time only to the spacing of doubles there (2.3e-13 s at 1234.5 s, 1.5e-11 s,
      // 0.7 % of a sample interval, at 86 400 s): the answers move by that rounding of the data, a few hundredths of
      // their standard errors at most.
      for (const name of ['alpha', 'omega0', 'zeta', 'finalValue'] as const) {
        expect(Math.abs(far[name].value - near[name].value)).toBeLessThan(0.05 * near[name].stderr!);
        expect(far[name].stderr! / near[name].stderr!).toBeCloseTo(1, 2);
      }
      // t0 back on the axis as given, to the spacing of doubles there (1.5e-11 s at 86 400 s), with its uncertainty.
      expect(Math.abs(far.t0.value - offset - near.t0.value)).toBeLessThan(64 * 2 ** (Math.floor(Math.log2(offset)) - 52));
      expect(far.t0.stderr! / near.t0.stderr!).toBeCloseTo(1, 2);
      expect(far.params.t0).toBe(far.t0.value);
      expect(Math.abs(far.window.start - offset - near.window.start)).toBeLessThan(64 * 2 ** (Math.floor(Math.log2(offset)) - 52));
    }
  });

  it('reads a window given on the axis as it is, and names it so when it misses the record', () => {
    const values = ringValues(8);
    const offset = 1234.5;
    const windowed = fitResponse({ time: axis(offset), values, unit: 'V', name: 'CH1' }, { window: { start: offset - 0.2e-6, end: offset + 5e-6 } });
    expect(windowed.status).toBe('converged');
    expect(windowed.window.start).toBeGreaterThanOrEqual(offset - 0.2e-6 - 1e-12);
    const missed = () => fitResponse({ time: axis(offset), values, unit: 'V', name: 'CH1' }, { window: { start: offset + 1, end: offset + 2 } });
    expect(missed).toThrow(FitInputError);
    expect(missed).toThrow('; the record runs from 1.234 ks to 1.235 ks)');
  });

  it('keeps the axis as given where it holds 0 or starts within a record span of it', () => {
    expect(fitOrigin(axis(0))).toBe(0);
    expect(fitOrigin(Float64Array.from({ length: 10 }, (_, i) => 1e-6 + i * 1e-6))).toBe(0);
    expect(fitOrigin(Float64Array.from([NaN, 1234.5, 1234.5000001, NaN]))).toBe(1234.5);
    expect(fitOrigin(Float64Array.from([-20, -19.9999]))).toBe(-20);
  });
});
