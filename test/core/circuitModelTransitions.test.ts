// modelTransitions against the standard second-order step-response relations (e.g. Ogata, Modern
// Control Engineering, ch. 5; from memory for the edition) and against the sampled closed form.
import { describe, expect, it } from 'vitest';
import { modelTransitions, type ModelFitInput } from '../../core/circuit/modelTransitions';
import { transitionMetrics } from '../../core/circuit/transitions';
import { quantity } from '../../core/quantity';
import { evaluateResponse, type ResponseParams } from '../../core/response/secondOrder';

const OMEGA0 = 2 * Math.PI * 1e6;

/** A fit of a unit step from rest (the 'smooth' layout) with given standard errors and correlation. */
function stepFit(zeta: number, se = { alpha: 0.01, omega0: 0.001, rho: 0.3 }, level = { pre: 2, final: 14 }): ModelFitInput {
  const alpha = zeta * OMEGA0;
  const a = level.pre - level.final;
  const params: ResponseParams = { t0: 1e-7, yPre: level.pre, yFinal: level.final, alpha, omega0: OMEGA0, a, b: alpha * a };
  return {
    status: 'converged',
    params,
    alpha: quantity(alpha, se.alpha * alpha, 's^-1'),
    omega0: quantity(OMEGA0, se.omega0 * OMEGA0, 'rad/s'),
    preLevel: quantity(level.pre, 0.01, 'V'),
    finalValue: quantity(level.final, 0.01, 'V'),
    correlation: { names: ['alpha', 'omega0', 't0', 'yPre', 'yFinal'], matrix: matrixWith(se.rho) },
  };
}

function matrixWith(rho: number): number[][] {
  const m: number[][] = Array.from({ length: 5 }, (_, i) => Array.from({ length: 5 }, (_, j) => (i === j ? 1 : 0)));
  m[0][1] = m[1][0] = rho;
  return m;
}

/** The closed form sampled densely and measured by the IEEE 181 definitions (transitionMetrics). */
function sampled(fit: ModelFitInput) {
  const p = fit.params;
  const slow = p.omega0 > p.alpha ? p.alpha : p.alpha - Math.sqrt(p.alpha ** 2 - p.omega0 ** 2);
  const span = 12 / slow;
  const fastest = Math.max(p.omega0, p.alpha + Math.sqrt(Math.max(0, p.alpha ** 2 - p.omega0 ** 2)));
  const dt = Math.min(span / 200000, 1 / (2000 * fastest));
  const time = Float64Array.from({ length: Math.ceil(span / dt) }, (_, i) => p.t0 + i * dt);
  const m = transitionMetrics(time, evaluateResponse(p, time), { initial: p.yPre, final: p.yFinal, eventTime: p.t0 });
  return { m, dt, settle2: m.settlingTime2! + m.instants.t50! - p.t0, settle5: m.settlingTime5! + m.instants.t50! - p.t0 };
}

describe('modelTransitions: standard second-order step-response relations (e.g. Ogata, Modern Control Engineering, ch. 5; from memory)', () => {
  it.each([0.05, 0.1, 0.3, 0.5, 0.7, 0.9])('zeta %s: overshoot = 100 exp(-pi zeta / sqrt(1 - zeta^2)) %, peak time = pi / omega_d', (zeta) => {
    const r = modelTransitions(stepFit(zeta));
    const wd = OMEGA0 * Math.sqrt(1 - zeta * zeta);
    expect(r.reason).toBeNull();
    expect(r.metrics!.overshoot.value).toBeCloseTo(100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 9);
    expect(r.metrics!.peakTime!.value * wd).toBeCloseTo(Math.PI, 9);
  });

  // sigma_OS = |dOS/dzeta| sigma_zeta with zeta = alpha / omega0 (derived from the relation above).
  it.each([0.1, 0.3, 0.7])('zeta %s: overshoot standard error follows from the relation and the alpha/omega0 covariance', (zeta) => {
    const fit = stepFit(zeta);
    const ra = fit.alpha.stderr! / fit.alpha.value;
    const rw = fit.omega0.stderr! / fit.omega0.value;
    const sigmaZeta = zeta * Math.sqrt(ra * ra + rw * rw - 2 * 0.3 * ra * rw);
    const s = Math.sqrt(1 - zeta * zeta);
    const slope = 100 * Math.exp((-Math.PI * zeta) / s) * (Math.PI / (s * s * s));
    expect(modelTransitions(fit).metrics!.overshoot.stderr! / (slope * sigmaZeta)).toBeCloseTo(1, 4);
  });

  // 2 % settling near 4 / (zeta omega0), the envelope rule (same textbook, from memory): a rough bound only.
  it.each([0.1, 0.2, 0.3, 0.5, 0.7])('zeta %s: 2 %% settling time within 20 %% of 4 / (zeta omega0)', (zeta) => {
    const settle = modelTransitions(stepFit(zeta)).metrics!.settlingTime2.value;
    expect(Math.abs(settle / (4 / (zeta * OMEGA0)) - 1)).toBeLessThan(0.2);
  });
});

