// fitCurve against the NIST StRD nonlinear regression datasets: certified values from both starting points.
//
// Source of every number checked here: NIST StRD <dataset>, certified values (the .dat files in
// ../shared/reference/nist-strd/, see SOURCE.md there). LRE = -log10(|got - certified| / |certified|).
// Required: parameters LRE >= 4, standard errors LRE >= 2, residual sum of squares and residual
// standard deviation LRE >= 4.
//
// What the engine reaches (maxIterations 2000 for these runs; default 400 noted where it matters):
// | dataset  | difficulty | start 1                          | start 2                          |
// | -------- | ---------- | -------------------------------- | -------------------------------- |
// | Misra1a  | lower      | pass                             | pass                             |
// | Misra1b  | lower      | pass                             | pass                             |
// | Misra1c  | average    | pass                             | pass                             |
// | Misra1d  | average    | pass                             | pass                             |
// | Chwirut1 | lower      | pass                             | pass                             |
// | Chwirut2 | lower      | pass                             | pass                             |
// | DanWood  | lower      | pass                             | pass                             |
// | Lanczos1 | average    | pass (RSS 1.4e-25 is at rounding level: RSS LRE >= 2 only) | same  |
// | Lanczos2 | average    | pass                             | pass                             |
// | Lanczos3 | lower      | pass                             | pass                             |
// | Gauss1   | lower      | pass                             | pass                             |
// | Gauss2   | lower      | pass                             | pass                             |
// | Gauss3   | average    | pass                             | pass                             |
// | Kirby2   | average    | pass                             | pass                             |
// | Hahn1    | average    | pass                             | pass                             |
// | Roszman1 | average    | pass                             | pass                             |
// | ENSO     | average    | pass                             | pass                             |
// | MGH17    | average    | pass                             | pass                             |
// | MGH09    | higher     | pass                             | pass                             |
// | MGH10    | higher     | pass (~350 iterations)           | pass                             |
// | Thurber  | higher     | pass                             | pass                             |
// | BoxBOD   | higher     | pass                             | pass                             |
// | Eckerle4 | higher     | pass                             | pass                             |
// | Rat42    | higher     | pass                             | pass                             |
// | Rat43    | higher     | pass                             | pass                             |
// | Bennett5 | higher     | pass (~950 iterations; at the default 400: max-iterations, honestly) | pass (~1650; same) |
// Nelson is left out: its model has two predictors and takes log(y), which CurveModel does not express.
// With the default 400 iterations every run must either reach the certified values or say it did
// not converge: never a 'converged' status on a wrong answer (checked below for all of them).

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

import { describe, expect, it } from 'vitest';

import { fitCurve } from '../../core/fit/fitCurve';
import type { CurveModel } from '../../core/fit/types';
import { parseNistStrd, type NistDataset } from './nistStrdFile';

const folder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../shared/reference/nist-strd');
const present = existsSync(folder);
if (!present) console.warn(`NIST StRD checks skipped: reference folder ${folder} is missing`);

interface Case {
  /** The model line of the file header, to prove the function below is the file's model. */
  header: string;
  evaluate: CurveModel['evaluate'];
  /** Smallest acceptable LRE of the residual sum of squares (default 4). */
  rssDigits?: number;
}

const lanczos = (p: readonly number[], x: number) =>
  p[0] * Math.exp(-p[1] * x) + p[2] * Math.exp(-p[3] * x) + p[4] * Math.exp(-p[5] * x);
const gauss = (p: readonly number[], x: number) =>
  p[0] * Math.exp(-p[1] * x) + p[2] * Math.exp(-((x - p[3]) ** 2) / p[4] ** 2) + p[5] * Math.exp(-((x - p[6]) ** 2) / p[7] ** 2);
const cubicOverCubic = (p: readonly number[], x: number) =>
  (p[0] + p[1] * x + p[2] * x ** 2 + p[3] * x ** 3) / (1 + p[4] * x + p[5] * x ** 2 + p[6] * x ** 3);
const GAUSS_HEADER = 'y = b1*exp( -b2*x ) + b3*exp( -(x-b4)**2 / b5**2 ) + b6*exp( -(x-b7)**2 / b8**2 ) + e';
const LANCZOS_HEADER = 'y = b1*exp(-b2*x) + b3*exp(-b4*x) + b5*exp(-b6*x) + e';

