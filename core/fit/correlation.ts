// The correlation of alpha and omega0 from a fit's correlation matrix (0 when the fit gives none).

export function alphaOmega0Correlation(correlation: { names: string[]; matrix: number[][] } | null | undefined): number {
  if (!correlation) return 0;
  const ia = correlation.names.indexOf('alpha');
  const iw = correlation.names.indexOf('omega0');
  const rho = ia >= 0 && iw >= 0 ? correlation.matrix[ia][iw] : 0;
  return Number.isFinite(rho) ? Math.max(-1, Math.min(1, rho)) : 0;
}
