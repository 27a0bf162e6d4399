// The verdict's text lines: zone, limits, U and the rule for a verdict with decision zones, and a record logged
// before them (no zone, limits, rule or decision) still read: accepted rows as pass, the rest as fail.
import { describe, expect, it } from 'vitest';
import { decisionText, formatVerdictText, limitsText, ruleText, zoneText } from '../../core/report/verdictText';
import type { Verdict } from '../../core/circuit/verdict';
import { sampleVerdict } from '../fixtures/benchLog/sampleRecord';

/** A verdict as records logged before decision zones kept it. */
function beforeZones(verdict: Verdict): Verdict {
  const { decision: _d, rule: _r, ...rest } = verdict;
  const quantities = verdict.quantities.map(({ zone: _z, limits: _l, limitsFrom: _f, expandedUncertainty: _u, counted: _c, ...q }) => q);
  return { ...rest, quantities } as unknown as Verdict;
}

describe('verdict text', () => {
  it('names each zone with its limits and U, the decision and the default rule', () => {
    const text = formatVerdictText(sampleVerdict(false), 'gate loop rev C');
    expect(text).toMatch(/^ {2}verdict {10}FAIL against 'gate loop rev C' \(rejected: fail\)\n {4}rule {11}guarded-acceptance, guard band w = 1 U, U = k u with k = 2 \(the default/);
    expect(text).toMatch(/\n {4}alpha {10}FAIL .* limits 56\.25 Ms\^-1 to 68\.75 Ms\^-1, U 324 ks\^-1\n/);
    expect(text).toMatch(/\n {4}omega0 {9}pass /);
  });

  it('reads a record logged before decision zones', () => {
    const old = beforeZones(sampleVerdict(false));
    expect([zoneText(old.quantities[0]), zoneText(old.quantities[1])]).toEqual(['fail', 'pass']);
    expect(limitsText(old.quantities[0])).toBe('–');
    expect(decisionText(old)).toBe('rejected: fail');
    expect(ruleText(old)).toBeNull();
    expect(formatVerdictText(old, 'gate loop rev C')).not.toContain('rule ');
  });

  it('writes a one-sided limit as at most or at least', () => {
    const q = sampleVerdict(true).quantities[0];
    expect(limitsText({ ...q, limits: { lower: null, upper: 7e7 } })).toBe('at most 70 Ms^-1');
    expect(limitsText({ ...q, limits: { lower: 5e7, upper: null } })).toBe('at least 50 Ms^-1');
  });
});
