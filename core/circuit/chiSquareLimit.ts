// The 99th percentile of the chi-square distribution, for consistency checks of small weighted fits.

/** Standard normal quantile at 0.99. */
const Z_99 = 2.3263;

/**
 * chi^2 value exceeded with 1 % probability for `dof` degrees of freedom, by the Wilson-Hilferty
 * cube-root approximation (E. B. Wilson and M. M. Hilferty, PNAS 17, 1931; from memory): within
 * 1 % of the exact quantile for dof >= 1 (6.58 vs 6.63 at dof = 1, 9.21 at dof = 2).
 */
export function chiSquareLimit99(dof: number): number {
  const v = 2 / (9 * dof);
  return dof * (1 - v + Z_99 * Math.sqrt(v)) ** 3;
}
