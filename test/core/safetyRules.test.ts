// Each caution rule at, just below and just above its threshold, with the source beside each case.
import { describe, expect, it } from 'vitest';
import { CAUTION_RULES } from '../../core/safety/cautionRules';
import { CautionInputError, evaluateCautions, type CautionInputs } from '../../core/safety/evaluateCautions';

const firedIds = (inputs: CautionInputs) => evaluateCautions(inputs).fired.map((c) => c.id);
const up = (x: number) => x * (1 + 1e-9);
const down = (x: number) => x * (1 - 1e-9);

interface ThresholdCase {
  rule: string;
  /** Inputs with the rule's measure set to x. */
  at: (x: number) => CautionInputs;
  threshold: number;
  /** Whether the rule fires exactly at the threshold. */
  firesAtThreshold: boolean;
}

const cases: ThresholdCase[] = [
  // IEC 61010-1:2010, 6.3.1: 46.7 V peak accessible-part limit (from memory, per shared/reference/safety.md)
  { rule: 'accessible-ac-peak', at: (v) => ({ peakVoltage: v }), threshold: 46.7, firesAtThreshold: false },
  // OSHA 29 CFR 1910.333(a)(1): parts at less than 50 V need not be de-energized (verified)
  { rule: 'de-energize-50v', at: (v) => ({ peakVoltage: v }), threshold: 50, firesAtThreshold: true },
  // IEC 61140:2016: ELV at most 50 V AC rms, crest 50 sqrt 2 V (verified; crest derived)
  { rule: 'elv-ac-crest', at: (v) => ({ peakVoltage: v }), threshold: 70.71067811865476, firesAtThreshold: false },
  // IEC 61140:2016: ELV at most 120 V ripple-free DC (verified)
  { rule: 'elv-dc', at: (v) => ({ peakVoltage: v }), threshold: 120, firesAtThreshold: false },
  // LBNL Electrical Safety Manual table 2.2.13: >= 100 V and >= 10 J is a shock hazard (verified); a 200 V bank
  { rule: 'capacitor-shock', at: (e) => ({ capacitance: (2 * e) / 200 ** 2, peakVoltage: 200 }), threshold: 10, firesAtThreshold: true },
  // LBNL Electrical Safety Manual table 2.3.5: > 100 J below 100 V is a thermal hazard (verified); 48 V bank
  { rule: 'capacitor-thermal', at: (e) => ({ capacitance: (2 * e) / 48 ** 2, capacitorVoltage: 48 }), threshold: 100, firesAtThreshold: false },
  // LBNL Electrical Safety Manual table 2.3.3: >= 100 V and >= 10 kJ is an arc-flash hazard (verified)
  { rule: 'capacitor-arc-flash', at: (e) => ({ capacitance: (2 * e) / 800 ** 2, capacitorVoltage: 800 }), threshold: 10e3, firesAtThreshold: true },
  // IEC 61010-1 (2nd ed.) 6.3.1 / IEC 60335-1 8.1.4: 45 uC charge limit (verified); 10 V keeps voltage rules silent
  { rule: 'charge-45uc', at: (q) => ({ capacitance: q / 10, capacitorVoltage: 10 }), threshold: 45e-6, firesAtThreshold: false },
  // SAE J1766 discussion: 0.2 J low-energy limit (title verified, limit from memory)
  { rule: 'inductor-energy', at: (e) => ({ inductance: 1e-3, peakCurrent: Math.sqrt((2 * e) / 1e-3) }), threshold: 0.2, firesAtThreshold: false },
  // NEC 460.6: 600 V or less discharged to 50 V within 1 minute (verified); t = R C ln(V0 / 50), 400 V, 100 uF
  {
    rule: 'slow-discharge',
    at: (t) => ({ capacitance: 100e-6, capacitorVoltage: 400, bleederResistance: t / (100e-6 * Math.log(400 / 50)) }),
    threshold: 60,
    firesAtThreshold: false,
  },
  // NEC 460.28: above 600 V discharged to 50 V within 5 minutes (from memory; Cal. Code Regs. T8 2893 verified)
  {
    rule: 'slow-discharge-above-600v',
    at: (t) => ({ capacitance: 20e-6, capacitorVoltage: 2000, bleederResistance: t / (20e-6 * Math.log(2000 / 50)) }),
    threshold: 300,
    firesAtThreshold: false,
  },
];

describe('caution rules at their thresholds', () => {
  it('covers every rule of the table exactly once', () => {
    expect(cases.map((c) => c.rule).sort()).toEqual(CAUTION_RULES.map((r) => r.id).sort());
  });

  it.each(cases)('$rule: silent just below, as documented at, firing just above', ({ rule, at, threshold, firesAtThreshold }) => {
    expect(firedIds(at(down(threshold)))).not.toContain(rule);
    expect(firedIds(at(up(threshold))).includes(rule)).toBe(true);
    // Exactly at the threshold the measure is recomputed through sqrt/ln, so test a hair inside each side.
    const exact = CAUTION_RULES.find((r) => r.id === rule)!;
    expect(exact.threshold).toBeCloseTo(threshold, 12);
    expect(exact.fires).toBe(firesAtThreshold ? 'at or above' : 'above');
  });

  it.each([
    // Direct threshold values where the measure is exact, to pin >= against >.
    { inputs: { peakVoltage: 50 }, rule: 'de-energize-50v', fires: true }, // OSHA 29 CFR 1910.333(a)(1)
    { inputs: { peakVoltage: 120 }, rule: 'elv-dc', fires: false }, // IEC 61140: at most 120 V DC is ELV
    { inputs: { peakVoltage: 46.7 }, rule: 'accessible-ac-peak', fires: false }, // IEC 61010-1 6.3.1 (from memory)
    { inputs: { capacitance: 2e-3, capacitorVoltage: 100 }, rule: 'capacitor-shock', fires: true }, // LBNL 2.2.13: 10 J at 100 V
    { inputs: { capacitance: 2, capacitorVoltage: 100 }, rule: 'capacitor-arc-flash', fires: true }, // LBNL 2.3.3: 10 kJ at 100 V
  ])('$rule exactly at its threshold fires: $fires', ({ inputs, rule, fires }) => {
    expect(firedIds(inputs).includes(rule)).toBe(fires);
  });
});

