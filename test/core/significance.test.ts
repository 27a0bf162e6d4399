// The F-test's tail probability against an outside computation.
import { describe, expect, it } from 'vitest';
import { fTail, incompleteBeta, nestedFTestTail } from '../../core/fit/significance';

describe('fTail', () => {
  // P(F > f) from scipy.stats.f.sf(f, d1, d2) (scipy 1.17.1), and I_x(a, b) from scipy.special.betainc.
  it.each([
    [1, 1, 1, 0.5000000000000001],
    [4.6, 4, 2000, 0.0010660378492581982],
    [2.5, 3, 50, 0.07011582357841852],
    [10, 2, 10, 0.004115226337448558],
    [0.3, 5, 7, 0.8981557643278846],
    [30, 4, 900, 1.8662609509805668e-23],
  ])('F = %d with (%d, %d) degrees of freedom', (f, d1, d2, scipy) => {
    expect(fTail(f, d1, d2)).toBeCloseTo(scipy, 12);
    expect(Math.abs(fTail(f, d1, d2) / scipy - 1)).toBeLessThan(1e-9);
  });
  it('matches the regularized incomplete beta function', () => {
    expect(incompleteBeta(0.3, 2.5, 4)).toBeCloseTo(0.3521975859067672, 12);
  });
});

describe('nestedFTestTail', () => {
  it('is 1 when the richer model does not lower the residual, tiny when it lowers it far beyond the noise', () => {
    const base = { simpleParameters: 1, richParameters: 5, effectiveSamples: 1000 };
    expect(nestedFTestTail({ ...base, simpleSse: 10, richSse: 10 }, 1000)).toBe(1);
    expect(nestedFTestTail({ ...base, simpleSse: 100, richSse: 10 }, 1000)).toBeLessThan(1e-12);
  });
  it('counts correlated noise: the same drop over fewer independent samples is less significant', () => {
    const fits = { simpleSse: 10.5, richSse: 10, simpleParameters: 1, richParameters: 5 };
    expect(nestedFTestTail({ ...fits, effectiveSamples: 100 }, 1000)).toBeGreaterThan(nestedFTestTail({ ...fits, effectiveSamples: 1000 }, 1000));
  });
});
