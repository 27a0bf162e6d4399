// Degenerate input to every decomposition of the fit (SVD, pencil, covariance, the solver): each returns, and says why when it cannot answer.
//
// The guard is the test timeout, not a timing assertion: a decomposition that loops fails the test by timing out.

import { describe, expect, it } from 'vitest';
import { boundedSvd } from '../../core/fit/boundedSvd';
import { matrixPencil } from '../../core/fit/pencil';
import { covarianceFromJacobian } from '../../core/fit/covariance';
import { fitCurve } from '../../core/fit/fitCurve';
import type { CurveModel } from '../../core/fit/types';
import { createRandom } from '../../core/random';

const GUARD_MS = 20_000;
const DENORMAL = 5e-324;
const NEAR_MAX = 1e308;

function hankel(y: readonly number[], columns: number): number[][] {
  return Array.from({ length: y.length - columns + 1 }, (_, i) => y.slice(i, i + columns));
}

/** A seeded damped ring of n samples on a level, scaled and shifted as asked. */
function ring(n: number, scale = 1, level = 2): number[] {
  const random = createRandom(11);
  return Array.from({ length: n }, (_, i) => scale * (level + Math.exp(-0.02 * i) * Math.cos(0.3 * i) + 1e-3 * random.normal()));
}

/** Sequences no pencil can find a ring in, and what they stand for. */
const DEGENERATE_SEQUENCES: [string, number[]][] = [
  ['all equal (the rank-one Hankel matrix ml-matrix looped on)', new Array(63).fill(12.4)],
  ['NaN after a huge scale', ring(63, NEAR_MAX * 10)],
  ['one NaN', ring(63).map((v, i) => (i === 30 ? NaN : v))],
  ['one Infinity', ring(63).map((v, i) => (i === 30 ? Infinity : v))],
  ['values near 1e308', ring(63, NEAR_MAX / 4)],
  ['denormals', ring(63).map((v) => DENORMAL * Math.round(4 * v))],
  ['equal but one denormal step', new Array(63).fill(0).map((_, i) => (i === 40 ? DENORMAL : 0))],
  ['all zero', new Array(63).fill(0)],
  ['alternating signs', Array.from({ length: 63 }, (_, i) => (i % 2 ? 1 : -1))],
];

describe('boundedSvd', () => {
  it('decomposes a known matrix: A = U S V^T with orthonormal V', () => {
    const a = [
      [3, 1, 0.5],
      [1, 4, 2],
      [0.5, 2, 5],
      [1, 0, 1],
    ];
    const svd = boundedSvd(a)!;
    expect(svd.converged).toBe(true);
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 3; j++) {
        const rebuilt = svd.values.reduce((s, sigma, k) => s + svd.U[i][k] * sigma * svd.V[j][k], 0);
        expect(rebuilt).toBeCloseTo(a[i][j], 12);
      }
    for (let k = 1; k < 3; k++) expect(svd.values[k]).toBeLessThanOrEqual(svd.values[k - 1]);
  });

  it('a constant Hankel matrix has rank one: sqrt(rows x columns) x the level, then zeros', () => {
    const svd = boundedSvd(hankel(new Array(63).fill(12.4), 22))!;
    expect(svd.values[0] / (12.4 * Math.sqrt(42 * 22))).toBeCloseTo(1, 12);
    expect(svd.values[1]).toBeLessThan(1e-12 * svd.values[0]);
  });

  it('refuses NaN and Infinity, and keeps values near the overflow and underflow limits finite', () => {
    expect(boundedSvd([[1, NaN], [2, 3]])).toBeNull();
    expect(boundedSvd([[1, Infinity], [2, 3]])).toBeNull();
    const big = boundedSvd([[NEAR_MAX, NEAR_MAX], [NEAR_MAX, -NEAR_MAX]])!;
    expect(big.values.map((s) => s / (NEAR_MAX * Math.SQRT2))).toEqual([expect.closeTo(1, 12), expect.closeTo(1, 12)]);
    const tiny = boundedSvd([[DENORMAL, 0], [0, 2 * DENORMAL]])!;
    expect(tiny.values).toEqual([2 * DENORMAL, DENORMAL]);
  });

  it('a column of zeros gives a zero singular value with a zero left vector', () => {
    const svd = boundedSvd([[1, 0], [2, 0], [3, 0]])!;
    expect(svd.values[1]).toBe(0);
    expect(svd.U.map((row) => row[1])).toEqual([0, 0, 0]);
  });
});