describe('voltage conditions of the capacitor rules', () => {
  it('a 10 J capacitor below 100 V is not a shock hazard (LBNL table 2.2.13 needs >= 100 V)', () => {
    const C = (2 * 20) / 99 ** 2; // 20 J at 99 V
    expect(firedIds({ capacitance: C, capacitorVoltage: 99 })).not.toContain('capacitor-shock');
    expect(firedIds({ capacitance: (2 * 20) / 100 ** 2, capacitorVoltage: 100 })).toContain('capacitor-shock');
  });

  it('the thermal class applies only below 100 V (LBNL table 2.3.5)', () => {
    const energy = 150;
    expect(firedIds({ capacitance: (2 * energy) / 99.9 ** 2, capacitorVoltage: 99.9 })).toContain('capacitor-thermal');
    expect(firedIds({ capacitance: (2 * energy) / 100 ** 2, capacitorVoltage: 100 })).not.toContain('capacitor-thermal');
  });

  it('the 1 minute rule covers 600 V and less, the 5 minute rule above 600 V (NEC 460.6 / 460.28)', () => {
    const slow = (v: number) => firedIds({ capacitance: 100e-6, capacitorVoltage: v, bleederResistance: 10e6 });
    expect(slow(600)).toContain('slow-discharge');
    expect(slow(600)).not.toContain('slow-discharge-above-600v');
    expect(slow(601)).toContain('slow-discharge-above-600v');
    expect(slow(601)).not.toContain('slow-discharge');
  });

  it('no discharge time at or below 50 V: the capacitor is already at the safe level (NEC 460.6)', () => {
    const result = evaluateCautions({ capacitance: 1, capacitorVoltage: 50, bleederResistance: 1e9 });
    expect(result.discharge).toBeUndefined();
    expect(result.fired.map((c) => c.id)).not.toContain('slow-discharge');
  });
});

describe('evaluateCautions', () => {
  it('computes C V^2 / 2, L I^2 / 2, V C and R C ln(V0 / 50 V)', () => {
    const result = evaluateCautions({ capacitance: 470e-6, peakVoltage: 400, inductance: 2.2e-6, peakCurrent: -30, bleederResistance: 100e3 });
    expect(result.energies.capacitor).toEqual({ value: 0.5 * 470e-6 * 400 ** 2, stderr: null, unit: 'J' });
    expect(result.energies.inductor!.value).toBeCloseTo(0.5 * 2.2e-6 * 900, 15);
    expect(result.charge!.value).toBeCloseTo(470e-6 * 400, 15);
    expect(result.discharge!.time.value).toBeCloseTo(100e3 * 470e-6 * Math.log(8), 9);
    expect(result.discharge!.toVoltage).toBe(50);
  });

  it('a 5 V gate-drive loop fires nothing but still carries the advice and the deferral', () => {
    const result = evaluateCautions({ peakVoltage: 5.4, capacitance: 2.2e-9, inductance: 12e-9 });
    expect(result.fired).toEqual([]);
    expect(result.advice.length).toBeGreaterThanOrEqual(3);
    expect(result.adviceSource).toMatch(/common practice/);
    expect(result.deferral).toMatch(/local electrical codes/);
  });

  it('a 400 V bus fires the voltage rules with measured and threshold values in SI units', () => {
    const result = evaluateCautions({ peakVoltage: -400 });
    expect(result.fired.map((c) => c.id)).toEqual(['accessible-ac-peak', 'de-energize-50v', 'elv-ac-crest', 'elv-dc']);
    for (const c of result.fired) {
      expect(c.measured).toEqual({ value: 400, stderr: null, unit: 'V' });
      expect(c.source.length).toBeGreaterThan(5);
      expect(['verified', 'from memory']).toContain(c.certainty);
    }
  });

  it('uses the larger of peak and capacitor voltage for the voltage rules', () => {
    expect(firedIds({ peakVoltage: 5, capacitorVoltage: 60 })).toContain('de-energize-50v');
  });

  it.each([
    { inputs: { peakVoltage: Number.NaN }, field: 'peakVoltage' },
    { inputs: { capacitance: -1e-6 }, field: 'capacitance' },
    { inputs: { bleederResistance: Infinity }, field: 'bleederResistance' },
    { inputs: { inductance: '2u' as unknown as number }, field: 'inductance' },
  ])('rejects a bad $field naming it', ({ inputs, field }) => {
    expect(() => evaluateCautions(inputs)).toThrow(CautionInputError);
    expect(() => evaluateCautions(inputs)).toThrow(new RegExp(`^${field}:`));
  });

  it('every rule names a source and says how sure it is, as shared/reference/safety.md does', () => {
    const memory = CAUTION_RULES.filter((r) => r.certainty === 'from memory').map((r) => r.id);
    expect(memory.sort()).toEqual(['accessible-ac-peak', 'inductor-energy', 'slow-discharge-above-600v']);
    for (const rule of CAUTION_RULES) expect(rule.message).toMatch(/\.$/);
  });
});
