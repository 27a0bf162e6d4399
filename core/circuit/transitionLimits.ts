// Verdict rows for the step metrics a design limits directly (overshoot, settling times): the fitted model's
// metrics against the design's own, with the design's limits.

import { quantity, type Quantity } from '../quantity';
import type { DecisionRule } from './decisionRule';
import type { Design } from './design';
import { modelTransitions, type ModelTransitions } from './modelTransitions';
import { predictResponse, probeUnit } from './predict';
import { judgeQuantity, undecidedLimits, type VerdictQuantity } from './quantityVerdict';
import { evaluatePowerLaw, powerLawRelativeUncertainty, responseRelations } from './relations';
import { toleranceToRelativeUncertainty } from './tolerance';

/** The step metrics a design may limit, as the model metrics name them. */
export const METRICS = ['overshoot', 'settlingTime2', 'settlingTime5'] as const;
type Metric = (typeof METRICS)[number];
/** Why no step metric is decided when the fit gives no reason of its own. */
export const NO_STEP_METRICS = 'the fit gives no step metrics';

/** What the verdict reads of the fit's transition metrics (a FitSummary's `transitions`). */
export interface FittedTransitions {
  model: Pick<ModelTransitions, Metric> | null;
  reason: string | null;
}

/**
 * A row for each metric the design limits: the fitted model's value against the same metric of the design's
 * predicted step (its standard uncertainty from the tolerances through alpha and omega0). A limited metric
 * the fit did not measure (a ringdown, no fitted model metrics) is refused (undecidedLimits), never passed unchecked.
 */
export function limitedTransitionRows(design: Design, fitted: FittedTransitions | undefined, t0: number, rule: DecisionRule): VerdictQuantity[] {
  const limited = METRICS.filter((name) => design.limits?.[name]);
  if (!limited.length) return [];
  const measured = fitted?.model ?? null;
  const expected = designMetrics(design, t0);
  if (!measured) return undecidedLimits(limited, fitted?.reason ?? NO_STEP_METRICS);
  if (!expected) return undecidedLimits(limited, "the design's own response has no step to measure");
  return limited.map((name) => judgeQuantity(name, expected[name], measured[name], design.limits![name]!, 'design', rule));
}

function designMetrics(design: Design, t0: number): Record<Metric, Quantity> | null {
  const p = predictResponse(design, t0);
  const relations = responseRelations(design.topology);
  const relU = {
    R: toleranceToRelativeUncertainty(design.components.R.tolerance),
    L: toleranceToRelativeUncertainty(design.components.L.tolerance),
    C: toleranceToRelativeUncertainty(design.components.C.tolerance),
  };
  const values = { R: design.components.R.value, L: design.components.L.value, C: design.components.C.value };
  const rate = (name: 'alpha' | 'omega0', unit: string) => {
    const v = evaluatePowerLaw(relations[name], values);
    return quantity(v, v * powerLawRelativeUncertainty(relations[name], relU), unit);
  };
  const unit = probeUnit(design);
  const result = modelTransitions({
    status: 'converged',
    params: p,
    alpha: rate('alpha', 's^-1'),
    omega0: rate('omega0', 'rad/s'),
    preLevel: quantity(p.yPre, null, unit),
    finalValue: quantity(p.yFinal, null, unit),
    correlation: null,
  });
  return result.metrics;
}
