// fitCurve and covarianceFromJacobian: recovery with seeded noise, exact linear covariance, degeneracy, bounds, bad input.

import { describe, expect, it } from 'vitest';

import { covarianceFromJacobian } from '../../core/fit/covariance';
import { fitCurve } from '../../core/fit/fitCurve';
import { FitInputError } from '../../core/fit/fitInputError';
import type { CurveData, CurveModel, FitOptions } from '../../core/fit/types';
import { createRandom } from '../../core/random';

/** The project's seeded source, as a uniform generator on [0, 1). */
const seeded = (seed: number): (() => number) => {
  const random = createRandom(seed);
  return () => random.uniform();
};

/** Standard normal deviates by Box-Muller from a seeded uniform source. */
function gaussian(seed: number): () => number {
  const uniform = seeded(seed);
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

const linspace = (from: number, to: number, n: number) => Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));

function noisy(model: CurveModel, truth: number[], x: number[], sigma: number, seed: number): CurveData {
  const normal = gaussian(seed);
  return { x, y: x.map((xi) => model.evaluate(truth, xi) + sigma * normal()) };
}

const discharge: CurveModel = {
  names: ['v0', 'tau', 'offset'],
  evaluate: ([v0, tau, offset], t) => v0 * Math.exp(-t / tau) + offset,
};
const pulse: CurveModel = {
  names: ['height', 'centre', 'width'],
  evaluate: ([h, c, w], t) => h * Math.exp(-((t - c) ** 2) / (2 * w * w)),
};
const delayedStep: CurveModel = {
  names: ['level', 't0', 'tau'],
  evaluate: ([level, t0, tau], t) => (t < t0 ? 0 : level * (1 - Math.exp(-(t - t0) / tau))),
};

describe('fitCurve recovers known parameters with honest uncertainties', () => {
  const SEEDS = 30;
  const table = [
    {
      case: 'exponential: snubber capacitor discharging into a 0.3 V offset (offset starts at 0)',
      model: discharge,
      truth: [12, 2.2e-6, 0.3],
      initial: [10, 1.5e-6, 0],
      x: linspace(0, 10e-6, 200),
      sigma: 0.05,
    },
    {
      case: 'Gaussian peak: gate-drive current pulse',
      model: pulse,
      truth: [1.8, 5e-6, 4e-7],
      initial: [1.5, 4.8e-6, 6e-7],
      x: linspace(3e-6, 7e-6, 160),
      sigma: 0.02,
    },
    {
      case: 'delayed first-order step: LC filter output behind a 100 ns delay (t0 starts at 0)',
      model: delayedStep,
      truth: [2.5, 1e-7, 8e-7],
      initial: [2, 0, 5e-7],
      x: linspace(-1e-6, 4e-6, 120),
      sigma: 0.01,
    },
  ];

  it.each(table)('$case', ({ model, truth, initial, x, sigma }) => {
    const pulls = truth.map(() => [] as number[]);
    const reduced: number[] = [];
    for (let seed = 1; seed <= SEEDS; seed++) {
      const result = fitCurve(model, noisy(model, truth, x, sigma, seed), initial);
      expect(result.status, result.message).toBe('converged');
      expect(result.warnings).toEqual([]);
      result.parameters.forEach((p, j) => {
        expect(p.stderr).not.toBeNull();
        pulls[j].push((p.value - truth[j]) / p.stderr!);
      });
      reduced.push(result.reducedChiSquare);
    }
    // Each estimate within 4.5 sigma; over 30 seeds the rms pull of each parameter near 1.
    for (const series of pulls) {
      expect(Math.max(...series.map(Math.abs))).toBeLessThan(4.5);
      const rms = Math.sqrt(series.reduce((s, v) => s + v * v, 0) / series.length);
      expect(rms).toBeGreaterThan(0.6);
      expect(rms).toBeLessThan(1.5);
    }
    const meanReduced = reduced.reduce((s, v) => s + v, 0) / reduced.length;
    expect(meanReduced / sigma ** 2).toBeGreaterThan(0.9);
    expect(meanReduced / sigma ** 2).toBeLessThan(1.1);
  });
});

