// How the known part of a component derivation is written: with its tolerance and how it enters, or said to be taken as exact.
import { describe, expect, it } from 'vitest';
import { describeKnownPart, knownPartValue } from '../../core/workflow/measuredComponents';

describe('the known part as every face writes it', () => {
  it('gives a tolerance as a rectangular half-width and its standard uncertainty (GUM 4.3.7: u = tol/√3)', () => {
    expect(describeKnownPart({ name: 'C', value: 47e-6, tolerance: 0.05 })).toBe('C = 47 µF ± 5 % (rectangular half-width: u = tol/√3 = 2.89 %, GUM 4.3.7)');
  });

  it('says a part without a tolerance is taken as exact, and which two parts then carry the fit\'s uncertainty only', () => {
    expect(describeKnownPart({ name: 'C', value: 47e-6 })).toBe("C = 47 µF, taken as exact (no tolerance given: R and L carry the fit's uncertainty only)");
    expect(describeKnownPart({ name: 'L', value: 6.8e-6, tolerance: 0 })).toBe("L = 6.8 µH, taken as exact (no tolerance given: R and C carry the fit's uncertainty only)");
  });

  it('names the part by its value alone where its tolerance is set aside', () => {
    expect(knownPartValue({ name: 'R', value: 0.15, tolerance: 0.01 })).toBe('R = 150 mΩ');
  });
});
