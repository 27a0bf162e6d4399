// Covariance of the response parameters: Jacobian at the solution, as a sandwich over the residuals' noise model when they are correlated.

import { correlationMatrix, covarianceFromJacobian, sandwichCovariance } from './covariance';
import { widenAlongZetaProfile } from './profileWidening';
import { LAYOUTS, layoutValues, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';

export interface ResponseCovariance {
  names: string[];
  covariance: number[][] | null;
  correlation: number[][] | null;
  /** Largest ratio, over alpha and omega0, of the variance allowing for correlated residuals to that for white ones (1 when the residuals look white). */
  inflation: number;
  /** Zeta's interval at 2 standard errors read from its residual profile, where the profile was walked (profileWidening.ts). */
  zetaInterval?: { low: number; high: number };
  warnings: string[];
}

/** Central-difference Jacobian of the model over the fit set, steps relative to each parameter's size. */
function responseJacobian(set: FitSet, layout: ParameterLayout, values: readonly number[], t0Fixed: number): Float64Array[] {
  const { names, index } = LAYOUTS[layout];
  const n = set.time.length;
  const rows = Array.from({ length: n }, () => new Float64Array(values.length));
  // A first-order layout has no omega0: its rate is alpha.
  const rate = values[index.omega0 ?? index.alpha];
  for (let j = 0; j < values.length; j++) {
    const floor = names[j] === 't0' ? 1 / rate : names[j] === 'b' ? set.range * rate : names[j].startsWith('y') || names[j] === 'a' ? set.range : rate;
    const h = 1e-6 * Math.max(Math.abs(names[j] === 't0' ? 0 : values[j]), floor);
    const hi = [...values];
    const lo = [...values];
    hi[j] += h;
    lo[j] -= h;
    const up = layoutValues(layout, hi, t0Fixed, set.time, set.block);
    const down = layoutValues(layout, lo, t0Fixed, set.time, set.block);
    for (let i = 0; i < n; i++) rows[i][j] = (up[i] - down[i]) / (2 * h);
  }
  return rows;
}

/** Longest autoregression tried for the residuals (a scope front end's noise needs a few lags; model mismatch more). */
const MAX_NOISE_ORDER = 20;
/** Above this variance ratio (alpha or omega0) against white noise the widening is worth a warning. */
const WARN_INFLATION = 1.5;

/** An autoregression of the residuals, r[i] = sum_j coefficients[j] r[i - 1 - j] + innovation. */
interface NoiseModel {
  coefficients: number[];
  /** Variance of the residuals over that of the innovations, 1 / prod(1 - kappa_m^2). */
  varianceRatio: number;
}

/** Sums r[i] r[i + k] for k = 0..maxLag (any common scale serves: only their ratios are used). */
function autocovariance(residuals: Float64Array, maxLag: number): Float64Array {
  const n = residuals.length;
  const gamma = new Float64Array(maxLag + 1);
  for (let k = 0; k <= maxLag; k++) {
    let sum = 0;
    for (let i = 0; i + k < n; i++) sum += residuals[i] * residuals[i + k];
    gamma[k] = sum;
  }
  return gamma;
}

/** Levinson-Durbin recursion on an autocovariance (Yule-Walker; stable by construction): the coefficients and innovation sum of each order. */
function levinson(gamma: Float64Array, maxOrder: number): { coefficients: number[]; error: number }[] {
  const orders = [{ coefficients: [] as number[], error: gamma[0] }];
  for (let m = 1; m <= maxOrder; m++) {
    const { coefficients, error } = orders[m - 1];
    let numerator = gamma[m];
    for (let j = 0; j < m - 1; j++) numerator -= coefficients[j] * gamma[m - 1 - j];
    const kappa = numerator / error;
    orders.push({ coefficients: [...coefficients.map((c, j) => c - kappa * coefficients[m - 2 - j]), kappa], error: error * (1 - kappa * kappa) });
  }
  return orders;
}

/** Rounds of re-reading the autocovariance with the correction of the model just found (the second changes it by well under 1 %). */
const CORRECTION_ROUNDS = 2;

/**
 * The autoregression of the residuals whose order the Bayesian information criterion picks; null when
 * order 0 wins, that is, when the residuals look white. Fitted residuals are the noise less its projection P
 * onto the model's columns, and that projection takes out the slow components where correlated noise has its
 * power: the residuals' autocovariance reads the correlation low (neighbour correlation 0.795 for 0.8 over a
 * 2000-sample step, stderr 1.5 % short). So the autocovariance is read as the noise's own by adding back what
 * the projection takes on average under the model found, E[r^T M_k r] = tr(M_k (I - P) S (I - P)), and the
 * coefficients of the chosen order are fitted again (for white noise this is dividing by n - p).
 */
export function residualNoiseModel(residuals: Float64Array, J: readonly Float64Array[], bread: readonly number[][]): NoiseModel | null {
  const n = residuals.length;
  const maxOrder = Math.min(MAX_NOISE_ORDER, Math.floor(n / 10));
  const gamma = autocovariance(residuals, maxOrder);
  if (!(gamma[0] > 0)) return null;
  const orders = levinson(gamma, maxOrder);
  const score = (m: number) => n * Math.log(orders[m].error) + m * Math.log(n);
  let order = 0;
  for (let m = 1; m <= maxOrder; m++) if (score(m) < score(order)) order = m;
  if (order === 0) return null;
  let { coefficients, error } = orders[order];
  let gamma0 = gamma[0];
  for (let round = 0; round < CORRECTION_ROUNDS; round++) {
    const removed = projectionLoss(J, bread, coefficients);
    const corrected = gamma.slice(0, order + 1).map((g, k) => g + (error / n) * removed[k]);
    const refitted = levinson(corrected, order)[order];
    // A correction that leaves no valid autocovariance (rounding on a near-degenerate Jacobian) keeps the last reading.
    if (!(corrected[0] > 0 && refitted.error > 0)) break;
    ({ coefficients, error } = refitted);
    gamma0 = corrected[0];
  }
  return { coefficients, varianceRatio: gamma0 / error };
}

/**
 * For each lag k up to the model's order, tr(M_k S) - E[r^T M_k r] for the model's S at unit innovation variance:
 * 2 tr(B W^T M_k J) - tr(B G B H_k), with B the bread, W = S J, G = J^T W, H_k = J^T M_k J and M_k the symmetric
 * lag-k operator. What the projection onto the model's columns takes out of the residuals' lag-k sum, on average.
 */
function projectionLoss(J: readonly Float64Array[], bread: readonly number[][], coefficients: readonly number[]): number[] {
  const n = J.length;
  const p = bread.length;
  // S = F^-1 F^-T: the recoloured Jacobian F^-T J, then F^-1 of it (W[i] = K[i] + sum_j c_j W[i - 1 - j]).
  const W = recolouredJacobian(J, coefficients);
  for (let i = 1; i < n; i++) {
    for (let j = 0; j < coefficients.length && i - 1 - j >= 0; j++) {
      const earlier = W[i - 1 - j];
      for (let a = 0; a < p; a++) W[i][a] += coefficients[j] * earlier[a];
    }
  }
  const G = crossLag(W, J, 0);
  const BGB = multiply(multiply(bread, G), bread);
  return Array.from({ length: coefficients.length + 1 }, (_, k) => {
    const A = crossLag(W, J, k);
    const H = crossLag(J, J, k);
    let loss = 0;
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) loss += 2 * bread[a][b] * A[a][b] - BGB[a][b] * H[b][a];
    return loss;
  });
}