describe('a straight line gets the closed-form weighted least-squares covariance', () => {
  // Weighted straight-line fit, closed form (common practice): with S = sum w, Sx = sum w x,
  // Sxx = sum w x^2, D = S Sxx - Sx^2: var(a) = s^2 Sxx / D, var(b) = s^2 S / D,
  // cov(a, b) = -s^2 Sx / D, s^2 = chi^2 / (n - 2).
  const line: CurveModel = { names: ['a', 'b'], evaluate: ([a, b], x) => a + b * x };
  const x = linspace(0, 1e-3, 25);
  const normal = gaussian(7);
  const y = x.map((xi) => 0.4 + 2.5e3 * xi + 0.02 * normal());
  const cases = [
    { case: 'unit weights', weights: undefined },
    { case: 'varying weights', weights: x.map((_, i) => 1 / (0.01 + 0.002 * i) ** 2) },
  ];

  it.each(cases)('$case', ({ weights }) => {
    const w = weights ?? x.map(() => 1);
    const S = w.reduce((s, v) => s + v, 0);
    const Sx = w.reduce((s, v, i) => s + v * x[i], 0);
    const Sxx = w.reduce((s, v, i) => s + v * x[i] ** 2, 0);
    const Sy = w.reduce((s, v, i) => s + v * y[i], 0);
    const Sxy = w.reduce((s, v, i) => s + v * x[i] * y[i], 0);
    const D = S * Sxx - Sx * Sx;
    const a = (Sxx * Sy - Sx * Sxy) / D;
    const b = (S * Sxy - Sx * Sy) / D;
    const chi2 = w.reduce((s, v, i) => s + v * (y[i] - a - b * x[i]) ** 2, 0);
    const s2 = chi2 / (x.length - 2);

    const result = fitCurve(line, { x, y, weights }, [1, 1e3]);
    expect(result.status).toBe('converged');
    expect(result.parameters[0].value).toBeCloseTo(a, 9);
    expect(result.parameters[1].value / b).toBeCloseTo(1, 9);
    expect(result.chiSquare / chi2).toBeCloseTo(1, 9);
    expect(result.degreesOfFreedom).toBe(23);
    expect(result.parameters[0].stderr! / Math.sqrt((s2 * Sxx) / D)).toBeCloseTo(1, 6);
    expect(result.parameters[1].stderr! / Math.sqrt((s2 * S) / D)).toBeCloseTo(1, 6);
    expect(result.covariance![0][1] / ((-s2 * Sx) / D)).toBeCloseTo(1, 6);
    expect(result.correlation![0][1] / (-Sx / Math.sqrt(S * Sxx))).toBeCloseTo(1, 6);
  });
});

describe('covariance that the data cannot support is null, with the reason', () => {
  const x = linspace(1, 5, 9);
  const y = x.map((xi, i) => 1.4 * xi + 0.03 + 0.01 * Math.sin(i));

  it('two parameters that only appear as a product', () => {
    const product: CurveModel = { names: ['a', 'b', 'c'], evaluate: ([a, b, c], t) => a * b * t + c };
    const result = fitCurve(product, { x, y }, [1, 2, 0]);
    expect(result.status).toBe('converged');
    expect(result.parameters[0].value * result.parameters[1].value).toBeCloseTo(1.4, 2);
    expect(result.covariance).toBeNull();
    expect(result.correlation).toBeNull();
    expect(result.parameters.map((p) => p.stderr)).toEqual([null, null, null]);
    expect(result.warnings).toHaveLength(1);
    expect(result.warnings[0]).toMatch(/covariance not estimable: the data do not tell a and b apart \(lost direction -?0\.707 a [+-] 0\.707 b\)/);
    expect(result.warnings[0]).not.toMatch(/\bc\b/);
  });

  it('a parameter the model ignores', () => {
    const ignoring: CurveModel = { names: ['slope', 'unused', 'offset'], evaluate: ([s, , o], t) => s * t + o };
    const result = fitCurve(ignoring, { x, y }, [1, 3, 0.1]);
    expect(result.parameters[1].value).toBe(3);
    expect(result.covariance).toBeNull();
    expect(result.warnings[0]).toMatch(/do not determine unused \(the model barely depends on it\)/);
  });
});

