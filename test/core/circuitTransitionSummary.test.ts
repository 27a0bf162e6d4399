// summarizeTransitions on simulated scope captures (seeded noise, 8-bit codes, a pre-trigger, the way
// sample-captures/ are made): model metrics recover the truth, the fitted levels remove the level bias.
import { describe, expect, it } from 'vitest';
import { histogramStateLevels } from '../../core/circuit/stateLevels';
import { summarizeTransitions } from '../../core/circuit/transitionSummary';
import { transitionMetrics } from '../../core/circuit/transitions';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { evaluateResponse, type ResponseParams } from '../../core/response/secondOrder';
import { digitise } from '../../sample-captures/scopeModel';

const OMEGA0 = 55936.67;
const STEP = 48;
const SCOPE = { perDivision: 10, center: 40, noiseRms: 0.3 };

function capture(zeta: number, seed: number) {
  const alpha = zeta * OMEGA0;
  const slow = zeta < 1 ? alpha : alpha - Math.sqrt(alpha * alpha - OMEGA0 * OMEGA0);
  // About 11 time constants of the slowest decay after a 10 % pre-trigger.
  const n = 2500;
  const dt = 11 / slow / (0.9 * n);
  const time = Float64Array.from({ length: n }, (_, i) => (i - 250) * dt);
  const truth: ResponseParams = { t0: -1.1 * dt, yPre: 0, yFinal: STEP, alpha, omega0: OMEGA0, a: -STEP, b: -STEP * alpha };
  const clean = evaluateResponse(truth, time);
  const { values } = digitise(clean, SCOPE, createRandom(seed));
  return { time, values, clean, truth, dt };
}

/** The clean closed form, sampled 50 times finer and measured by the IEEE 181 definitions. */
function truthMetrics(p: ResponseParams, dt: number, n: number) {
  const time = Float64Array.from({ length: 50 * n }, (_, i) => p.t0 + (i * dt) / 50);
  const m = transitionMetrics(time, evaluateResponse(p, time), { initial: p.yPre, final: p.yFinal, eventTime: p.t0 });
  return { ...m, settle2: m.settlingTime2! + m.instants.t50! - p.t0, settle5: m.settlingTime5! + m.instants.t50! - p.t0 };
}

