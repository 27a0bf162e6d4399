// The second-order response: one formula through all three regimes, and its block-averaged form.
import { describe, expect, it } from 'vitest';
import { dampedBasis, fillDampedBasis, responseAt, coefficientsFromInitial, RunSteps } from '../../core/response/secondOrder';

describe('dampedBasis', () => {
  it('is continuous through critical damping (no switch of formula, no 0/0)', () => {
    const omega0 = 1e6;
    const tau = 3e-6;
    const at = (zeta: number) => dampedBasis(zeta * omega0, omega0, tau);
    const [cCrit, sCrit] = at(1);
    // Critical damping: e^(-alpha tau) and tau e^(-alpha tau), derived from the series at q = 0.
    expect(cCrit).toBeCloseTo(Math.exp(-3), 14);
    expect(sCrit / tau).toBeCloseTo(Math.exp(-3), 14);
    for (const dz of [1e-12, 1e-9, 1e-6, 1e-4]) {
      for (const zeta of [1 - dz, 1 + dz]) {
        const [c, s] = at(zeta);
        expect(Math.abs(c - cCrit)).toBeLessThan(20 * dz * Math.exp(-3) + 1e-15);
        expect(Math.abs(s - sCrit) / tau).toBeLessThan(20 * dz * Math.exp(-3) + 1e-15);
      }
    }
  });

  it('matches the textbook forms away from critical damping', () => {
    const alpha = 2e5;
    const omega0 = 1e6;
    const wd = Math.sqrt(omega0 ** 2 - alpha ** 2);
    const tau = 4e-6;
    const [c, s] = dampedBasis(alpha, omega0, tau);
    expect(c).toBeCloseTo(Math.exp(-alpha * tau) * Math.cos(wd * tau), 14);
    expect(s * wd).toBeCloseTo(Math.exp(-alpha * tau) * Math.sin(wd * tau), 14);
    const over = dampedBasis(5e6, 1e6, 1e-6);
    const beta = Math.sqrt(25e12 - 1e12);
    expect(over[0]).toBeCloseTo(Math.exp(-5) * Math.cosh(beta * 1e-6), 14);
  });

  it('does not overflow for a heavily overdamped response', () => {
    const [c, s] = dampedBasis(1e9, 1e3, 1);
    expect(Number.isFinite(c) && Number.isFinite(s)).toBe(true);
  });
});

describe('responseAt', () => {
  it('holds the pre-event level and starts from the given value and slope', () => {
    const alpha = 3e4;
    const { a, b } = coefficientsFromInitial(2, 5e5, 10, alpha);
    const p = { t0: 1e-5, yPre: 2, yFinal: 10, alpha, omega0: 1e5, a, b };
    expect(responseAt(p, 0)).toBe(2);
    expect(responseAt(p, 1e-5)).toBeCloseTo(2, 12);
    const h = 1e-10;
    expect((responseAt(p, 1e-5 + h) - responseAt(p, 1e-5)) / h).toBeCloseTo(5e5, -1);
  });
});