describe('bounds', () => {
  const x = linspace(0, 10e-6, 120);
  const data = noisy(discharge, [12, 2.2e-6, 0.3], x, 0.05, 3);

  it('hold a parameter whose optimum lies outside them at the bound, flagged', () => {
    const options: FitOptions = { min: [0, 1e-7, -1], max: [20, 1.5e-6, 1] };
    const result = fitCurve(discharge, data, [10, 1e-6, 0], options);
    expect(result.status, result.message).toBe('converged');
    result.parameters.forEach((p, j) => {
      expect(p.value).toBeGreaterThanOrEqual(options.min![j]);
      expect(p.value).toBeLessThanOrEqual(options.max![j]);
    });
    expect(result.parameters[1].value).toBe(1.5e-6);
    expect(result.parameters.map((p) => p.atBound)).toEqual([false, true, false]);
    expect(result.warnings).toContainEqual(expect.stringMatching(/^tau sits at its upper bound/));
  });

  it.each([
    { case: 'started inside', start: 0.5 },
    { case: 'started on the bound', start: 0 },
  ])('never show the model a value beyond them ($case)', ({ start }) => {
    // sqrt(g) needs g >= 0 and the best g for these falling data is negative: the fit must stop at 0.
    const root: CurveModel = {
      names: ['g', 'offset'],
      evaluate: ([g, o], t) => {
        if (g < 0) throw new RangeError(`model evaluated at g = ${g}`);
        return Math.sqrt(g) * t + o;
      },
    };
    const falling = { x: linspace(0, 1, 11), y: linspace(0, 1, 11).map((t) => 1 - 0.5 * t) };
    const result = fitCurve(root, falling, [start, 0.5], { min: [0, -Infinity] });
    expect(result.status, result.message).toBe('converged');
    expect(result.parameters[0].value).toBe(0);
    expect(result.parameters[0].atBound).toBe(true);
    expect(result.parameters[1].value).toBeCloseTo(0.75, 6);
  });

  it('change nothing when the optimum is inside them', () => {
    const free = fitCurve(discharge, data, [10, 1.5e-6, 0]);
    const boxed = fitCurve(discharge, data, [10, 1.5e-6, 0], { min: [0, 1e-7, -1], max: [20, 1e-5, 1] });
    boxed.parameters.forEach((p, j) => {
      expect(p.value / free.parameters[j].value).toBeCloseTo(1, 7);
      expect(p.atBound).toBe(false);
    });
  });
});

