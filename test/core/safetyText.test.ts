// Caution inputs from a capture, and the caution text the command line prints.
import { describe, expect, it } from 'vitest';
import { cautionInputsFromCapture } from '../../core/safety/cautionInputs';
import { evaluateCautions } from '../../core/safety/evaluateCautions';
import { formatCautionsText } from '../../core/safety/cautionText';
import { STANDING_ADVICE } from '../../core/safety/standingAdvice';

describe('cautionInputsFromCapture', () => {
  it.each([
    { unit: 'V', values: [1, -380.5, 12, Number.NaN], expected: { peakVoltage: 380.5 } },
    { unit: 'A', values: [0.5, -3, 2], expected: { peakCurrent: 3 } },
    { unit: 'V', values: [], expected: {} },
  ])('peak |value| of a channel in "$unit"', ({ unit, values, expected }) => {
    expect(cautionInputsFromCapture(values, unit)).toEqual(expected);
  });

  it('says why the peak of a channel in neither V nor A is not weighed, naming the option that states its unit', () => {
    const unitless = cautionInputsFromCapture([1, -400], '');
    expect(unitless).toEqual({ peakNotWeighed: expect.stringContaining('the channel states no unit, so its peak was weighed neither as a voltage nor as a current') });
    expect(unitless.peakNotWeighed).toContain('state V or A with --value-unit');
    expect(cautionInputsFromCapture([1], 'W').peakNotWeighed).toContain('the channel is in W');
    // Carried into the result: no rule firing does not read as a safe peak.
    expect(evaluateCautions(unitless).peakNotWeighed).toBe(unitless.peakNotWeighed);
    expect(evaluateCautions(cautionInputsFromCapture([400], 'V')).peakNotWeighed).toBeUndefined();
  });

  it('takes C and L from fitted quantities or plain numbers, ignoring non-positive ones', () => {
    const fromFit = cautionInputsFromCapture([400], 'V', { C: { value: 470e-6, stderr: 1e-6, unit: 'F' }, L: 2.2e-6 });
    expect(fromFit).toEqual({ peakVoltage: 400, capacitance: 470e-6, inductance: 2.2e-6 });
    expect(cautionInputsFromCapture([5], 'V', { C: -1, L: Number.NaN })).toEqual({ peakVoltage: 5 });
  });
});

describe('formatCautionsText', () => {
  it('lists fired cautions with threshold, words, source and certainty, then advice and the deferral', () => {
    // 400 V on 470 uF: 37.6 J, a shock hazard (LBNL Electrical Safety Manual table 2.2.13).
    const text = formatCautionsText(evaluateCautions({ peakVoltage: 400, capacitance: 470e-6 }));
    expect(text).toMatch(/^cautions \(6\)\n/);
    expect(text).toContain('  ! capacitor energy 37.6 J (threshold 10 J)\n');
    expect(text).toContain('    source: LBNL Electrical Safety Manual, table 2.2.13 (after the DOE electrical-safety classification) [verified]\n');
    expect(text).toContain('[from memory]');
    expect(text).toContain('  stored: capacitor 37.6 J, charge 188 mC\n');
    for (const advice of STANDING_ADVICE) expect(text).toContain(`  - ${advice}\n`);
    expect(text.trimEnd().split('\n').pop()).toMatch(/follow your local electrical codes/);
  });

  it('keeps a low-voltage result short: no advice, but always the deferral', () => {
    const text = formatCautionsText(evaluateCautions({ peakVoltage: 5 }));
    expect(text).toBe(`cautions: no threshold reached\n  ${evaluateCautions({}).deferral}\n`);
  });

  it('says when the peak was not weighed, under the header', () => {
    const text = formatCautionsText(evaluateCautions(cautionInputsFromCapture([400], '')));
    expect(text.split('\n').slice(0, 2)).toEqual([
      'cautions: no threshold reached',
      '  not weighed: the channel states no unit, so its peak was weighed neither as a voltage nor as a current; state V or A with --value-unit',
    ]);
  });

  it('gives the bleeder discharge time', () => {
    const text = formatCautionsText(evaluateCautions({ capacitorVoltage: 400, capacitance: 100e-6, bleederResistance: 1e6 }));
    expect(text).toContain('bleeder to 50 V in 207.9 s'); // 1 Mohm x 100 uF x ln(8), NEC 460.6 one-minute rule fires
    expect(text).toContain('! discharge time 207.9 s (threshold 60 s)');
  });
});