describe('modelTransitions against the sampled closed form (IEEE Std 181-2011 definitions; clause numbers from memory)', () => {
  it.each([0.1, 0.3, 0.7, 1.0, 2.0])('zeta %s: rise, peak and settling times and overshoot agree to two samples', (zeta) => {
    const fit = stepFit(zeta);
    const r = modelTransitions(fit).metrics!;
    const { m, dt, settle2, settle5 } = sampled(fit);
    expect(Math.abs(r.riseTime!.value - m.riseTime!)).toBeLessThan(2 * dt);
    expect(Math.abs(r.settlingTime2.value - settle2)).toBeLessThan(2 * dt);
    expect(Math.abs(r.settlingTime5.value - settle5)).toBeLessThan(2 * dt);
    expect(r.overshoot.value).toBeCloseTo(m.overshoot!, 4);
    if (zeta >= 1) {
      expect(r.overshoot.value).toBe(0);
      expect(r.peakTime).toBeNull();
    } else expect(Math.abs(r.peakTime!.value - m.peakTime!)).toBeLessThan(2 * dt);
    expect(r.riseTime!.stderr).toBeGreaterThan(0);
    expect(r.settlingTime2.stderr).toBeGreaterThan(0);
  });

  it('measures a falling step the same as the rising one', () => {
    const up = modelTransitions(stepFit(0.3)).metrics!;
    const down = modelTransitions(stepFit(0.3, undefined, { pre: 14, final: 2 })).metrics!;
    expect(down.overshoot.value).toBeCloseTo(up.overshoot.value, 9);
    expect(down.riseTime!.value / up.riseTime!.value).toBeCloseTo(1, 9);
    expect(down.settlingTime2.value / up.settlingTime2.value).toBeCloseTo(1, 9);
  });

  it('carries no standard error when alpha or omega0 has none', () => {
    const fit = { ...stepFit(0.3), omega0: quantity(OMEGA0, null, 'rad/s') };
    const r = modelTransitions(fit).metrics!;
    expect(r.overshoot.stderr).toBeNull();
    expect(r.warnings.join(' ')).toMatch(/no standard error/);
  });
});

describe('modelTransitions: no step', () => {
  it('returns a reason for a ringdown about one level', () => {
    // Inductor current from rest after a voltage step: starts and ends at zero (a = 0, slope b).
    const alpha = 0.1 * OMEGA0;
    const fit: ModelFitInput = {
      ...stepFit(0.1),
      params: { t0: 0, yPre: 0.001, yFinal: 0, alpha, omega0: OMEGA0, a: 0, b: 5e6 },
      preLevel: quantity(0.001, 0.002, 'A'),
      finalValue: quantity(0, 0.002, 'A'),
    };
    const r = modelTransitions(fit);
    expect(r.metrics).toBeNull();
    expect(r.reason).toMatch(/ringdown/);
  });

  it('returns a reason for a failed fit', () => {
    expect(modelTransitions({ ...stepFit(0.3), status: 'failed' }).reason).toMatch(/failed/);
  });

  it('returns a reason, and stays within memory, for a ring that all but never decays (alpha at its floor)', () => {
    // A growing oscillation fitted with alpha held at its lower bound: following every turning point
    // until the ring settles would take about 1e14 of them.
    const r = modelTransitions(stepFit(1e-9));
    expect(r.metrics).toBeNull();
    expect(r.reason).toMatch(/half periods before it settles/);
  });
});

describe('a fit whose start was free (a jump at the event, or a finite edge)', () => {
  it('gives no model rise time, saying why, and keeps the metrics the ring after the start fixes', () => {
    const held = modelTransitions(stepFit(0.2));
    const free = modelTransitions({ ...stepFit(0.2), jumpStart: true });
    expect(held.metrics?.riseTime).not.toBeNull();
    expect(free.metrics?.riseTime).toBeNull();
    expect(free.metrics?.warnings.join(' ')).toMatch(/fitted freely.*rise time is not the record's/);
    expect(free.metrics?.overshoot).toEqual(held.metrics?.overshoot);
    expect(free.metrics?.settlingTime2).toEqual(held.metrics?.settlingTime2);
  });
});