describe('states that are not errors', () => {
  const x = linspace(0, 10e-6, 60);
  const data = noisy(discharge, [12, 2.2e-6, 0.3], x, 0.05, 5);

  it('an iteration limit reached is reported, not thrown', () => {
    const result = fitCurve(discharge, data, [1, 1e-7, 5], { maxIterations: 2 });
    expect(result.status).toBe('max-iterations');
    expect(result.iterations).toBe(2);
    expect(result.message).toMatch(/2 iterations/);
  });

  it('a model that is not finite at the start fails as a state', () => {
    const result = fitCurve({ names: ['k'], evaluate: ([k], t) => Math.log(k) * t }, { x: [1, 2, 3], y: [1, 2, 3] }, [-1]);
    expect(result.status).toBe('failed');
    expect(result.message).toMatch(/not finite at the initial parameters/);
    expect(result.parameters[0]).toEqual({ name: 'k', value: -1, stderr: null, atBound: false });
  });

  it('without the covariance asked for, the same minimum and no standard errors', () => {
    const full = fitCurve(discharge, data, [10, 1.5e-6, 0]);
    const bare = fitCurve(discharge, data, [10, 1.5e-6, 0], { covariance: false });
    expect(bare.parameters.map((p) => p.value)).toEqual(full.parameters.map((p) => p.value));
    expect(bare.parameters.every((p) => p.stderr === null)).toBe(true);
    expect(bare.covariance).toBeNull();
    expect(full.parameters.every((p) => p.stderr !== null && p.stderr > 0)).toBe(true);
  });

  it('a model that evaluates whole vectors gives what its point evaluation gives', () => {
    const vectorised: CurveModel = {
      ...discharge,
      evaluateAll: (p, xs, out) => xs.forEach((x, i) => (out[i] = discharge.evaluate(p, x))),
    };
    const byPoint = fitCurve(discharge, data, [10, 1.5e-6, 0]);
    const byVector = fitCurve(vectorised, data, [10, 1.5e-6, 0]);
    expect(byVector.parameters).toEqual(byPoint.parameters);
  });

  it('forward-difference trials reach the minimum central ones reach, within the tolerance', () => {
    const central = fitCurve(discharge, data, [10, 1.5e-6, 0]);
    const forward = fitCurve(discharge, data, [10, 1.5e-6, 0], { trialDifferences: 'forward' });
    expect(forward.status).toBe('converged');
    forward.parameters.forEach((p, j) => expect(Math.abs(p.value - central.parameters[j].value)).toBeLessThan(1e-4 * (central.parameters[j].stderr ?? 0)));
    expect(() => fitCurve(discharge, data, [10, 1.5e-6, 0], { trialDifferences: 'backward' as 'forward' })).toThrow(FitInputError);
  });

  it('an error thrown by the model itself reaches the caller', () => {
    const model: CurveModel = {
      names: ['k'],
      evaluate: ([k]) => {
        if (k > 1.5) throw new RangeError('model refuses k > 1.5');
        return k;
      },
    };
    expect(() => fitCurve(model, { x: [1, 2, 3], y: [3, 3, 3] }, [1])).toThrow('model refuses k > 1.5');
  });
});

