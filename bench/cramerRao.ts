// The Cramér-Rao bound on alpha, omega0 and omega_d for one record, from the Fisher information of the fit's own model and layout.
//
// Gaussian noise, white or first-order low-pass (AR(1): n[k] = rho n[k-1] + innovation). The information is
// J^T Sigma^-1 J, computed by whitening the Jacobian rows: w[0] = J[0] / s, w[k] = (J[k] - rho J[k-1]) / (s sqrt(1 - rho^2)),
// s the stationary noise rms (derived; see ../shared/reference/trade-facts.md, "Estimation limits").

import { inverse, Matrix } from 'ml-matrix';
import { LAYOUT_NAMES, unpackParams, type ParameterLayout } from '../core/fit/responseModel';
import { responseAt } from '../core/response/secondOrder';

export interface NoiseModel {
  /** Stationary rms of the noise, in the trace's unit. */
  rms: number;
  /** Correlation of neighbouring samples (0 for white noise). */
  rho: number;
}

export interface Bound {
  /** Smallest standard deviations an unbiased estimator can reach. */
  alpha: number;
  omega0: number;
  /** null when the truth is not underdamped. */
  omegaD: number | null;
}

/** Central-difference Jacobian of the layout's model over the time axis, rows of parameters. */
function jacobian(layout: ParameterLayout, values: readonly number[], t0Fixed: number, time: ArrayLike<number>): Float64Array[] {
  const names = LAYOUT_NAMES[layout];
  const rate = values[1];
  // Size of the levels: the step floor for the linear parameters (exact for them at any step).
  const span = Math.max(...values.filter((_, j) => names[j].startsWith('y') || names[j] === 'a').map(Math.abs), 1e-12);
  const rows = Array.from({ length: time.length }, () => new Float64Array(values.length));
  for (let j = 0; j < values.length; j++) {
    const floor = names[j] === 't0' ? 1 / rate : names[j] === 'b' ? span * rate : names[j].startsWith('y') || names[j] === 'a' ? span : rate;
    const h = 1e-6 * Math.max(names[j] === 't0' ? 0 : Math.abs(values[j]), floor);
    const up = [...values];
    const down = [...values];
    up[j] += h;
    down[j] -= h;
    const pUp = unpackParams(layout, up, t0Fixed);
    const pDown = unpackParams(layout, down, t0Fixed);
    for (let i = 0; i < time.length; i++) rows[i][j] = (responseAt(pUp, time[i]) - responseAt(pDown, time[i])) / (2 * h);
  }
  return rows;
}

/**
 * The bound for the parameter vector `values` of `layout` (LAYOUT_NAMES order; alpha and omega0 first) on
 * the record's time axis. `t0Fixed` is the event time for layouts that hold it.
 */
export function cramerRaoBound(layout: ParameterLayout, values: readonly number[], t0Fixed: number, time: ArrayLike<number>, noise: NoiseModel): Bound {
  const rows = jacobian(layout, values, t0Fixed, time);
  const p = values.length;
  const { rms, rho } = noise;
  const innovation = rms * Math.sqrt(1 - rho * rho);
  const information = Matrix.zeros(p, p);
  const w = new Float64Array(p);
  for (let i = 0; i < rows.length; i++) {
    for (let j = 0; j < p; j++) w[j] = i === 0 ? rows[0][j] / rms : (rows[i][j] - rho * rows[i - 1][j]) / innovation;
    for (let j = 0; j < p; j++) for (let k = j; k < p; k++) information.set(j, k, information.get(j, k) + w[j] * w[k]);
  }
  for (let j = 0; j < p; j++) for (let k = 0; k < j; k++) information.set(j, k, information.get(k, j));
  const covariance = inverse(information);
  const [alpha, omega0] = values;
  const va = covariance.get(0, 0);
  const vw = covariance.get(1, 1);
  const cov = covariance.get(0, 1);
  const q = omega0 * omega0 - alpha * alpha;
  let omegaD: number | null = null;
  if (q > 0) {
    const wd = Math.sqrt(q);
    const ga = -alpha / wd;
    const gw = omega0 / wd;
    omegaD = Math.sqrt(ga * ga * va + 2 * ga * gw * cov + gw * gw * vw);
  }
  return { alpha: Math.sqrt(va), omega0: Math.sqrt(vw), omegaD };
}
