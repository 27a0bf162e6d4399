// The held start against the free start: when the free one replaces it, when alpha's uncertainty takes in their
// difference, and the covariance that carries it (the fits themselves: trust/cases/finiteEdge.ts).

import { describe, expect, it } from 'vitest';
import { continuousStartRejected, startAllowance, withAlphaAllowance, type StartComparison } from '../../core/fit/stepStart';

const comparison = (z: number, p: number): StartComparison => ({ difference: 2 * z, z, p });

describe('continuousStartRejected and startAllowance', () => {
  it('replace the held start below p = 0.001, allow for the difference from there to p = 0.05, and leave it alone above', () => {
    expect(continuousStartRejected(comparison(4, 6e-5))).toMatch(/does not start as an instant step would.*alpha lay 4\.0 standard errors/);
    expect(startAllowance(comparison(4, 6e-5))).toBeNull();
    expect(continuousStartRejected(comparison(2.4, 0.016))).toBeNull();
    expect(startAllowance(comparison(2.4, 0.016))).toEqual({ alphaVariance: 4.8 ** 2, warning: expect.stringMatching(/differ in alpha by 2\.4 standard errors \(p = 0\.016/) });
    expect(continuousStartRejected(comparison(1.5, 0.13))).toBeNull();
    expect(startAllowance(comparison(1.5, 0.13))).toBeNull();
    expect(startAllowance(null)).toBeNull();
  });
});

describe('withAlphaAllowance', () => {
  it("adds to alpha's variance alone and recomputes its correlations", () => {
    const cov = { names: ['alpha', 'omega0'], covariance: [[4, 2], [2, 9]], correlation: [[1, 1 / 3], [1 / 3, 1]], warnings: [] as string[] };
    const widened = withAlphaAllowance(cov, 12);
    expect(widened.covariance).toEqual([[16, 2], [2, 9]]);
    expect(widened.correlation?.[0][1]).toBeCloseTo(2 / 12, 14);
    expect(widened.correlation?.[1][1]).toBe(1);
    expect(widened.warnings).toBe(cov.warnings);
    expect(cov.covariance[0][0]).toBe(4);
  });

  it('leaves a covariance without alpha, or without a matrix, as it is', () => {
    const decay = { names: ['tau'], covariance: [[1]], correlation: [[1]] };
    expect(withAlphaAllowance(decay, 5)).toBe(decay);
    const none = { names: ['alpha'], covariance: null, correlation: null };
    expect(withAlphaAllowance(none, 5)).toBe(none);
  });
});
