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
  const columns = jacobianColumns(problem, p, typical, min, max);
  return Array.from({ length: problem.x.length }, (_, i) => Float64Array.from(columns, (column) => column[i]));
}

/** The same Jacobian as numericJacobian, one array per parameter (column j holds J[i][j] for every row i). */
export function jacobianColumns(
  problem: WeightedProblem,
  p: readonly number[],
  typical: readonly number[],
  min: readonly number[],
  max: readonly number[],
): Float64Array[] {
  const n = problem.x.length;
  const up = new Float64Array(n);
  const down = new Float64Array(n);
  return p.map((value, j) => {
    const h = RELATIVE_STEP * Math.max(Math.abs(value), FLOOR_FRACTION * typical[j]);
    const hi = [...p];
    const lo = [...p];
    hi[j] = Math.min(value + h, max[j]);
    lo[j] = Math.max(value - h, min[j]);
    const span = hi[j] - lo[j];
    weightedModel(problem, hi, up);
    weightedModel(problem, lo, down);
    const column = new Float64Array(n);
    for (let i = 0; i < n; i++) column[i] = span > 0 ? (up[i] - down[i]) / span : 0;
    return column;
  });
}
