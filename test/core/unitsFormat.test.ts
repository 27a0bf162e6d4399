// Display of values in engineering notation and of measured values with their uncertainty.

import { describe, expect, it } from 'vitest';
import { formatEngineering, formatMeasured, formatTimeRange } from '../../core/units/format';
import { quantity } from '../../core/quantity';

describe('formatEngineering', () => {
  it.each([
    [470e-9, 'F', undefined, '470 nF'],
    [2.2e-6, 'H', undefined, '2.2 µH'],
    [10e3, 'ohm', undefined, '10 kΩ'],
    [-12.345e-3, 'A', undefined, '-12.35 mA'],
    [12183.4, 's^-1', undefined, '12.18 ks^-1'],
    [2 * Math.PI * 1e6, 'rad/s', undefined, '6.283 Mrad/s'],
    [999.96, 'V', undefined, '1 kV'], // rounding carries into the next prefix
    [999.94, 'V', undefined, '999.9 V'],
    [1, 's', undefined, '1 s'],
    [0, 'V', undefined, '0 V'],
    [1.5e-20, 'F', undefined, '1.5e-20 F'],
    [4.2e13, 'Hz', undefined, '4.2e13 Hz'],
    [0.0213, '', undefined, '0.0213'],
    [8.5, '', undefined, '8.5'],
    [1234567, '', undefined, '1.235e6'],
    [12.5, '%', undefined, '12.5 %'],
    [1.23456e-6, 's', 2, '1.2 µs'],
    [1.23456e-6, 's', 6, '1.23456 µs'],
    [Number.NaN, 'V', undefined, 'NaN V'],
    [Number.POSITIVE_INFINITY, 'J', undefined, 'Infinity J'],
  ])('%d %s (digits %s) -> %s', (value, unit, digits, expected) => {
    expect(formatEngineering(value, unit, digits)).toBe(expected);
  });
});

describe('formatMeasured', () => {
  it.each([
    // uncertainty to two significant digits, the value rounded to the same decimal place
    [12183.4, 13.2, 's^-1', '12.183 ks^-1 ± 13 s^-1 (0.11 %)'],
    [90728, 4, 'rad/s', '90.7280 krad/s ± 4.0 rad/s (0.0044 %)'],
    [9.94e-9, 1e-11, 'F', '9.940 nF ± 10 pF (0.1 %)'],
    [0.02134, 0.0001, '', '0.02134 ± 0.00010 (0.47 %)'],
    [999.7, 0.99, 'V', '999.70 V ± 990 mV (0.099 %)'],
    // within 2 standard uncertainties of zero (its sign not established): no relative part
    [5, 50, 'V', '5 V ± 50 V'],
    [-1.2e-4, 7.8e-4, 'A', '-120 µA ± 780 µA'],
    [1.99, 1, 'V', '2.0 V ± 1.0 V'],
    [2, 1, 'V', '2.0 V ± 1.0 V (50 %)'],
    [-2.5e-3, 1.234e-5, 'A', '-2.500 mA ± 12 µA (0.49 %)'],
    [0, 1.3e-6, 's', '0.0 µs ± 1.3 µs'],
  ])('%d ± %d %s -> %s', (value, stderr, unit, expected) => {
    expect(formatMeasured(quantity(value, stderr, unit))).toBe(expected);
  });

  it('says so when the uncertainty could not be estimated', () => {
    expect(formatMeasured(quantity(12183.4, null, 's^-1'))).toBe('12.18 ks^-1 (uncertainty not estimable)');
  });

  it('marks an exact value', () => {
    expect(formatMeasured(quantity(470e-9, 0, 'F'))).toBe('470 nF ± 0 (exact)');
  });

  it('writes a time range to the digits that tell its ends apart', () => {
    expect(formatTimeRange(-30e-9, 269.8e-9)).toBe('-30 ns to 269.8 ns');
    expect(formatTimeRange(-997e-9, 6.995e-6)).toBe('-997 ns to 6.995 µs');
    // A logger's axis, 1234.5 s in: 8 µs of it, which '1.234 ks to 1.235 ks' would hide.
    expect(formatTimeRange(1234.499999003, 1234.500006995)).toBe('1234.499999003 s to 1234.500006995 s');
  });

  it('shows an uncertainty within the rounding of the value as rounding, the value to at most 15 digits', () => {
    // A noise-free flat line's fit: its standard error is 2e-17 of the value, the arithmetic's own rounding.
    expect(formatMeasured(quantity(1.000000000000000666e-3, 2.1e-20, 'V'))).toBe('1 mV ± 0 (to rounding)');
    expect(formatMeasured(quantity(-2.5, 1e-15, 'V'))).toBe('-2.5 V ± 0 (to rounding)');
    // Just above it the uncertainty is shown as usual, the value to its place.
    expect(formatMeasured(quantity(1, 1e-14, 'V'))).toBe('1.000000000000000 V ± 10 fV (1e-12 %)');
  });
});
