// Jacobian of the weighted model by central differences with steps relative to each parameter.

import { weightedModel, type WeightedProblem } from './weightedProblem';

/** Relative step: near the cube root of machine epsilon, the usual choice for central differences. */
export const RELATIVE_STEP = 1e-5;
/** Below this fraction of its typical size a parameter's step stops shrinking with it. */
const FLOOR_FRACTION = 1e-3;

/**
 * J[i][j] = d(sqrt(w_i) f(p, x_i)) / dp_j, one row per kept data row. The step for p_j is
 * RELATIVE_STEP * max(|p_j|, FLOOR_FRACTION * typical_j); a bound clips the step on its side, so at a bound the
 * difference becomes one-sided, into the box.
 */
export function numericJacobian(
  problem: WeightedProblem,
  p: readonly number[],
  typical: readonly number[],
  min: readonly number[],
  max: readonly number[],
): Float64Array[] {
  const n = problem.x.length;
  const rows = Array.from({ length: n }, () => new Float64Array(p.length));
  const up = new Float64Array(n);
  const down = new Float64Array(n);
  for (let j = 0; j < p.length; j++) {
    const h = RELATIVE_STEP * Math.max(Math.abs(p[j]), FLOOR_FRACTION * typical[j]);
    const hi = [...p];
    const lo = [...p];
    hi[j] = Math.min(p[j] + h, max[j]);
    lo[j] = Math.max(p[j] - h, min[j]);
    const span = hi[j] - lo[j];
    weightedModel(problem, hi, up);
    weightedModel(problem, lo, down);
    for (let i = 0; i < n; i++) rows[i][j] = span > 0 ? (up[i] - down[i]) / span : 0;
  }
  return rows;
}