describe('matrixPencil on degenerate sequences', () => {
  it.each(DEGENERATE_SEQUENCES)('%s: returns finite poles or none', (_name, y) => {
    for (const modes of [2, 3]) {
      for (const pole of matrixPencil(y, modes)) {
        expect(Number.isFinite(pole.re) && Number.isFinite(pole.im)).toBe(true);
      }
    }
  }, GUARD_MS);
});

describe('covarianceFromJacobian on degenerate Jacobians', () => {
  const base = Array.from({ length: 40 }, (_, i) => [1, i / 40, Math.sin(i)]);
  it.each([
    ['NaN after a huge scale', base.map((row) => row.map((v) => v * NEAR_MAX * 10 - NEAR_MAX * 10)), /non-finite/],
    ['one Infinity', base.map((row, i) => (i === 5 ? [row[0], Infinity, row[2]] : row)), /non-finite/],
    ['values near 1e308 (J^T J overflows)', base.map((row) => row.map((v) => v * NEAR_MAX)), /non-finite/],
    ['a column of zeros', base.map(([a, , c]) => [a, 0, c]), /determine p1/],
    ['two equal columns', base.map(([a, b]) => [a, b, b]), /tell p1 and p2 apart|tell p2 and p1 apart/],
    ['all equal', base.map(() => [1, 1, 1]), /not estimable/],
    ['denormals (J^T J underflows to zero)', base.map((row) => row.map((v) => v * DENORMAL)), /not estimable/],
  ] as const)('%s: not estimable, and the warning says why', (_name, J, why) => {
    const estimate = covarianceFromJacobian(J, 1);
    expect(estimate.covariance).toBeNull();
    expect(estimate.warnings.join(' ')).toMatch(why);
  }, GUARD_MS);
});

describe('fitCurve on degenerate data ends with a reason', () => {
  const line: CurveModel = { names: ['a', 'b'], evaluate: ([a, b], x) => a + b * x };
  const ignored: CurveModel = { names: ['a', 'unused'], evaluate: ([a], x) => a * x };
  const x = Array.from({ length: 30 }, (_, i) => i);

  it('all-equal data: a line with slope zero, converged', () => {
    const fit = fitCurve(line, { x, y: x.map(() => 7) }, [1, 1]);
    expect(fit.status).toBe('converged');
    expect(fit.parameters[0].value).toBeCloseTo(7, 9);
  }, GUARD_MS);

  it('a parameter the model ignores (a column of zeros): no covariance, and the warning names it', () => {
    const fit = fitCurve(ignored, { x, y: x.map((v) => 2 * v + 0.01 * Math.sin(v)) }, [1, 1]);
    expect(fit.covariance).toBeNull();
    expect(fit.warnings.join(' ')).toMatch(/determine unused/);
  }, GUARD_MS);

  it('values near 1e308, where chi^2 overflows: declared failed', () => {
    const fit = fitCurve(line, { x, y: x.map((v) => NEAR_MAX * (1 + 0.5 * Math.sin(v))) }, [1, 1]);
    expect(fit.status).toBe('failed');
    expect(fit.message).toMatch(/not finite/);
  }, GUARD_MS);

  it('a model that turns NaN away from the start: ends within its iteration limit', () => {
    const fragile: CurveModel = { names: ['a', 'b'], evaluate: ([a, b], v) => (b > 1.5 ? NaN : a * Math.exp(-b * v)) };
    const fit = fitCurve(fragile, { x, y: x.map((v) => 3 * Math.exp(-2 * v)) }, [1, 1], { maxIterations: 50 });
    expect(fit.iterations).toBeLessThanOrEqual(50);
    expect(fit.status === 'converged' ? fit.parameters[1].value <= 1.5 : true).toBe(true);
  }, GUARD_MS);
});
