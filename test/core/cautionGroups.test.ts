// The fired cautions grouped by quantity: one group per measured quantity, its thresholds strongest first.

import { describe, expect, it } from 'vitest';
import { groupCautions } from '../../core/safety/cautionGroups';
import { evaluateCautions } from '../../core/safety/evaluateCautions';

describe('groupCautions', () => {
  it('states a 400 V peak once with its four thresholds, highest first, and the charge on its own', () => {
    const result = evaluateCautions({ peakVoltage: 400, capacitance: 2e-6 });
    const groups = groupCautions(result.fired);
    expect(groups.map((g) => g.checks)).toEqual(['peak voltage', 'charge']);
    const [peak, charge] = groups;
    expect(peak.measured.value).toBe(400);
    expect(peak.cautions.map((c) => c.threshold.value)).toEqual([120, 50 * Math.SQRT2, 50, 46.7]);
    expect(peak.cautions.map((c) => c.id)).toEqual(['elv-dc', 'elv-ac-crest', 'de-energize-50v', 'accessible-ac-peak']);
    expect(charge.cautions.map((c) => c.id)).toEqual(['charge-45uc']);
    expect(charge.measured.value).toBeCloseTo(800e-6, 12);
    // Nothing lost or doubled in the grouping.
    expect(groups.flatMap((g) => g.cautions).length).toBe(result.fired.length);
  });

  it('gives no group when nothing fires', () => {
    expect(groupCautions(evaluateCautions({ peakVoltage: 15 }).fired)).toEqual([]);
  });
});
