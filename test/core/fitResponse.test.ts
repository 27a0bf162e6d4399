// Recovery of known responses (all regimes, with and without pre-trigger) with seeded noise.
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { evaluateResponse, coefficientsFromInitial, type ResponseParams } from '../../core/response/secondOrder';
import { createRandom } from '../../core/random';

interface Case {
  name: string;
  zeta: number;
  omega0: number;
  /** Fraction of the record before the event. */
  pre: number;
  kind: 'step' | 'ringdown';
  samples: number;
  snrDb: number;
}

function synthesize(c: Case, seed: number) {
  const alpha = c.zeta * c.omega0;
  const slowest = c.zeta < 1 ? alpha : alpha - Math.sqrt(alpha * alpha - c.omega0 * c.omega0);
  const duration = (6 / slowest) / (1 - c.pre);
  const dt = duration / c.samples;
  const t0 = c.pre * duration;
  const time = Float64Array.from({ length: c.samples }, (_, i) => i * dt);
  const step = c.kind === 'step';
  const yPre = step ? 0.5 : 3;
  const yFinal = step ? 12.5 : 0;
  const { a, b } = step ? coefficientsFromInitial(yPre, 0, yFinal, alpha) : coefficientsFromInitial(yPre, -2 * c.omega0, yFinal, alpha);
  const truth: ResponseParams = { t0, yPre, yFinal, alpha, omega0: c.omega0, a, b };
  const clean = evaluateResponse(truth, time);
  const amplitude = Math.abs(yFinal - yPre) || Math.abs(a);
  const sigma = (amplitude / Math.SQRT2) * 10 ** (-c.snrDb / 20);
  const random = createRandom(seed);
  const values = clean.map((v) => v + sigma * random.normal());
  return { trace: { time, values, unit: 'V' }, truth, sigma };
}

const CASES: Case[] = [
  { name: 'lightly damped step with pre-trigger', zeta: 0.05, omega0: 2 * Math.PI * 1e6, pre: 0.2, kind: 'step', samples: 5000, snrDb: 40 },
  { name: 'moderately damped step', zeta: 0.3, omega0: 2 * Math.PI * 50e3, pre: 0.1, kind: 'step', samples: 3000, snrDb: 40 },
  { name: 'critically damped step', zeta: 1, omega0: 1e5, pre: 0.1, kind: 'step', samples: 3000, snrDb: 50 },
  { name: 'overdamped step', zeta: 3, omega0: 1e4, pre: 0.15, kind: 'step', samples: 3000, snrDb: 50 },
  { name: 'ringdown from the first sample', zeta: 0.02, omega0: 2 * Math.PI * 20e6, pre: 0, kind: 'ringdown', samples: 4000, snrDb: 35 },
  { name: 'long record, decimated for the fit', zeta: 0.1, omega0: 2 * Math.PI * 100e3, pre: 0.1, kind: 'step', samples: 200000, snrDb: 30 },
  // The step stands only ~4 noise levels clear: the pre-trigger is found on block means.
  { name: 'noisy step (10 dB), pre-trigger found on block means', zeta: 0.15, omega0: 2 * Math.PI * 200e3, pre: 0.3, kind: 'step', samples: 3000, snrDb: 10 },
  // Noise would make the ring period look a few samples long; the record must still be decimated.
  { name: 'noisy long ringdown from rest (12 dB)', zeta: 0.4, omega0: 2 * Math.PI * 20e3, pre: 0.3, kind: 'ringdown', samples: 100000, snrDb: 12 },
];

describe('fitResponse recovers known parameters', () => {
  for (const c of CASES) {
    it(c.name, () => {
      const { trace, truth } = synthesize(c, 7);
      const fit = fitResponse(trace);
      expect(fit.status).not.toBe('failed');
      for (const [q, true_] of [
        [fit.alpha, truth.alpha],
        [fit.omega0, truth.omega0],
      ] as const) {
        expect(q.stderr).not.toBeNull();
        expect(Math.abs(q.value - true_)).toBeLessThan(4 * (q.stderr as number));
      }
      if (c.zeta < 0.9) expect(fit.regime).toBe('underdamped');
      if (c.zeta > 1.5) expect(fit.regime).toBe('overdamped');
      expect(Math.abs(fit.finalValue.value - truth.yFinal)).toBeLessThan(4 * (fit.finalValue.stderr ?? 0) + 1e-9);
      if (c.pre > 0) expect(Math.abs(fit.t0.value - truth.t0)).toBeLessThan(4 * (fit.t0.stderr ?? 0) + 1e-12);
      if (c.samples > 3000) expect(fit.decimation?.factor ?? 1).toBeGreaterThan(1);
    });
  }
});

