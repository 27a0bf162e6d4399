// The generic least-squares contract: a model, data, a start, and a result that is data.

/**
 * 'no-response' is the response fit's own: neither a second-order nor a first-order response explains
 * the record better than a constant level (by the information criterion and an F-test).
 */
export type FitStatus = 'converged' | 'max-iterations' | 'failed' | 'no-response';

export interface CurveModel {
  /** Parameter names, in the order of the parameter vector. */
  names: string[];
  /** y at x for parameters p. Must be pure. */
  evaluate(p: readonly number[], x: number): number;
  /** The same at every x into out, where one pass is cheaper than a call per point (optional). */
  evaluateAll?(p: readonly number[], x: Float64Array, out: Float64Array): void;
}

export interface CurveData {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Optional weights (1 / sigma_i^2); default 1. */
  weights?: ArrayLike<number>;
}

export interface FitOptions {
  /** Iteration limit. Default 400. */
  maxIterations?: number;
  /** Lower / upper bounds per parameter (may be -Infinity / Infinity). */
  min?: number[];
  max?: number[];
  /** Relative change in chi^2 counted as convergence. Default 1e-12. */
  tolerance?: number;
  /** Singular values below cutoff * largest are dropped in the covariance. Default 1e-10. */
  svdCutoff?: number;
  /** False: a caller that only wants the minimum skips the covariance (stderr null, no covariance warnings). Default true. */
  covariance?: boolean;
  /**
   * How the trials' Jacobian is taken: 'central' differences (default), or 'forward' from the point's own residuals,
   * one model pass per parameter instead of two, sharpened to central where the trials stall at a narrow minimum.
   */
  trialDifferences?: 'central' | 'forward';
  /**
   * Asked after every accepted step with the parameters and chi^2 reached: true ends the fit there (status 'converged'),
   * for a caller that knows where this start is going (a minimum found from another start, or one it cannot beat). Default: never.
   */
  stopAt?: (p: readonly number[], chiSquare: number) => boolean;
}

export interface FittedParameter {
  name: string;
  value: number;
  /** Standard error scaled by the residual variance; null when the covariance is not estimable. */
  stderr: number | null;
  /** True when the value sits at a bound. */
  atBound: boolean;
}

export interface CurveFitResult {
  status: FitStatus;
  message: string;
  parameters: FittedParameter[];
  /** Covariance matrix (scaled), or null when not estimable. */
  covariance: number[][] | null;
  /** Correlation matrix, or null. */
  correlation: number[][] | null;
  /** Weighted residual sum of squares. */
  chiSquare: number;
  /** chiSquare / (n - p). */
  reducedChiSquare: number;
  degreesOfFreedom: number;
  iterations: number;
  warnings: string[];
}