describe('fillDampedBasis with blocks', () => {
  /** The reference: the mean of the point basis over a block's own samples at or after t0, and their share. */
  function blockMean(alpha: number, omega0: number, t0: number, centre: number, samples: number, spacing: number): [number, number, number] {
    let c = 0;
    let s = 0;
    let count = 0;
    for (let j = 0; j < samples; j++) {
      const tau = centre + (j - (samples - 1) / 2) * spacing - t0;
      if (tau < 0) continue;
      const [pc, ps] = dampedBasis(alpha, omega0, tau);
      c += pc;
      s += ps;
      count++;
    }
    return count ? [c / count, s / count, count / samples] : [0, 0, 0];
  }

  it.each([
    ['underdamped, 7 samples a block', 0.3, 1, 7, 0.1],
    ['underdamped, 2 samples a block (where a continuous window is 0.7 % off)', 0.05, 1, 2, 0.4],
    ['critically damped, 50 samples a block', 1, 1, 50, 0.014],
    ['overdamped, 200 samples a block', 3, 1, 200, 0.0035],
  ])('gives the mean over each block of an %s basis', (_, alpha, omega0, samples, spacing) => {
    // Blocks before the event, across it, just after it and well after it.
    const t0 = 1;
    const width = samples * spacing;
    const time = [t0 - width, t0 + 0.2 * width, t0 + ((samples - 1) / 2) * spacing, 5];
    const ec = new Float64Array(time.length);
    const es = new Float64Array(time.length);
    const after = new Float64Array(time.length);
    fillDampedBasis(alpha, omega0, t0, time, ec, es, { samples, spacing }, after);
    for (let k = 0; k < time.length; k++) {
      const [c, s, share] = blockMean(alpha, omega0, t0, time[k], samples, spacing);
      expect(ec[k]).toBeCloseTo(c, 12);
      expect(es[k]).toBeCloseTo(s, 12);
      expect(after[k]).toBeCloseTo(share, 15);
    }
    expect(after[0]).toBe(0);
    expect(after[1]).toBeGreaterThan(0);
    expect(after[1]).toBeLessThan(1);
    expect(after[2]).toBe(1);
  });
});

describe('fillDampedBasis over an evenly spaced axis (the recurrence) against each instant alone', () => {
  const dt = 1e-8;
  const cases: [string, number, number][] = [
    ['underdamped, 100 periods', 1e5, 2 * Math.PI * 1e6],
    ['near critical', 1e6, 1e6 * 1.0001],
    ['overdamped', 5e6, 1e6],
    ['heavily overdamped', 2e8, 1e6],
    ['a ring near the Nyquist rate', 1e5, 0.9 * Math.PI / dt],
  ];
  for (const [name, alpha, omega0] of cases) {
    it(name, () => {
      const n = 10000;
      const t0 = 3.3e-7;
      const time = Float64Array.from({ length: n }, (_, i) => -1e-6 + i * dt);
      const ec = new Float64Array(n);
      const es = new Float64Array(n);
      fillDampedBasis(alpha, omega0, t0, time, ec, es);
      for (let i = 0; i < n; i++) {
        const [c, s] = time[i] < t0 ? [0, 0] : dampedBasis(alpha, omega0, time[i] - t0);
        // Within 1e-12: cos and sin of an argument of 10^4 rad are themselves only good to about that.
        expect(Math.abs(ec[i] - c)).toBeLessThan(1e-12);
        expect(Math.abs(es[i] - s) * omega0).toBeLessThan(1e-12);
      }
    });
  }
  it('an axis with jitter is computed instant by instant', () => {
    const n = 64;
    const time = Float64Array.from({ length: n }, (_, i) => i * 1e-8 + (i % 3) * 1e-12);
    const ec = new Float64Array(n);
    const es = new Float64Array(n);
    fillDampedBasis(1e5, 2e7, 0, time, ec, es);
    for (let i = 0; i < n; i++) expect(ec[i]).toBe(dampedBasis(1e5, 2e7, time[i])[0]);
  });
});

describe('RunSteps', () => {
  it('gives the basis fillDampedBasis finds alone, on even runs, jittered ones and short ones, and follows a new axis', () => {
    const even = Float64Array.from({ length: 203 }, (_, i) => 1e-6 + i * 1e-8);
    const jittered = even.map((t, i) => (i % 37 === 5 ? t + 3e-10 : t));
    const runs = new RunSteps();
    for (const time of [even, jittered, even.subarray(0, 18)]) {
      for (const [alpha, omega0] of [
        [1e5, 2e7],
        [3e7, 2e7],
      ]) {
        const alone = [new Float64Array(time.length), new Float64Array(time.length)];
        const kept = [new Float64Array(time.length), new Float64Array(time.length)];
        fillDampedBasis(alpha, omega0, 1.3e-6, time, alone[0], alone[1]);
        fillDampedBasis(alpha, omega0, 1.3e-6, time, kept[0], kept[1], null, undefined, runs.of(time));
        expect(kept).toEqual(alone);
      }
      expect(runs.of(time)).toBe(runs.of(time));
    }
  });
});
