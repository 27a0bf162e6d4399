// transitionMetrics and histogramStateLevels on waveforms whose metrics follow exactly from their
// formulas (IEEE Std 181-2011 definitions; clause numbers from memory).
import { describe, expect, it } from 'vitest';
import { histogramStateLevels } from '../../core/circuit/stateLevels';
import { transitionMetrics } from '../../core/circuit/transitions';
import { CircuitInputError } from '../../core/circuit/errors';
import { createRandom } from '../../core/random';
import { evaluateResponse } from '../../core/response/secondOrder';

function axis(n: number, dt: number, start = 0): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => start + i * dt);
}

describe('histogramStateLevels (IEEE Std 181-2011 histogram mode method; clause from memory)', () => {
  it.each([
    { label: 'rising 0 V to 12 V', from: 0, to: 12 },
    { label: 'falling 48 V to 5 V', from: 48, to: 5 },
  ])('finds both levels of a noisy $label step', ({ from, to }) => {
    const random = createRandom(3);
    const values = Float64Array.from({ length: 4000 }, (_, i) => (i < 1000 ? from : to) + 0.01 * Math.abs(to - from) * random.normal());
    const levels = histogramStateLevels(values);
    expect(Math.abs(levels.initial - from)).toBeLessThan(0.01 * Math.abs(to - from));
    expect(Math.abs(levels.final - to)).toBeLessThan(0.01 * Math.abs(to - from));
  });
});