/** X^T M_k Y: (1/2) sum_i (X[i] Y[i + k]^T + X[i + k] Y[i]^T). */
function crossLag(X: readonly Float64Array[], Y: readonly Float64Array[], k: number): number[][] {
  const p = X[0].length;
  const out = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i + k < X.length; i++) {
    const [x, y, xk, yk] = [X[i], Y[i + k], X[i + k], Y[i]];
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) out[a][b] += 0.5 * (x[a] * y[b] + xk[a] * yk[b]);
  }
  return out;
}

function multiply(x: readonly number[][], y: readonly number[][]): number[][] {
  return x.map((row) => y[0].map((_, b) => row.reduce((sum, v, k) => sum + v * y[k][b], 0)));
}

/**
 * F^-T J for the whitening filter F of the noise model (u = F r): K[i] = J[i] + sum_j c_j K[i + 1 + j].
 * The residual covariance is s F^-1 F^-T, so J^T S J = s K^T K without ever forming an n x n matrix.
 */
function recolouredJacobian(J: readonly Float64Array[], coefficients: readonly number[]): Float64Array[] {
  const n = J.length;
  const K = J.map((row) => Float64Array.from(row));
  for (let i = n - 2; i >= 0; i--) {
    for (let j = 0; j < coefficients.length && i + 1 + j < n; j++) {
      const later = K[i + 1 + j];
      for (let a = 0; a < later.length; a++) K[i][a] += coefficients[j] * later[a];
    }
  }
  return K;
}

