// Several fits of one circuit combined: the inverse-variance weighted mean and the chi-square of the spread.

import { quantity, type Quantity } from '../quantity';
import { chiSquareTail } from '../chiSquare';

export interface CombinedValue {
  /** The weighted mean; its standard error is scaled up by `scale` when the spread exceeds the stated errors. */
  value: Quantity;
  /** sum ((x_i - mean) / sigma_i)^2 over the estimates. */
  chiSquare: number;
  dof: number;
  /** P(chi^2 >= chiSquare) when the stated errors are right: a small value says they are not. */
  pValue: number;
  /** max(1, sqrt(chiSquare / dof)): the factor the mean's standard error is scaled by. */
  scale: number;
}

/**
 * The weighted mean of estimates of one quantity, each with its standard error. Where the spread is larger
 * than the errors allow (chi^2 / dof > 1), the mean's error is scaled by sqrt(chi^2 / dof), as the Particle
 * Data Group scales its averages (Review of Particle Physics, Introduction, "averaging procedures"; from
 * memory): the bar then covers the spread that is seen. Null for fewer than two estimates or any without an error.
 */
export function combineEstimates(estimates: readonly Quantity[]): CombinedValue | null {
  if (estimates.length < 2 || estimates.some((q) => q.stderr === null || !(q.stderr > 0))) return null;
  let weightSum = 0;
  let weighted = 0;
  for (const q of estimates) {
    const w = 1 / (q.stderr as number) ** 2;
    weightSum += w;
    weighted += w * q.value;
  }
  const mean = weighted / weightSum;
  let chiSquare = 0;
  for (const q of estimates) chiSquare += ((q.value - mean) / (q.stderr as number)) ** 2;
  const dof = estimates.length - 1;
  const scale = Math.max(1, Math.sqrt(chiSquare / dof));
  return { value: quantity(mean, scale / Math.sqrt(weightSum), estimates[0].unit), chiSquare, dof, pValue: chiSquareTail(chiSquare, dof), scale };
}
