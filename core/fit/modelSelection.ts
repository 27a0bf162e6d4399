// Chooses among the layouts' best attempts by the Bayesian information criterion over the effective sample count.

import type { FitSet } from './fitSet';
import { layoutValues } from './responseModel';
import type { Attempt } from './attempt';

/** Smallest residual sum of squares the criterion takes the logarithm of (a perfect fit stays finite). */
const MIN_SSE = 1e-300;

/**
 * Bayesian information criterion: among nested layouts, the extra parameter must pay for itself.
 * Correlated noise carries fewer independent samples than the record holds, so the count is the
 * effective one, n (1 - rho) / (1 + rho), with rho the lag-1 correlation of the closest fit's residuals
 * (an autoregression of order one; no single source, common practice).
 */
export function chooseByInformation(attempts: Attempt[], set: FitSet, t0Start: number): Attempt {
  const closest = attempts.reduce((x, y) => (y.sse < x.sse ? y : x));
  const rho = Math.max(0, lagOneCorrelation(set, closest, t0Start));
  const n = (set.time.length * (1 - rho)) / (1 + rho);
  const bic = (a: Attempt) => n * Math.log(Math.max(a.sse, MIN_SSE)) + a.values.length * Math.log(n);
  return [...attempts].sort((x, y) => bic(x) - bic(y))[0];
}

function lagOneCorrelation(set: FitSet, attempt: Attempt, t0Start: number): number {
  const model = layoutValues(attempt.layout, attempt.values, t0Start, set.time, set.block);
  let c0 = 0;
  let c1 = 0;
  for (let i = 0; i < model.length; i++) {
    const r = set.values[i] - model[i];
    c0 += r * r;
    if (i > 0) c1 += r * (set.values[i - 1] - model[i - 1]);
  }
  return c0 > 0 ? c1 / c0 : 0;
}