function gram(rows: readonly Float64Array[]): number[][] {
  const p = rows[0].length;
  const g = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (const row of rows) for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) g[a][b] += row[a] * row[b];
  return g;
}

/**
 * Covariance of a least-squares fit under the residuals' autoregressive noise model: the sandwich
 * (J^T J)^-1 J^T S J (J^T J)^-1 of Newey and West (Econometrica 1987), with S from an autoregression
 * fitted to the residuals instead of their lag-windowed autocovariance (the autoregressive spectral
 * estimate of den Haan and Levin 1997; both from memory). A lag window (Parzen) over fitted residuals
 * read the noise low near the ring frequency, because the fit removes exactly those components (stderr
 * about 10 % short on the benchmark's low-pass cases); a short autoregression rests on the first few
 * lags, which the fit hardly touches. The innovation variance
 * is scaled so that E[r^T r] = tr((I - P) S) holds, the correlated-noise form of dividing by n - p.
 */
function correlatedCovariance(
  J: readonly Float64Array[],
  bread: number[][],
  residuals: Float64Array,
  noise: NoiseModel,
): { covariance: number[][]; correlation: number[][] } {
  const shape = gram(recolouredJacobian(J, noise.coefficients));
  let leverage = 0;
  for (let a = 0; a < bread.length; a++) for (let b = 0; b < bread.length; b++) leverage += bread[a][b] * shape[b][a];
  let sse = 0;
  for (const r of residuals) sse += r * r;
  // tr((I - P) S) / s: positive in exact arithmetic; the floor only guards rounding.
  const scale = sse / Math.max(residuals.length * noise.varianceRatio - leverage, 1);
  return sandwichCovariance(bread, shape.map((row) => row.map((v) => scale * v)));
}

/**
 * The covariance allowing for correlated residuals, from the Jacobian J at the solution, the bread (J^T J)^-1 and
 * the residuals; null when the residuals look white (then the white-noise covariance stands). Every fit with
 * a Jacobian (one ring here, several in modesCovariance.ts) reads its residuals' noise this one way.
 */
function residualSandwich(
  J: readonly Float64Array[],
  bread: number[][],
  residuals: Float64Array,
): { covariance: number[][]; correlation: number[][] } | null {
  const noise = residualNoiseModel(residuals, J, bread);
  return noise ? correlatedCovariance(J, bread, residuals, noise) : null;
}

/** A covariance with its correlation; the white one's correlation is null where no covariance could be estimated. */
interface Estimate<C> {
  covariance: number[][];
  correlation: C;
}

/** The noise the residuals are read under, with the covariance that reading gives. */
export type NoiseReading =
  | { kind: 'white'; estimate: Estimate<number[][] | null> }
  | { kind: 'correlated' | 'uneven'; estimate: Estimate<number[][]> };

/**
 * How every fit with a Jacobian (one ring here, several in modesCovariance.ts) reads its residuals' noise: uneven
 * (sampling jitter, noise that scales with the signal) when that sandwich widens the rates' variances, as
 * `inflation` measures them against `white`, past UNEVEN_GATE and beyond the correlated reading; else correlated
 * when the residuals' autoregression fits them better than white noise (residualSandwich); else white.
 */
export function noiseReading(
  J: readonly Float64Array[],
  bread: number[][],
  residuals: Float64Array,
  white: Estimate<number[][] | null>,
  inflation: (covariance: number[][]) => number,
): NoiseReading {
  const sandwich = residualSandwich(J, bread, residuals);
  const uneven = unevenNoiseSandwich(J, bread, residuals);
  if (uneven && inflation(uneven.covariance) > Math.max(UNEVEN_GATE, sandwich ? inflation(sandwich.covariance) : 1)) return { kind: 'uneven', estimate: uneven };
  return sandwich ? { kind: 'correlated', estimate: sandwich } : { kind: 'white', estimate: white };
}

/**
 * The covariance of the fitted parameters: the local one (white or sandwich), widened along zeta's profile
 * where the fit is not clearly underdamped (there the residual is far from a parabola in the damping).
 */