const CASES: Record<string, Case> = {
  Misra1a: { header: 'y = b1*(1-exp[-b2*x]) + e', evaluate: ([b1, b2], x) => b1 * (1 - Math.exp(-b2 * x)) },
  Misra1b: { header: 'y = b1 * (1-(1+b2*x/2)**(-2)) + e', evaluate: ([b1, b2], x) => b1 * (1 - (1 + (b2 * x) / 2) ** -2) },
  Misra1c: { header: 'y = b1 * (1-(1+2*b2*x)**(-.5)) + e', evaluate: ([b1, b2], x) => b1 * (1 - (1 + 2 * b2 * x) ** -0.5) },
  Misra1d: { header: 'y = b1*b2*x*((1+b2*x)**(-1)) + e', evaluate: ([b1, b2], x) => (b1 * b2 * x) / (1 + b2 * x) },
  Chwirut1: { header: 'y = exp[-b1*x]/(b2+b3*x) + e', evaluate: ([b1, b2, b3], x) => Math.exp(-b1 * x) / (b2 + b3 * x) },
  Chwirut2: { header: 'y = exp(-b1*x)/(b2+b3*x) + e', evaluate: ([b1, b2, b3], x) => Math.exp(-b1 * x) / (b2 + b3 * x) },
  DanWood: { header: 'y = b1*x**b2 + e', evaluate: ([b1, b2], x) => b1 * x ** b2 },
  Lanczos1: { header: LANCZOS_HEADER, evaluate: lanczos, rssDigits: 2 },
  Lanczos2: { header: LANCZOS_HEADER, evaluate: lanczos },
  Lanczos3: { header: LANCZOS_HEADER, evaluate: lanczos },
  Gauss1: { header: GAUSS_HEADER, evaluate: gauss },
  Gauss2: { header: GAUSS_HEADER, evaluate: gauss },
  Gauss3: { header: GAUSS_HEADER, evaluate: gauss },
  Kirby2: {
    header: 'y = (b1 + b2*x + b3*x**2) / (1 + b4*x + b5*x**2) + e',
    evaluate: ([b1, b2, b3, b4, b5], x) => (b1 + b2 * x + b3 * x * x) / (1 + b4 * x + b5 * x * x),
  },
  Hahn1: { header: 'y = (b1+b2*x+b3*x**2+b4*x**3) / (1+b5*x+b6*x**2+b7*x**3) + e', evaluate: cubicOverCubic },
  Thurber: { header: 'y = (b1 + b2*x + b3*x**2 + b4*x**3) / (1 + b5*x + b6*x**2 + b7*x**3) + e', evaluate: cubicOverCubic },
  Roszman1: {
    header: 'y = b1 - b2*x - arctan[b3/(x-b4)]/pi + e',
    evaluate: ([b1, b2, b3, b4], x) => b1 - b2 * x - Math.atan(b3 / (x - b4)) / Math.PI,
  },
  ENSO: {
    header:
      'y = b1 + b2*cos( 2*pi*x/12 ) + b3*sin( 2*pi*x/12 ) + b5*cos( 2*pi*x/b4 ) + b6*sin( 2*pi*x/b4 ) + b8*cos( 2*pi*x/b7 ) + b9*sin( 2*pi*x/b7 ) + e',
    evaluate: ([b1, b2, b3, b4, b5, b6, b7, b8, b9], x) =>
      b1 +
      b2 * Math.cos((2 * Math.PI * x) / 12) +
      b3 * Math.sin((2 * Math.PI * x) / 12) +
      b5 * Math.cos((2 * Math.PI * x) / b4) +
      b6 * Math.sin((2 * Math.PI * x) / b4) +
      b8 * Math.cos((2 * Math.PI * x) / b7) +
      b9 * Math.sin((2 * Math.PI * x) / b7),
  },
  MGH17: {
    header: 'y = b1 + b2*exp[-x*b4] + b3*exp[-x*b5] + e',
    evaluate: ([b1, b2, b3, b4, b5], x) => b1 + b2 * Math.exp(-x * b4) + b3 * Math.exp(-x * b5),
  },
  MGH09: {
    header: 'y = b1*(x**2+x*b2) / (x**2+x*b3+b4) + e',
    evaluate: ([b1, b2, b3, b4], x) => (b1 * (x * x + x * b2)) / (x * x + x * b3 + b4),
  },
  MGH10: { header: 'y = b1 * exp[b2/(x+b3)] + e', evaluate: ([b1, b2, b3], x) => b1 * Math.exp(b2 / (x + b3)) },
  BoxBOD: { header: 'y = b1*(1-exp[-b2*x]) + e', evaluate: ([b1, b2], x) => b1 * (1 - Math.exp(-b2 * x)) },
  Eckerle4: {
    header: 'y = (b1/b2) * exp[-0.5*((x-b3)/b2)**2] + e',
    evaluate: ([b1, b2, b3], x) => (b1 / b2) * Math.exp(-0.5 * ((x - b3) / b2) ** 2),
  },
  Rat42: { header: 'y = b1 / (1+exp[b2-b3*x]) + e', evaluate: ([b1, b2, b3], x) => b1 / (1 + Math.exp(b2 - b3 * x)) },
  Rat43: {
    header: 'y = b1 / ((1+exp[b2-b3*x])**(1/b4)) + e',
    evaluate: ([b1, b2, b3, b4], x) => b1 / (1 + Math.exp(b2 - b3 * x)) ** (1 / b4),
  },
  Bennett5: { header: 'y = b1 * (b2+x)**(-1/b3) + e', evaluate: ([b1, b2, b3], x) => b1 * (b2 + x) ** (-1 / b3) },
};