describe('invalid input throws FitInputError naming what is wrong', () => {
  const line: CurveModel = { names: ['a', 'b'], evaluate: ([a, b], x) => a + b * x };
  const x = [0, 1, 2, 3];
  const y = [1, 3, 5, 7];
  const table: { case: string; run: () => unknown; message: RegExp }[] = [
    { case: 'y shorter than x', run: () => fitCurve(line, { x, y: [1, 2, 3] }, [0, 1]), message: /^data\.y: has 3 values but data\.x has 4/ },
    { case: 'weights of the wrong length', run: () => fitCurve(line, { x, y, weights: [1, 1] }, [0, 1]), message: /^data\.weights: has 2 values/ },
    { case: 'NaN in y', run: () => fitCurve(line, { x, y: [1, NaN, 5, 7] }, [0, 1]), message: /^data\.y\[1\]: NaN is not a finite number/ },
    { case: 'Infinity in x', run: () => fitCurve(line, { x: [0, 1, Infinity, 3], y }, [0, 1]), message: /^data\.x\[2\]: Infinity/ },
    { case: 'negative weight', run: () => fitCurve(line, { x, y, weights: [1, -1, 1, 1] }, [0, 1]), message: /^data\.weights\[1\]: -1 is not a finite number >= 0/ },
    { case: 'initial of the wrong length', run: () => fitCurve(line, { x, y }, [0]), message: /^initial: has 1 values but the model has 2 parameters \(a, b\)/ },
    { case: 'non-finite initial value', run: () => fitCurve(line, { x, y }, [0, NaN]), message: /^initial\[1\]: b = NaN/ },
    { case: 'too few points', run: () => fitCurve(line, { x: [0, 1], y: [1, 2] }, [0, 1]), message: /^data: 2 points with positive weight; 2 parameters need at least 3/ },
    { case: 'zero weights leave too few points', run: () => fitCurve(line, { x, y, weights: [1, 0, 0, 1] }, [0, 1]), message: /^data: 2 points/ },
    { case: 'bounds of the wrong length', run: () => fitCurve(line, { x, y }, [0, 1], { min: [0] }), message: /^options\.min: has 1 values/ },
    { case: 'lower bound not below upper', run: () => fitCurve(line, { x, y }, [0, 1], { min: [0, 2], max: [1, 2] }), message: /^options\.min\[1\]: b: lower bound 2 is not below upper bound 2/ },
    { case: 'start outside the bounds', run: () => fitCurve(line, { x, y }, [0, 1], { min: [0, 1.5] }), message: /^initial\[1\]: b = 1 is outside its bounds \[1\.5, Infinity\]/ },
    { case: 'iteration limit not a positive integer', run: () => fitCurve(line, { x, y }, [0, 1], { maxIterations: 0 }), message: /^options\.maxIterations: 0/ },
    { case: 'tolerance out of range', run: () => fitCurve(line, { x, y }, [0, 1], { tolerance: 2 }), message: /^options\.tolerance: 2 is not between 0 and 1/ },
    { case: 'cut-off out of range', run: () => fitCurve(line, { x, y }, [0, 1], { svdCutoff: 0 }), message: /^options\.svdCutoff: 0/ },
    { case: 'a model without parameters', run: () => fitCurve({ names: [], evaluate: () => 0 }, { x, y }, []), message: /^model\.names: the model has no parameters/ },
  ];

  it.each(table)('$case', ({ run, message }) => {
    expect(run).toThrow(FitInputError);
    expect(run).toThrow(message);
  });
});

describe('covarianceFromJacobian with an analytic Jacobian', () => {
  // J of a + b x at x = 0..4 (unit weights): J^T J = [[5, 10], [10, 30]], inverse [[0.6, -0.2], [-0.2, 0.1]].
  const J = [0, 1, 2, 3, 4].map((x) => [1, x]);

  it('gives residualVariance * (J^T J)^-1 and the matching correlation', () => {
    const estimate = covarianceFromJacobian(J, 0.5, 1e-10, ['a', 'b']);
    expect(estimate.covariance![0][0]).toBeCloseTo(0.3, 12);
    expect(estimate.covariance![0][1]).toBeCloseTo(-0.1, 12);
    expect(estimate.covariance![1][1]).toBeCloseTo(0.05, 12);
    expect(estimate.stderr![1]).toBeCloseTo(Math.sqrt(0.05), 12);
    expect(estimate.correlation![0][1]).toBeCloseTo(-0.2 / Math.sqrt(0.06), 12);
    expect(estimate.warnings).toEqual([]);
  });

  it('gives only the correlation when no residual variance is known', () => {
    const estimate = covarianceFromJacobian(J, null);
    expect(estimate.covariance).toBeNull();
    expect(estimate.stderr).toBeNull();
    expect(estimate.correlation![1][0]).toBeCloseTo(-0.2 / Math.sqrt(0.06), 12);
  });

  it('names the dead column, with generic labels when none are given', () => {
    const estimate = covarianceFromJacobian(J.map(([one, x]) => [one, 0, x]), 1);
    expect(estimate.covariance).toBeNull();
    expect(estimate.degenerateDirections).toHaveLength(1);
    expect(estimate.warnings[0]).toMatch(/do not determine p1 \(the model barely depends on it\)/);
  });

  it('rejects a ragged Jacobian and a negative variance', () => {
    expect(() => covarianceFromJacobian([[1, 2], [3]], 1)).toThrow(/^J\[1\]: row has 1 columns/);
    expect(() => covarianceFromJacobian(J, -1)).toThrow(/^residualVariance: -1/);
  });
});
