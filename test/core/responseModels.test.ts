// The response fit's other explanations of a record: no response at all, a single decay, a start that jumps.
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { deriveComponents } from '../../core/workflow/measuredComponents';
import { CircuitInputError } from '../../core/circuit/errors';
import { firstOrderShape, generatedTrace, secondOrderShape } from './trust/responseRecords';
import { coefficientsFromInitial } from '../../core/response/secondOrder';

const rcStep = () =>
  generatedTrace({ seed: 31, samples: 1500, dt: 1e-9, noise: 0.02 }, firstOrderShape({ t0: 200e-9, yPre: 0, yStart: 0, yFinal: 5, tau: 150e-9 }));

describe('a record with no response', () => {
  it('ends with status no-response and says so, with the level and no ring', () => {
    const fit = fitResponse(generatedTrace({ seed: 32, samples: 2000, dt: 1e-9, noise: 0.01 }, (time) => time.map(() => 3.3)));
    expect(fit.status).toBe('no-response');
    expect(fit.message).toBe('no second-order response found');
    expect(fit.regimeEvidence).toMatch(/constant level explains the record/);
    expect(fit.finalValue.value).toBeCloseTo(3.3, 2);
    expect(fit.omega0.value).toBeNaN();
    expect(fit.tau).toBeUndefined();
  });

  it('a ring on a baseline drifting by half its amplitude fails, saying that neither the response nor a level explains it (it was "no response")', () => {
    const alpha = 1e5;
    const omega = 2 * Math.PI * 2e6;
    const trace = generatedTrace({ seed: 33, samples: 3000, dt: 1e-8, noise: 0.01 }, (time) =>
      time.map((t, i) => (t >= 3e-6 ? Math.exp(-alpha * (t - 3e-6)) * Math.cos(omega * (t - 3e-6)) : 0) + (0.5 * i) / time.length),
    );
    const fit = fitResponse(trace);
    expect(fit.status).toBe('failed');
    expect(fit.message).toMatch(/^neither a second-order response nor a constant level explains the record: the level leaves [\d.]+ times the noise/);
  });
});

describe('a record whose every sample holds one value (a probe off, or the wrong channel)', () => {
  it.each([
    ['zero', 0],
    ['a level', 2.5],
  ])('at %s: status no-response saying it is a flat line, the level with no spread, no ring', (_, level) => {
    const time = Float64Array.from({ length: 2500 }, (_, i) => i * 2e-9);
    const fit = fitResponse({ time, values: new Float64Array(time.length).fill(level), unit: 'V' });
    expect(fit.status).toBe('no-response');
    expect(fit.message).toBe('no second-order response found: every usable sample holds one value (a flat line: a disconnected probe, the wrong channel, or a window that misses the response?)');
    expect(fit.finalValue.value).toBe(level);
    expect(fit.finalValue.stderr).toBe(0);
    expect(fit.omega0.value).toBeNaN();
  });
});

describe('a first-order record (an RC step)', () => {
  it('is fitted as a single decay: tau with its standard error, no ring quantities', () => {
    const fit = fitResponse(rcStep());
    expect(fit.status).toBe('converged');
    expect(fit.regime).toBe('first-order');
    // Truth 150 ns (the generator's tau); within 3 standard errors.
    expect(fit.tau?.unit).toBe('s');
    expect(Math.abs((fit.tau?.value ?? NaN) - 150e-9)).toBeLessThan(3 * (fit.tau?.stderr ?? 0));
    for (const ring of [fit.alpha, fit.omega0, fit.zeta, fit.Q]) expect(ring).toMatchObject({ value: NaN, stderr: null });
    expect(fit.omegaD).toBeNull();
    const json = JSON.parse(JSON.stringify(fit));
    expect(json.tau.value).toBeCloseTo(150e-9, 8);
    expect(json.omega0.value).toBeNull();
  });
  it('gives no R, L or C: one time constant cannot give two parts', () => {
    const fit = fitResponse(rcStep());
    expect(() => deriveComponents(fit, { topology: 'series', known: { name: 'C', value: 1e-9 } })).toThrow(CircuitInputError);
    expect(() => deriveComponents(fit, { topology: 'series', known: { name: 'C', value: 1e-9 } })).toThrow(/only tau is reported/);
  });
});

describe('a step that starts as an instant step would', () => {
  // The ideal step of the finite-edge trust rows (trust/cases/finiteEdge.ts): 5 MHz, zeta 0.08, 10 V, 37 dB.
  const omega0 = (2 * Math.PI * 5e6) / Math.sqrt(1 - 0.08 * 0.08);
  const alpha = 0.08 * omega0;
  const { a, b } = coefficientsFromInitial(0, 0, 10, alpha);
  it('keeps the start held to the level before: the free start is not taken, and no warning says the start bends', () => {
    for (const seed of [711, 712, 713, 714, 715]) {
      const fit = fitResponse(generatedTrace({ seed, samples: 4000, dt: 1e-9, noise: 0.1 }, secondOrderShape({ t0: 500e-9, yPre: 0, yFinal: 10, alpha, omega0, a, b })));
      expect(fit.jumpStart).toBeUndefined();
      expect(fit.warnings.join(' ')).not.toMatch(/instant step/);
    }
  });
});

describe('a response that jumps at the event', () => {
  // A capacitor's current after a current step: I e^(-alpha t) (cos omega_d t - (alpha / omega_d) sin omega_d t).
  const alpha = 2e6;
  const omega0 = 2 * Math.PI * 5e6;
  const trace = generatedTrace({ seed: 33, samples: 2000, dt: 1e-9, noise: 0.01 }, secondOrderShape({ t0: 200e-9, yPre: 0, yFinal: 0, alpha, omega0, a: 1, b: -alpha }));
  const within3Sigma = (q: { value: number; stderr: number | null }, truth: number) => Math.abs(q.value - truth) <= 3 * (q.stderr ?? 0);

  it('is found without being told, and alpha and omega0 are right', () => {
    const fit = fitResponse(trace);
    expect(fit.jumpStart).toBe(true);
    expect(fit.warnings.join(' ')).toMatch(/jumps at the event/);
    expect(within3Sigma(fit.alpha, alpha)).toBe(true);
    expect(within3Sigma(fit.omega0, omega0)).toBe(true);
  });
  it('is fitted the same when stated', () => {
    const fit = fitResponse(trace, { continuity: 'free' });
    expect(fit.jumpStart).toBe(true);
    expect(within3Sigma(fit.alpha, alpha)).toBe(true);
  });
  it('is not looked for when the quantity is stated continuous', () => {
    const fit = fitResponse(trace, { continuity: 'continuous' });
    expect(fit.jumpStart).toBeUndefined();
  });
});