describe('fitResponse reads the noise of block means', () => {
  // 4000 samples, about 130 a ring period, fitted on means of 4: the ring's curvature fills the means' second differences.
  it('within 20 % of the means\' own noise for a strong ring (50 dB), where second differences read it twice', () => {
    const c: Case = { name: 'strong finely sampled ring', zeta: 0.02, omega0: 2 * Math.PI * 4e6, pre: 0.1, kind: 'step', samples: 4000, snrDb: 50 };
    for (const seed of [1, 2, 3]) {
      const { trace, sigma } = synthesize(c, seed);
      const fit = fitResponse(trace);
      const factor = fit.decimation?.factor ?? 1;
      expect(factor).toBeGreaterThan(1);
      const meansNoise = sigma / Math.sqrt(factor);
      expect(fit.noiseRms / meansNoise).toBeLessThan(1.2);
      expect(fit.noiseRms / meansNoise).toBeGreaterThan(0.85);
    }
  });
});

describe('fitResponse finds the event of a weak ring about its starting level', () => {
  it('a loop current ringing from zero at 15 dB (peak-to-peak over noise): found by block energy, not block means', () => {
    const omega0 = 2 * Math.PI * 1e6;
    const alpha = 0.015 * omega0;
    const n = 2000;
    const dt = 1 / (16 * 1e6); // 16 samples a ring period
    const t0 = 250.3 * dt;
    const time = Float64Array.from({ length: n }, (_, i) => i * dt);
    const { a, b } = coefficientsFromInitial(0, 2e6, 0, alpha);
    const truth: ResponseParams = { t0, yPre: 0, yFinal: 0, alpha, omega0, a, b };
    const clean = evaluateResponse(truth, time);
    const swing = Math.max(...clean) - Math.min(...clean);
    const random = createRandom(466);
    const values = clean.map((v) => v + swing * 10 ** (-15 / 20) * random.normal());
    const fit = fitResponse({ time, values, unit: 'A' });
    expect(fit.warnings.join(' ')).not.toMatch(/t0 was not fitted/);
    expect(Math.abs(fit.t0.value - t0)).toBeLessThan(4 * (fit.t0.stderr as number));
    expect(Math.abs(fit.omega0.value - omega0)).toBeLessThan(3 * (fit.omega0.stderr as number));
    expect(Math.abs(fit.alpha.value - alpha)).toBeLessThan(3 * (fit.alpha.stderr as number));
  });
});

describe('fitResponse reports what it could not do', () => {
  it('says t0 was not fitted when the record starts inside the response', () => {
    const { trace } = synthesize(CASES[4], 3);
    const fit = fitResponse(trace);
    expect(fit.t0.stderr).toBeNull();
    expect(fit.warnings.join(' ')).toMatch(/t0 was not fitted/);
  });
  it('refuses a window with too few samples', () => {
    const { trace } = synthesize(CASES[1], 3);
    expect(() => fitResponse(trace, { window: { start: 0, end: trace.time[10] } })).toThrow(/usable samples/);
  });
  it('names the window and the record when the window misses the record', () => {
    const time = Float64Array.from({ length: 500 }, (_, i) => (i - 100) * 1e-9);
    const values = time.map((t) => (t < 0 ? 0 : 1 - Math.exp(-t / 50e-9)));
    expect(() => fitResponse({ time, values, unit: 'V' }, { window: { start: 1e-6 } })).toThrow(
      'only 0 usable samples in the fit window (from 1 µs to the end; the record runs from -100 ns to 399 ns); at least 20 are needed',
    );
  });
  it('warns when the data are not a second-order response', () => {
    const time = Float64Array.from({ length: 2000 }, (_, i) => i * 1e-6);
    const random = createRandom(11);
    const values = time.map((t) => (t > 2e-4 ? 1 : 0) + 0.3 * Math.sign(Math.sin(2 * Math.PI * 5e3 * t)) + 0.001 * random.normal());
    const fit = fitResponse({ time, values, unit: 'V' });
    expect(fit.status !== 'converged' || fit.warnings.some((w) => /residual of/.test(w))).toBe(true);
  });
});