describe('summarizeTransitions on simulated captures', () => {
  it.each([
    { zeta: 0.1, seed: 1 },
    { zeta: 0.3, seed: 2 },
    { zeta: 0.7, seed: 3 },
    { zeta: 1.0, seed: 4 },
    { zeta: 2.0, seed: 5 },
  ])('zeta $zeta: model metrics within 4 standard errors of the truth', ({ zeta, seed }) => {
    const c = capture(zeta, seed);
    const fit = fitResponse({ time: c.time, values: c.values, unit: 'V' });
    const s = summarizeTransitions(c, fit);
    const truth = truthMetrics(c.truth, c.dt, c.time.length);
    expect(s.reason).toBeNull();
    expect(s.levelMethod).toBe('fitted model');
    const model = s.model!;
    const within = (q: { value: number; stderr: number | null }, target: number, floor: number) =>
      expect(Math.abs(q.value - target), `${q.value} vs ${target} (stderr ${q.stderr})`).toBeLessThan(4 * q.stderr! + floor);
    // A floor of one fiftieth of a sample interval for the finely sampled truth.
    within(model.riseTime!, truth.riseTime!, c.dt / 50);
    within(model.settlingTime5, truth.settle5, c.dt / 50);
    within(model.overshoot, truth.overshoot!, 1e-3);
    if (zeta < 1) {
      within(model.peakTime!, truth.peakTime!, c.dt / 50);
      within(model.settlingTime2, truth.settle2, c.dt / 50);
      // The parabola through the peak's samples: the data-based overshoot, unlifted by the noise.
      within(s.measured!.peakOvershoot!, truth.overshoot!, 0.05);
    } else {
      expect(model.peakTime).toBeNull();
      expect(model.overshoot.value).toBe(0);
    }
    expect(JSON.parse(JSON.stringify(s))).toEqual(s);
  });

  it('returns a reason, and no metrics, for a ringdown about one level', () => {
    const alpha = 0.1 * OMEGA0;
    const n = 2500;
    const dt = 11 / alpha / (0.9 * n);
    const time = Float64Array.from({ length: n }, (_, i) => (i - 250) * dt);
    const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 0, alpha, omega0: OMEGA0, a: 0, b: 30 * OMEGA0 }, time);
    const { values } = digitise(clean, { perDivision: 10, center: 0, noiseRms: 0.3 }, createRandom(9));
    const s = summarizeTransitions({ time, values }, fitResponse({ time, values, unit: 'A', name: 'coil' }));
    expect(s.reason).toMatch(/ringdown/);
    expect(s.measured).toBeNull();
    expect(s.model).toBeNull();
  });

  it('measures no sample peak when samples after the event sit at a rail (their values are not the waveform)', () => {
    const c = capture(0.3, 5);
    const rail = STEP * 1.2;
    const values = Float64Array.from(c.values, (v) => Math.min(v, rail));
    const clipped = Uint8Array.from(c.values, (v) => (v >= rail ? 1 : 0));
    expect(clipped.some((f) => f === 1)).toBe(true);
    const fit = fitResponse({ time: c.time, values, clipped, unit: 'V' });
    const s = summarizeTransitions({ time: c.time, values, clipped }, fit);
    expect(s.measured!.overshoot).toBeNull();
    expect(s.measured!.peakTime).toBeNull();
    expect(s.measured!.peakOvershoot).toBeNull();
    expect(s.measured!.riseTime).not.toBeNull();
    expect(s.warnings.join(' ')).toMatch(/sit at a rail/);
    // The model's overshoot stands, near the truth for zeta 0.3 (exp(-pi zeta / sqrt(1 - zeta^2)) = 37.2 %).
    expect(s.model!.overshoot.value).toBeCloseTo(100 * Math.exp((-Math.PI * 0.3) / Math.sqrt(1 - 0.09)), 0);
  });

  it('measures no step metrics from a record or a window that starts after the step (its start level and instant are unknown)', () => {
    const c = capture(0.3, 6);
    // Caught 9 samples after the event: the model's value at the first sample is 15 % of the step, not 0, and its
    // overshoot relative to that read 43 % for the true 37 % (with a standard error of 0.15 %).
    const late = { time: c.time.subarray(260), values: c.values.subarray(260) };
    const fromLate = fitResponse({ ...late, unit: 'V' });
    expect(fromLate.status).toBe('converged');
    expect(fromLate.startsInResponse).toBe(true);
    const s = summarizeTransitions(late, fromLate);
    expect(s.reason).toMatch(/starts inside the response/);
    expect(s.measured).toBeNull();
    expect(s.model).toBeNull();
    // The same through a window set by hand after the event, on the whole record.
    const windowed = fitResponse({ time: c.time, values: c.values, unit: 'V' }, { window: { start: c.time[260] } });
    expect(windowed.startsInResponse).toBe(true);
    expect(summarizeTransitions(c, windowed).reason).toMatch(/starts inside the response/);
    // With the event in the record, the flag is absent and the metrics are measured.
    const whole = fitResponse({ time: c.time, values: c.values, unit: 'V' });
    expect(whole.startsInResponse).toBeUndefined();
    expect(summarizeTransitions(c, whole).reason).toBeNull();
  });
});

describe('state levels at zeta 0.3 (12 seeds)', () => {
  // Before: the largest sample picks up about +0.8 percentage points of noise whatever the levels; the
  // histogram-mode final level adds its own scatter (0.07 V rms before the modal-bin neighbours were used).
  it('the fitted levels are at the truth, the histogram levels close to it, and the parabola peak unbiased', () => {
    const errors = { histogram: [] as number[], fitted: [] as number[], lift: [] as number[], parabola: [] as number[] };
    const truth = 100 * Math.exp((-Math.PI * 0.3) / Math.sqrt(1 - 0.09));
    for (let seed = 1; seed <= 12; seed++) {
      const c = capture(0.3, 100 + seed);
      const fit = fitResponse({ time: c.time, values: c.values, unit: 'V' });
      const s = summarizeTransitions(c, fit);
      errors.histogram.push(histogramStateLevels(c.values).final - STEP);
      errors.fitted.push(s.levels.final - STEP);
      errors.lift.push(s.measured!.overshoot! - truth);
      errors.parabola.push(s.measured!.peakOvershoot!.value - truth);
    }
    const mean = (x: number[]) => x.reduce((a, b) => a + b, 0) / x.length;
    const rms = (x: number[]) => Math.sqrt(mean(x.map((v) => v * v)));
    expect(rms(errors.fitted)).toBeLessThan(0.02);
    expect(rms(errors.histogram)).toBeLessThan(0.05);
    expect(mean(errors.lift)).toBeGreaterThan(0.5);
    expect(Math.abs(mean(errors.parabola))).toBeLessThan(0.1);
  });
});
