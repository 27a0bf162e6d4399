// One row of the "never confidently wrong" table: a generated or sample record, its truth, and what the fit must end in.

import type { Quantity } from '../../../core/quantity';
import type { ResponseFit } from '../../../core/fit/responseFit';

/** What a case's run produced, reduced to what the table checks. */
export interface TrustOutcome {
  /** 'converged' is the one status that claims an answer; every other status declares the fit failed. */
  status: string;
  regime?: string | null;
  /** Quantities by name (alpha, omega0, zeta, tau...), each with its reported standard error. */
  values: Record<string, Quantity | null | undefined>;
}

export interface TrustCase {
  /** The numbered case of the trust issue this row covers (1-10), or 0 for the bench jobs on top. */
  issueCase: number;
  name: string;
  /**
   * 'right': must converge and hold every truth within TRUTH_SIGMAS of its standard error.
   * 'failed': must not claim convergence (no answer exists in the record).
   * 'right-or-failed': either is acceptable; a converged answer must be right.
   */
  expect: 'right' | 'failed' | 'right-or-failed';
  /** True values in SI units, by quantity name; where the truth is a regime, `regime`. */
  truth: Record<string, number>;
  regime?: string;
  run(): TrustOutcome;
}

/** A converged answer must lie within this many of its own reported standard errors of the truth. */
export const TRUTH_SIGMAS = 3;

/** The quantities of a response fit a case may state a truth for. */
export function outcomeOfFit(fit: ResponseFit): TrustOutcome {
  const values: Record<string, Quantity | null | undefined> = {
    alpha: fit.alpha,
    omega0: fit.omega0,
    omegaD: fit.omegaD,
    zeta: fit.zeta,
    Q: fit.Q,
    finalValue: fit.finalValue,
    t0: fit.t0,
    preLevel: fit.preLevel,
  };
  for (const [name, value] of Object.entries(fit as unknown as Record<string, unknown>)) {
    if (!(name in values) && isQuantity(value)) values[name] = value;
  }
  return { status: fit.status, regime: fit.status === 'converged' ? fit.regime : null, values };
}

function isQuantity(value: unknown): value is Quantity {
  return typeof value === 'object' && value !== null && 'value' in value && 'stderr' in value && 'unit' in value;
}

/** Why an outcome breaks its case's promise, or null when it keeps it. */
export function trustViolation(c: TrustCase, outcome: TrustOutcome): string | null {
  const converged = outcome.status === 'converged';
  if (c.expect === 'failed') return converged ? `claims convergence where no answer exists (regime ${outcome.regime})` : null;
  if (!converged) return c.expect === 'right' ? `status ${outcome.status}, an answer was expected` : null;
  if (c.regime !== undefined && outcome.regime !== c.regime) return `regime ${outcome.regime}, truth ${c.regime}`;
  for (const [name, truth] of Object.entries(c.truth)) {
    const q = outcome.values[name];
    if (!q) return `no ${name} in the outcome`;
    if (q.stderr === null) return `${name} = ${q.value} has no standard error`;
    const sigmas = Math.abs(q.value - truth) / q.stderr;
    if (!(sigmas <= TRUTH_SIGMAS)) return `${name} = ${q.value} ± ${q.stderr}, truth ${truth}: ${sigmas.toFixed(1)} sigma off`;
  }
  return null;
}
