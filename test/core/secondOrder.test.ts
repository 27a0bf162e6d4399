// The second-order response: one formula through all three regimes, and its block-averaged form.
import { describe, expect, it } from 'vitest';
import { dampedBasis, fillDampedBasis, responseAt, coefficientsFromInitial } from '../../core/response/secondOrder';

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
  it.each([
    ['underdamped', 0.3, 1],
    ['critically damped', 1, 1],
    ['overdamped', 3, 1],
  ])('gives the mean over each block of an %s basis (numerical quadrature as the reference)', (_, alpha, omega0) => {
    const h = 0.7;
    const time = [2, 5];
    const ec = new Float64Array(2);
    const es = new Float64Array(2);
    fillDampedBasis(alpha, omega0, 0, time, ec, es, h);
    const steps = 20000;
    for (let k = 0; k < 2; k++) {
      let meanC = 0;
      let meanS = 0;
      for (let j = 0; j < steps; j++) {
        const [c, s] = dampedBasis(alpha, omega0, time[k] - h / 2 + ((j + 0.5) * h) / steps);
        meanC += c / steps;
        meanS += s / steps;
      }
      expect(ec[k]).toBeCloseTo(meanC, 9);
      expect(es[k]).toBeCloseTo(meanS, 9);
    }
  });
});
