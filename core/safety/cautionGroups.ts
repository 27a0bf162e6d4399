// The fired cautions grouped by the quantity they check: one measured value, its thresholds strongest first.

import type { Quantity } from '../quantity';
import type { CautionMeasure } from './cautionRules';
import type { Caution } from './evaluateCautions';

export interface CautionGroup {
  /** The quantity every caution of the group checks ('peak voltage', 'charge'...). */
  checks: CautionMeasure;
  /** Its measured value (the same for every caution of the group). */
  measured: Quantity;
  /** The cautions reached, the highest threshold first: the strongest statement leads. */
  cautions: Caution[];
}

/**
 * One group per quantity, in the order the quantities first fire in the rule table; a quantity reached by
 * several thresholds (a 400 V peak passes four) is stated once, its thresholds and their sources beneath.
 */
export function groupCautions(fired: readonly Caution[]): CautionGroup[] {
  const groups = new Map<CautionMeasure, CautionGroup>();
  for (const caution of fired) {
    const group = groups.get(caution.checks);
    if (group) group.cautions.push(caution);
    else groups.set(caution.checks, { checks: caution.checks, measured: caution.measured, cautions: [caution] });
  }
  for (const group of groups.values()) group.cautions.sort((a, b) => b.threshold.value - a.threshold.value);
  return [...groups.values()];
}
