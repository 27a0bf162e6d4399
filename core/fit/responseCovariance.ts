// Covariance of the response parameters: Jacobian at the solution, widened for correlated residuals.

import { covarianceFromJacobian } from './covariance';
import { LAYOUT_NAMES, layoutValues, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';

export interface ResponseCovariance {
  names: string[];
  covariance: number[][] | null;
  correlation: number[][] | null;
  /** Variance inflation from the residuals' autocorrelation (1 for white residuals). */
  inflation: number;
  warnings: string[];
}

/** Central-difference Jacobian of the model over the fit set, steps relative to each parameter's size. */
function responseJacobian(set: FitSet, layout: ParameterLayout, values: readonly number[], t0Fixed: number): Float64Array[] {
  const names = LAYOUT_NAMES[layout];
  const n = set.time.length;
  const rows = Array.from({ length: n }, () => new Float64Array(values.length));
  const rate = values[1];
  for (let j = 0; j < values.length; j++) {
    const floor = names[j] === 't0' ? 1 / rate : names[j] === 'b' ? set.range * rate : names[j].startsWith('y') || names[j] === 'a' ? set.range : rate;
    const h = 1e-6 * Math.max(Math.abs(names[j] === 't0' ? 0 : values[j]), floor);
    const hi = [...values];
    const lo = [...values];
    hi[j] += h;
    lo[j] -= h;
    const up = layoutValues(layout, hi, t0Fixed, set.time, set.blockWidth);
    const down = layoutValues(layout, lo, t0Fixed, set.time, set.blockWidth);
    for (let i = 0; i < n; i++) rows[i][j] = (up[i] - down[i]) / (2 * h);
  }
  return rows;
}

/**
 * Integrated autocorrelation of the residuals, 1 + 2 sum rho_k, summed until rho first drops below
 * zero (Geyer's initial positive sequence, simplified). Filtered (bandwidth-limited) noise makes
 * neighbouring residuals alike, so each carries less than one sample's information.
 */
export function varianceInflation(residuals: Float64Array, maxLag = 200): number {
  const n = residuals.length;
  let mean = 0;
  for (const r of residuals) mean += r;
  mean /= n;
  let c0 = 0;
  for (const r of residuals) c0 += (r - mean) * (r - mean);
  if (c0 === 0) return 1;
  let sum = 0;
  for (let k = 1; k < Math.min(maxLag, n / 4); k++) {
    let ck = 0;
    for (let i = k; i < n; i++) ck += (residuals[i] - mean) * (residuals[i - k] - mean);
    const rho = ck / c0;
    if (rho <= 0) break;
    sum += rho;
  }
  return Math.max(1, 1 + 2 * sum);
}

export function responseCovariance(
  set: FitSet,
  layout: ParameterLayout,
  values: readonly number[],
  t0Fixed: number,
  residualVariance: number,
): ResponseCovariance {
  const names = LAYOUT_NAMES[layout];
  const model = layoutValues(layout, values, t0Fixed, set.time, set.blockWidth);
  const residuals = set.values.map((y, i) => y - model[i]);
  const inflation = varianceInflation(residuals);
  const estimate = covarianceFromJacobian(responseJacobian(set, layout, values, t0Fixed), residualVariance * inflation, 1e-12, names);
  const warnings = [...estimate.warnings];
  if (inflation > 1.5) {
    warnings.push(
      `the residuals are correlated (noise bandwidth-limited or model mismatch): uncertainties widened by ${Math.sqrt(inflation).toFixed(2)}x`,
    );
  }
  return { names, covariance: estimate.covariance, correlation: estimate.correlation, inflation, warnings };
}
