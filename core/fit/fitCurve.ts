// Generic weighted least squares: fits a CurveModel to data and reports values, uncertainties and state.

import { covarianceFromJacobian } from './covariance';
import { minimizeScaled } from './minimizeScaled';
import { normalizeFitInput } from './normalizeFitInput';
import { numericJacobian } from './numericJacobian';
import { chooseScales } from './parameterScale';
import type { CurveData, CurveFitResult, CurveModel, FitOptions } from './types';

/** A value this close to a bound, relative to the bound or the parameter's scale, counts as at it. */
const AT_BOUND = 1e-12;

/**
 * Minimise sum w_i (y_i - f(p, x_i))^2 from `initial`. Throws FitInputError for invalid input only;
 * a fit that does not converge, or whose covariance cannot be estimated, is reported in the result.
 */
export function fitCurve(model: CurveModel, data: CurveData, initial: number[], options?: FitOptions): CurveFitResult {
  const { problem, initial: start, options: normalized } = normalizeFitInput(model, data, initial, options);
  const { min, max, svdCutoff } = normalized;
  const names = model.names;
  const scales = chooseScales(problem, start, normalized);
  const outcome = minimizeScaled(problem, start, scales, normalized);
  const degreesOfFreedom = problem.x.length - names.length;
  const reducedChiSquare = outcome.chiSquare / degreesOfFreedom;
  const warnings: string[] = [];

  const atBound = outcome.p.map((v, j) => {
    const near = (bound: number) =>
      Number.isFinite(bound) && Math.abs(v - bound) <= AT_BOUND * Math.max(Math.abs(bound), scales[j]);
    const which = near(min[j]) ? 'lower' : near(max[j]) ? 'upper' : null;
    if (which !== null) {
      warnings.push(`${names[j]} sits at its ${which} bound (${v}); the fit is held there and its uncertainty is not meaningful`);
    }
    return which !== null;
  });

  let estimate = null;
  if (options?.covariance !== false && Number.isFinite(outcome.chiSquare)) {
    const J = numericJacobian(problem, outcome.p, scales, min, max);
    estimate = covarianceFromJacobian(J, reducedChiSquare, svdCutoff, names);
    warnings.push(...estimate.warnings);
  }

  return {
    status: outcome.status,
    message: outcome.message,
    parameters: names.map((name, j) => ({
      name,
      value: outcome.p[j],
      stderr: estimate?.stderr?.[j] ?? null,
      atBound: atBound[j],
    })),
    covariance: estimate?.covariance ?? null,
    correlation: estimate?.correlation ?? null,
    chiSquare: outcome.chiSquare,
    reducedChiSquare,
    degreesOfFreedom,
    iterations: outcome.iterations,
    warnings,
  };
}
