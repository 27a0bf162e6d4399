// The narrow tables' value with its relative uncertainty, and the standard uncertainty itself where a relative one says nothing.
import { describe, expect, it } from 'vitest';
import { showCompact } from '../../renderer/show';
import { quantity, relativeUncertainty } from '../../core/quantity';

describe('relativeUncertainty', () => {
  it('is u/|x| for a value at least 2 standard uncertainties from zero (its sign established at about 95 %, GUM 6.3.3)', () => {
    expect(relativeUncertainty(quantity(-4, 2, 'V'))).toBe(0.5);
    expect(relativeUncertainty(quantity(3.9, 2, 'V'))).toBeNull();
    expect(relativeUncertainty(quantity(0, 0, 'V'))).toBeNull();
    expect(relativeUncertainty(quantity(1, null, 'V'))).toBeNull();
  });
});

describe('showCompact', () => {
  it('gives the relative uncertainty where the value stands clear of zero', () => {
    expect(showCompact(quantity(11021, 14, 's^-1'))).toBe('11.02 ks⁻¹ ± 0.13 %');
  });

  it('gives the standard uncertainty itself for a value within 2 of them of zero', () => {
    expect(showCompact(quantity(-1.2e-4, 7.8e-4, 'A'))).toBe('-120 µA ± 780 µA');
  });
});
