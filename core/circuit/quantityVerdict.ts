// One quantity of a design verdict: design and measured values, the limits, the decision zone and acceptance;
// a limit the design states that the verdict cannot decide is refused.

import type { Quantity } from '../quantity';
import { accepts, decisionZone, type DecisionRule, type DecisionZone, type QuantityLimits } from './decisionRule';
import { CircuitInputError } from './errors';

export interface VerdictQuantity {
  name: string;
  design: Quantity;
  measured: Quantity;
  /** |measured - design| / sqrt(u_measured^2 + u_design^2): how far from the design, not the decision. */
  marginSigma: number;
  /** Specification limits, SI base units (overshoot in %); null where open. */
  limits: QuantityLimits;
  /** 'design' when the design file states them (limits.<name>), 'tolerances' when its tolerances give them. */
  limitsFrom: 'design' | 'tolerances';
  /** U = k u_measured, the interval's half-width; null when the measurement has no standard uncertainty (the value alone decides). */
  expandedUncertainty: number | null;
  zone: DecisionZone;
  /** Accepted under the verdict's decision rule (kept under its old name for scripts). */
  inTolerance: boolean;
  /**
   * Whether the quantity enters the unit's decision and pass. False for R, L or C derived with another part
   * taken at its design value when the design states no limit for it: one ring measures alpha and omega0,
   * not three parts, so such a row carries the assumed part's tolerance and is shown for diagnosis only.
   */
  counted: boolean;
}

/** The row of one quantity: its zone from value ± k u against the limits, its acceptance under the rule. */
export function judgeQuantity(
  name: string,
  design: Quantity,
  measured: Quantity,
  limits: QuantityLimits,
  limitsFrom: VerdictQuantity['limitsFrom'],
  rule: DecisionRule,
): VerdictQuantity {
  const diff = Math.abs(measured.value - design.value);
  const sigma = Math.hypot(measured.stderr ?? 0, design.stderr ?? 0);
  const marginSigma = sigma > 0 ? diff / sigma : diff === 0 ? 0 : Infinity;
  const expandedUncertainty = measured.stderr === null ? null : rule.coverageFactor * measured.stderr;
  const U = expandedUncertainty ?? 0;
  return {
    name,
    design,
    measured,
    marginSigma,
    limits,
    limitsFrom,
    expandedUncertainty,
    zone: decisionZone(measured.value, U, limits),
    inTolerance: accepts(rule, measured.value, U, limits),
    counted: true,
  };
}

/** Whether a quantity differs from its design enough to look for a cause: counted and not accepted, or its value beyond a limit. */
export function deviates(q: VerdictQuantity): boolean {
  return (q.counted && !q.inTolerance) || q.zone === 'conditional-fail' || q.zone === 'fail';
}

/**
 * A limit the design states that the verdict cannot decide for this capture: refused, since the verdict would
 * otherwise accept the unit with that limit unchecked (a CircuitInputError naming the limits and why).
 */
export function undecidedLimits(names: readonly string[], why: string): never {
  throw new CircuitInputError('limits', `the design limits ${names.join(', ')}, which this capture does not decide (${why}): a verdict would pass ${names.length === 1 ? 'it' : 'them'} unchecked`);
}