/** Log relative error, capped at 11 (the certified values carry 11 significant digits). */
function lre(got: number, certified: number): number {
  const relative = Math.abs(got - certified) / Math.abs(certified);
  return relative === 0 ? 11 : Math.min(11, -Math.log10(relative));
}

function load(name: string): NistDataset {
  return parseNistStrd(readFileSync(path.join(folder, `${name}.dat`), 'utf8'), name);
}

function fit(dataset: NistDataset, start: 1 | 2, maxIterations?: number) {
  const model: CurveModel = { names: dataset.parameters.map((q) => q.name), evaluate: CASES[dataset.name].evaluate };
  const initial = dataset.parameters.map((q) => (start === 1 ? q.start1 : q.start2));
  return fitCurve(model, { x: dataset.x, y: dataset.y }, initial, { maxIterations });
}

describe.skipIf(!present)('NIST StRD nonlinear regression', () => {
  describe.each(Object.keys(CASES))('%s', (name) => {
    const dataset = present ? load(name) : null;

    it('is the model the file header states', () => {
      expect(dataset!.model).toBe(CASES[name].header);
    });

    it.each([1, 2] as const)('reaches the certified values from start %i', (start) => {
      const result = fit(dataset!, start, 2000);
      const source = `NIST StRD ${name}, certified values, start ${start}`;
      expect(result.status, `${source}: ${result.message}`).toBe('converged');
      // Not the header's 'Degrees of Freedom': Rat43's says 9, yet its certified residual standard
      // deviation is sqrt(RSS / 11), and 15 observations less 4 parameters leave 11.
      expect(result.degreesOfFreedom, source).toBe(dataset!.x.length - dataset!.parameters.length);
      dataset!.parameters.forEach((certified, j) => {
        const got = result.parameters[j];
        expect(lre(got.value, certified.certified), `${source}: ${certified.name} = ${got.value}`).toBeGreaterThanOrEqual(4);
        expect(got.stderr, `${source}: ${certified.name} standard deviation`).not.toBeNull();
        expect(lre(got.stderr!, certified.certifiedStdDev), `${source}: ${certified.name} standard deviation ${got.stderr}`).toBeGreaterThanOrEqual(2);
      });
      expect(lre(result.chiSquare, dataset!.residualSumOfSquares), `${source}: residual sum of squares`).toBeGreaterThanOrEqual(
        CASES[name].rssDigits ?? 4,
      );
      expect(lre(Math.sqrt(result.reducedChiSquare), dataset!.residualStdDev), `${source}: residual standard deviation`).toBeGreaterThanOrEqual(
        CASES[name].rssDigits ?? 4,
      );
    });

    it.each([1, 2] as const)('with the default iteration limit, never claims convergence on a wrong answer (start %i)', (start) => {
      const result = fit(dataset!, start);
      const worst = Math.min(...dataset!.parameters.map((c, j) => lre(result.parameters[j].value, c.certified)));
      // NIST StRD <name>, certified values: a 'converged' status must come with LRE >= 4.
      if (result.status === 'converged') expect(worst, `NIST StRD ${name}, certified values, start ${start}`).toBeGreaterThanOrEqual(4);
      else expect(result.message).toMatch(/iterations|stalled/);
    });
  });
});
