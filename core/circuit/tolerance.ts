// Component tolerances as standard uncertainties (GUM rectangular convention).

/**
 * Relative standard uncertainty of a part marked with a relative tolerance of +/- tol.
 * The tolerance is read as the half-width of a rectangular (uniform) distribution, so
 * u = tol / sqrt(3): JCGM 100:2008 (GUM), clause 4.3.7. A 5 % part thus carries u = 2.89 %.
 */
export function toleranceToRelativeUncertainty(tolerance: number): number {
  return tolerance / Math.sqrt(3);
}