describe('transitionMetrics', () => {
  it('10-90 % rise time of a linear ramp is 0.8 of its duration (reference-level instants, linear interpolation)', () => {
    const time = axis(1001, 1e-9);
    const values = time.map((t) => Math.min(1, Math.max(0, (t - 100e-9) / 500e-9)) * 5);
    const m = transitionMetrics(time, values, { initial: 0, final: 5 });
    expect(m.riseTime! / 400e-9 - 1).toBeCloseTo(0, 12);
    expect(m.instants.t50! / 350e-9 - 1).toBeCloseTo(0, 12);
    // The histogram's modal bins also hold a few ramp samples: levels, hence times, within 1 %.
    const h = transitionMetrics(time, values);
    expect(h.levels.method).toBe('histogram mode');
    expect(Math.abs(h.riseTime! / 400e-9 - 1)).toBeLessThan(0.01);
    expect(m.overshoot).toBe(0);
    expect(m.undershoot).toBe(0);
    expect(m.ringFrequency).toBeNull();
    expect(m.peakInstant).toBeNull();
  });

  // A first-order step 1 - exp(-t / tau): t10 = tau ln(10/9), t50 = tau ln 2, t90 = tau ln 10,
  // and it enters the p band at tau ln(1/p) (derived).
  it.each([{ polarity: 'rising', sign: 1 }, { polarity: 'falling', sign: -1 }])('first-order $polarity step: rise and settling times', ({ sign }) => {
    const tau = 1e-6;
    const time = axis(20001, 1e-9);
    const values = time.map((t) => 10 + sign * 3 * (1 - Math.exp(-t / tau)));
    const m = transitionMetrics(time, values, { initial: 10, final: 10 + 3 * sign, eventTime: 0 });
    expect(m.levels.method).toBe('given');
    expect(m.riseTime! / (tau * Math.log(9)) - 1).toBeCloseTo(0, 5);
    expect(m.settlingTime2! / (tau * (Math.log(50) - Math.log(2))) - 1).toBeCloseTo(0, 5);
    expect(m.settlingTime5! / (tau * (Math.log(20) - Math.log(2))) - 1).toBeCloseTo(0, 5);
    expect(m.overshoot).toBe(0);
  });

  it('overshoot, undershoot and ring frequency of a second-order step from the closed form', () => {
    const alpha = 2e6;
    const omega0 = 2 * Math.PI * 5e6;
    const wd = Math.sqrt(omega0 ** 2 - alpha ** 2);
    const time = axis(40001, 0.1e-9, -0.2e-6);
    // y = 12 (1 - e^(-alpha t) (cos wd t + alpha / wd sin wd t)): v_C of a series loop after a step.
    const values = evaluateResponse({ t0: 0, yPre: 0, yFinal: 12, alpha, omega0, a: -12, b: -12 * alpha }, time);
    const m = transitionMetrics(time, values, { initial: 0, final: 12, eventTime: 0 });
    // Extremes of the normalised error sit at t = k pi / wd with size e^(-alpha k pi / wd) (derived).
    expect(m.overshoot!).toBeCloseTo(100 * Math.exp((-alpha * Math.PI) / wd), 4);
    expect(m.undershoot!).toBeCloseTo(100 * Math.exp((-2 * alpha * Math.PI) / wd), 4);
    expect(m.peakTime!).toBeCloseTo(Math.PI / wd, 10);
    expect(m.ringFrequency! / (wd / (2 * Math.PI)) - 1).toBeCloseTo(0, 6);
    expect(m.warnings).toEqual([]);
  });

  it('counts no spurious crossings in the noise about a settled level', () => {
    const alpha = 2e6;
    const omega0 = 2 * Math.PI * 5e6;
    const wd = Math.sqrt(omega0 ** 2 - alpha ** 2);
    const time = axis(40001, 0.1e-9);
    const random = createRandom(11);
    const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 12, alpha, omega0, a: -12, b: -12 * alpha }, time);
    const noisy = clean.map((y) => y + 0.1 * random.normal());
    const m = transitionMetrics(time, noisy, { initial: 0, final: 12 });
    expect(Math.abs(m.ringFrequency! / (wd / (2 * Math.PI)) - 1)).toBeLessThan(0.003);
    // 0.83 % rms noise against a 2 % band: the settling time is flagged as noise-bound, also when the model settled early.
    expect(m.warnings.join(' ')).toMatch(/settled noise/);
    const settled = transitionMetrics(time, noisy, { initial: 0, final: 12, modelSettled: Math.log(50) / alpha });
    expect(settled.warnings.join(' ')).toMatch(/settled noise/);
  });

  it("takes a ring still running at the record's end for no settled noise when the model says it has not settled", () => {
    // Noise-free, alpha 1e5 s^-1: the 2 % band is reached at 39 us, the record ends at 18 us.
    const alpha = 1e5;
    const omega0 = 2 * Math.PI * 2e6;
    const time = axis(3600, 5e-9);
    const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 1, alpha, omega0, a: -1, b: -alpha }, time);
    const settles = Math.log(1 / 0.02) / alpha;
    const unsettled = transitionMetrics(time, clean, { initial: 0, final: 1, modelSettled: settles });
    expect(unsettled.warnings.join(' ')).not.toMatch(/settled noise/);
    expect(unsettled.warnings.join(' ')).toMatch(/does not stay within 2 %/);
    // Without the model's word the ring's spread in the last fifth reads as noise, as the definitions alone give it.
    expect(transitionMetrics(time, clean, { initial: 0, final: 1 }).warnings.join(' ')).toMatch(/settled noise/);
  });

  it('takes no ring from the noise about a noisy overdamped step', () => {
    const time = axis(20001, 1e-9);
    const random = createRandom(12);
    // Critically damped: no overshoot, so the final-level crossings are noise only.
    const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 1, alpha: 2e7, omega0: 2e7, a: -1, b: -2e7 }, time);
    const m = transitionMetrics(time, clean.map((y) => y + 0.005 * random.normal()), { initial: 0, final: 1 });
    expect(m.ringFrequency).toBeNull();
  });

  it('finds the state levels itself on a step with a long settled tail', () => {
    const time = axis(20001, 1e-9, -2e-6);
    const values = evaluateResponse({ t0: 0, yPre: 1, yFinal: 5, alpha: 5e6, omega0: 2e7, a: -4, b: -4 * 5e6 }, time);
    const m = transitionMetrics(time, values);
    expect(m.levels.initial).toBeCloseTo(1, 2);
    expect(m.levels.final).toBeCloseTo(5, 2);
    expect(m.amplitude).toBeCloseTo(4, 2);
  });

  it('reports no settling when the record ends outside the band', () => {
    const time = axis(1001, 1e-9);
    const values = evaluateResponse({ t0: 0, yPre: 0, yFinal: 1, alpha: 1e5, omega0: 2e8, a: -1, b: -1e5 }, time);
    const m = transitionMetrics(time, values, { initial: 0, final: 1 });
    expect(m.settlingTime2).toBeNull();
    expect(m.warnings.join(' ')).toMatch(/2 %/);
  });

  it('warns and measures nothing when there is no transition', () => {
    const m = transitionMetrics(axis(100, 1), new Float64Array(100).fill(3));
    expect(m.riseTime).toBeNull();
    expect(m.warnings.join(' ')).toMatch(/no transition/);
  });

  it('throws CircuitInputError for mismatched lengths', () => {
    expect(() => transitionMetrics(axis(10, 1), new Float64Array(9))).toThrow(CircuitInputError);
  });
});
