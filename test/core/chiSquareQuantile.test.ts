// The chi-square quantile the capability intervals read, against scipy.stats.chi2.ppf (scipy 1.x, printed to 8 digits).
import { describe, expect, it } from 'vitest';
import { chiSquareQuantile, chiSquareTail } from '../../core/chiSquare';

describe('chiSquareQuantile', () => {
  it.each([
    [0.025, 4, 0.48441856],
    [0.975, 4, 11.143287],
    [0.025, 29, 16.047072],
    [0.975, 29, 45.722286],
    [0.975, 1, 5.0238862],
  ])('P(chi^2 <= x) = %d with %d degrees of freedom at x = %d', (p, dof, x) => {
    expect(chiSquareQuantile(p, dof) / x - 1).toBeCloseTo(0, 6);
    expect(1 - chiSquareTail(chiSquareQuantile(p, dof), dof)).toBeCloseTo(p, 10);
  });

  it('refuses a probability outside (0, 1)', () => {
    expect(() => chiSquareQuantile(1, 3)).toThrow(RangeError);
    expect(() => chiSquareQuantile(0, 3)).toThrow(RangeError);
  });
});