export function responseCovariance(
  set: FitSet,
  layout: ParameterLayout,
  values: readonly number[],
  t0Fixed: number,
  residualVariance: number,
): ResponseCovariance {
  const local = localCovariance(set, layout, values, t0Fixed, residualVariance);
  if (!local.covariance) return local;
  // The profile's levels are in residual variances, raised as the correlated residuals raise the variances.
  const widened = widenAlongZetaProfile(set, layout, values, t0Fixed, residualVariance * Math.max(1, local.inflation), local.covariance);
  if (!widened) return local;
  const c = widened.covariance;
  return {
    ...local,
    covariance: c,
    correlation: c ? correlationMatrix(c) : null,
    zetaInterval: widened.zetaInterval,
    warnings: [...local.warnings, ...widened.warnings],
  };
}

/**
 * The Jacobian's covariance at the solution, as a sandwich when the residuals are correlated or uneven: without the
 * widening along zeta's profile, for a comparison of two fits' rates (stepStart.ts) that need not pay for it.
 */
export function localCovariance(
  set: FitSet,
  layout: ParameterLayout,
  values: readonly number[],
  t0Fixed: number,
  residualVariance: number,
): ResponseCovariance {
  const { names: layoutNames, index } = LAYOUTS[layout];
  const names = [...layoutNames];
  const model = layoutValues(layout, values, t0Fixed, set.time, set.block);
  const residuals = set.values.map((y, i) => y - model[i]);
  const J = responseJacobian(set, layout, values, t0Fixed);
  // Unit variance: (J^T J)^-1, the bread of the sandwich and, times the residual variance, the white-noise covariance.
  const estimate = covarianceFromJacobian(J, 1, 1e-12, names);
  const bread = estimate.covariance;
  const warnings = [...estimate.warnings];
  const plain = bread?.map((row) => row.map((v) => residualVariance * v)) ?? null;
  if (!bread || !plain) return { names, covariance: plain, correlation: estimate.correlation, inflation: 1, warnings };
  const rates = ['alpha', 'omega0'].filter((name) => name in index);
  const ratiosOf = (c: number[][]) => rates.map((name) => c[index[name]][index[name]] / plain[index[name]][index[name]]);
  const reading = noiseReading(J, bread, residuals, { covariance: plain, correlation: estimate.correlation }, (c) => Math.max(...ratiosOf(c)));
  if (reading.kind === 'white') return { names, ...reading.estimate, inflation: 1, warnings };
  const ratios = ratiosOf(reading.estimate.covariance);
  const widened = rates.map((name, k) => `${Math.sqrt(ratios[k]).toFixed(2)}x (${name})`).join(' and ');
  if (reading.kind === 'uneven') {
    warnings.push(`the residuals are larger where the response changes fast (sampling jitter, or noise that scales with the signal): uncertainties widened by ${widened}`);
  } else if (Math.max(...ratios) > WARN_INFLATION) {
    warnings.push(`the residuals are correlated (noise bandwidth-limited or model mismatch): uncertainties widened by ${widened}`);
  }
  return { names, ...reading.estimate, inflation: Math.max(...ratios), warnings };
}

/**
 * Above this variance ratio (alpha or omega0) against white noise the uneven-noise sandwich is taken: white noise
 * of a few hundred samples or more leaves its ratio within some 10 % of 1, so a good capture keeps its covariance.
 */
const UNEVEN_GATE = WARN_INFLATION;

/**
 * The heteroscedasticity-consistent sandwich (J^T J)^-1 (sum r_i^2 J_i J_i^T) (J^T J)^-1 n / (n - p) of White
 * (Econometrica 1980, HC1; from memory): right when the noise variance varies along the record, as sampling
 * jitter makes it (its error is the slope times the time error, largest on the ring's first swings, exactly where
 * alpha and omega0 are read). Null when there are no more samples than parameters.
 */
function unevenNoiseSandwich(J: readonly Float64Array[], bread: number[][], residuals: Float64Array): { covariance: number[][]; correlation: number[][] } | null {
  const n = residuals.length;
  const p = bread.length;
  if (n <= p) return null;
  const meat = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < n; i++) {
    const w = (residuals[i] * residuals[i] * n) / (n - p);
    const row = J[i];
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) meat[a][b] += w * row[a] * row[b];
  }
  return sandwichCovariance(bread, meat);
}
