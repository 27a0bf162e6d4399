// Transition metrics of synthetic underdamped steps (closed form) against the textbook
// second-order step relations. Source for the relations: Dorf and Bishop, Modern Control Systems,
// section on the second-order step response (from memory for the section), as listed in
// shared/reference/trade-facts.md. Metric definitions: IEEE Std 181-2011 (clause numbers from memory).
import { describe, expect, it } from 'vitest';
import { transitionMetrics } from '../../core/circuit/transitions';
import { evaluateResponse } from '../../core/response/secondOrder';

const OMEGA0 = 2 * Math.PI * 1e6;
const ZETAS = [0.05, 0.1, 0.2, 0.3, 0.5, 0.7];

function unitStep(zeta: number) {
  const alpha = zeta * OMEGA0;
  const wd = OMEGA0 * Math.sqrt(1 - zeta * zeta);
  const dt = (2 * Math.PI) / wd / 4000;
  const tEnvelope = Math.log(1 / (0.02 * Math.sqrt(1 - zeta * zeta))) / alpha;
  const n = Math.ceil((1.5 * tEnvelope + 2e-6) / dt);
  const time = Float64Array.from({ length: n }, (_, i) => -1e-6 + i * dt);
  // v_C of a series loop after a unit step: y(0+) = 0, y'(0+) = 0.
  const values = evaluateResponse({ t0: 0, yPre: 0, yFinal: 1, alpha, omega0: OMEGA0, a: -1, b: -alpha }, time);
  return { alpha, wd, dt, tEnvelope, metrics: transitionMetrics(time, values, { initial: 0, final: 1, eventTime: 0 }) };
}

describe('second-order step relations (Dorf and Bishop, second-order step response; from memory)', () => {
  it.each(ZETAS)('zeta %s: overshoot = 100 exp(-pi zeta / sqrt(1 - zeta^2)) %', (zeta) => {
    const { metrics } = unitStep(zeta);
    expect(metrics.overshoot!).toBeCloseTo(100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 4);
  });

  it.each(ZETAS)('zeta %s: peak time = pi / omega_d (to one sample)', (zeta) => {
    const { metrics, wd, dt } = unitStep(zeta);
    expect(Math.abs(metrics.peakTime! - Math.PI / wd)).toBeLessThanOrEqual(dt);
  });

  // The first undershoot is the next extremum, at 2 pi / omega_d (derived from the same closed form).
  it.each(ZETAS)('zeta %s: undershoot = 100 exp(-2 pi zeta / sqrt(1 - zeta^2)) % (derived)', (zeta) => {
    const { metrics } = unitStep(zeta);
    expect(metrics.undershoot!).toBeCloseTo(100 * Math.exp((-2 * Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 4);
  });

  it.each(ZETAS)('zeta %s: ring frequency from the final-level crossings = omega_d / 2 pi (derived)', (zeta) => {
    const { metrics, wd } = unitStep(zeta);
    expect(metrics.ringFrequency! / (wd / (2 * Math.PI)) - 1).toBeCloseTo(0, 5);
  });

  // 2 % settling about 4 / (zeta omega0): a bound-style check. The error e^(-alpha t) cos(...) /
  // sqrt(1 - zeta^2) stays under its envelope, which reaches 2 % at tEnvelope, and touches the
  // envelope every pi / omega_d; so the settling instant (from the event) lies in
  // [tEnvelope - pi / omega_d, tEnvelope] (derived). 4 / (zeta omega0) approximates tEnvelope
  // (ln 50 = 3.91, plus -ln sqrt(1 - zeta^2)) to 10 % for zeta <= 0.7.
  it.each(ZETAS)('zeta %s: 2 %% settling lies under the envelope bound and near 4 / (zeta omega0)', (zeta) => {
    const { metrics, wd, tEnvelope, dt } = unitStep(zeta);
    const fromEvent = metrics.settlingTime2! + metrics.instants.t50!;
    expect(fromEvent).toBeLessThanOrEqual(tEnvelope + dt);
    expect(fromEvent).toBeGreaterThanOrEqual(tEnvelope - Math.PI / wd - dt);
    const rule = 4 / (zeta * OMEGA0);
    expect(Math.abs(tEnvelope / rule - 1)).toBeLessThan(0.1);
    expect(fromEvent).toBeLessThanOrEqual(1.1 * rule);
    expect(fromEvent).toBeGreaterThanOrEqual(0.9 * rule - Math.PI / wd);
  });
});
