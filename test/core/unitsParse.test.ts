// Reading typed values ('470n', '4k7', '2.2uH') and unit tokens ('mV', 'µs') into SI base units.

import { describe, expect, it } from 'vitest';
import { parseQuantityText, quotedValue, UnitError } from '../../core/units/parseQuantity';
import { readUnitText } from '../../core/units/unitText';

/** Equal to the nearest double of the exact decimal value (relative 1e-15). */
function expectSi(actual: number, expected: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * 1e-15);
}

describe('parseQuantityText', () => {
  it.each([
    ['470n', undefined, 470e-9],
    ['470nF', 'F', 470e-9],
    ['470 nF', 'F', 470e-9],
    ['2.2uH', 'H', 2.2e-6],
    ['2.2µH', 'H', 2.2e-6],
    ['2.2\u03bcH', 'H', 2.2e-6],
    ['1µ', undefined, 1e-6],
    ['4k7', 'ohm', 4.7e3],
    ['4k7Ω', 'ohm', 4.7e3],
    ['2R2', 'ohm', 2.2],
    ['R47', 'ohm', 0.47],
    ['10R', 'ohm', 10],
    ['4n7', 'F', 4.7e-9],
    ['1M5', undefined, 1.5e6],
    ['1e-6', 's', 1e-6],
    ['1.5e-3 s', 's', 1.5e-3],
    ['2.000000E-6', 's', 2e-6],
    ['2ns', 's', 2e-9],
    ['10 kohm', 'ohm', 10e3],
    ['10 kΩ', 'ohm', 10e3],
    ['3.3mF', 'F', 3.3e-3],
    ['5M', undefined, 5e6],
    ['5m', undefined, 5e-3],
    ['-3.3V', 'V', -3.3],
    ['+12 V', 'V', 12],
    ['.5A', 'A', 0.5],
    ['100kHz', 'Hz', 100e3],
    ['  22p  ', 'F', 22e-12],
    ['1G', undefined, 1e9],
  ])('%s (unit %s) = %d', (text, unit, expected) => {
    expectSi(parseQuantityText(text, unit), expected);
  });

  it('gives the correctly rounded double for prefixed values (no 470 * 1e-9 rounding error)', () => {
    expect(parseQuantityText('470n')).toBe(4.7e-7);
    expect(parseQuantityText('4n7')).toBe(4.7e-9);
  });

  it.each([
    ['', 'F'],
    ['   ', undefined],
    ['NaN', undefined],
    ['nan', 'F'],
    ['Infinity', undefined],
    ['1e999', undefined],
    ['470x', 'F'],
    ['470nH', 'F'], // a unit other than the one expected
    ['2R2', 'F'], // R as decimal point only for resistances
    ['4k7k', 'ohm'],
    ['1.2.3', undefined],
    ['1meg', 'ohm'], // M is mega, m is milli; no 'meg'
    ['k', undefined],
    ['1e', undefined],
    ['12 V x', 'V'],
  ])("rejects '%s' (unit %s) with a UnitError naming the text", (text, unit) => {
    let caught: unknown;
    try {
      parseQuantityText(text, unit);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(UnitError);
    const error = caught as UnitError;
    expect(error.name).toBe('UnitError');
    expect(error.message).toContain(`'${text}'`);
    expect(error.message).toContain('expected');
    if (unit) expect(error.message).toContain(unit);
  });
});

describe('quotedValue', () => {
  it('quotes a value as typed, a long one by its first 60 characters, control characters escaped', () => {
    expect(quotedValue('4.7u')).toBe("'4.7u'");
    expect(quotedValue('1'.repeat(1 << 20))).toBe(`'${'1'.repeat(60)}...'`);
    expect(quotedValue('4\u0007u')).toBe("'4\\x07u'");
  });
});

describe('readUnitText', () => {
  it.each([
    ['mV', 1e-3, 'V'],
    ['V', 1, 'V'],
    ['us', 1e-6, 's'],
    ['µs', 1e-6, 's'],
    ['ns', 1e-9, 's'],
    ['ms', 1e-3, 's'],
    ['s', 1, 's'],
    ['kA', 1e3, 'A'],
    ['mA', 1e-3, 'A'],
    ['kΩ', 1e3, 'ohm'],
    ['Mohm', 1e6, 'ohm'],
    ['MHz', 1e6, 'Hz'],
    ['nF', 1e-9, 'F'],
    ['uH', 1e-6, 'H'],
    [' mW ', 1e-3, 'W'],
  ])('%s -> scale %d, unit %s', (text, scale, unit) => {
    const found = readUnitText(text);
    if (found.kind !== 'known') throw new Error(`'${text}' not read`);
    expectSi(found.scale, scale);
    expect(found.unit).toBe(unit);
  });

  it.each(['', '%', 'div', 'm', 'dB', 'mm', 'furlongs', 'µx'])("does not know '%s'", (text) => {
    expect(readUnitText(text).kind).toBe('unknown');
  });
});
