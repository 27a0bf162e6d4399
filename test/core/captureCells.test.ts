// Single cells: the fast number path must agree with Number exactly; markers, junk and time stamps are told apart.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fastNumber, groupingCause, isTimestamp, slowCellValue } from '../../core/capture/cellValue';

const DOT = 46;
const COMMA = 44;

/** Decimal strings of the kinds scopes write: signs, leading zeros, fractions, exponents, padding. */
const decimalText = fc
  .tuple(
    fc.constantFrom('', '-', '+'),
    fc.stringMatching(/^[0-9]{0,12}$/),
    fc.option(fc.stringMatching(/^[0-9]{0,12}$/), { nil: undefined }),
    fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '-', '+'), fc.integer({ min: 0, max: 40 })), { nil: undefined }),
    fc.constantFrom('', ' ', '  '),
  )
  .map(([sign, whole, fraction, exponent, pad]) => {
    const body = `${whole}${fraction === undefined ? '' : `.${fraction}`}`;
    const exp = exponent === undefined ? '' : `${exponent[0]}${exponent[1]}${exponent[2]}`;
    return `${pad}${sign}${body}${exp}${pad}`;
  });

describe('fastNumber', () => {
  it('equals Number() whenever it returns a number, for any decimal text (property)', () => {
    let finite = 0;
    let taken = 0;
    fc.assert(
      fc.property(decimalText, (text) => {
        const fast = fastNumber(text, 0, text.length, DOT);
        if (Number.isFinite(Number(text)) && text.trim() !== '') finite++;
        if (Number.isNaN(fast)) return true; // left to the slow path
        taken++;
        return Object.is(fast, Number(text));
      }),
      { numRuns: 20000, seed: 1234 },
    );
    // The fast path must carry most ordinary numbers, or the check above says little.
    expect(taken).toBeGreaterThan(0.5 * finite);
  });

  it('takes the common scope formats itself (no slow path)', () => {
    for (const text of ['2.000000E-6', '-1.188965E-2', '0.0000007', '4.76127', '10.224', '0', '-0.5', '1e3', ' 12.5 ']) {
      expect(fastNumber(text, 0, text.length, DOT)).toBe(Number(text));
    }
  });

  it('reads a decimal comma when told to', () => {
    const text = '-1,25E-3';
    expect(fastNumber(text, 0, text.length, COMMA)).toBe(-1.25e-3);
    expect(Number.isNaN(fastNumber(text, 0, text.length, DOT))).toBe(true);
  });

  it('reads only the given range of a longer text', () => {
    const text = '1.5,2.25,3';
    expect(fastNumber(text, 4, 8, DOT)).toBe(2.25);
  });

  it.each(['', '   ', '-', '.', 'e5', '1e', '0x10', 'NaN', 'inf', '1.2.3', '12a', '9.9E37', '12345678901234567', '1e400'])(
    "leaves '%s' to the slow path",
    (text) => {
      expect(Number.isNaN(fastNumber(text, 0, text.length, DOT))).toBe(true);
    },
  );
});

describe('slowCellValue', () => {
  it.each([
    ['', NaN],
    ['   ', NaN],
    ['NaN', NaN],
    ['nan', NaN],
    ['inf', NaN],
    ['-inf', NaN],
    // The infinity sign, as some scope software writes an overrange sample.
    ['\u221e', NaN],
    ['-\u221e', NaN],
    ['Infinity', NaN],
    ['****', NaN],
    ['9.9E37', NaN], // the usual scope overrange marker
    ['-9.9E+37', NaN],
    ['1e400', NaN],
    ['n/a', NaN],
    ['"2.5"', 2.5],
    ['12345678901234567', 12345678901234567],
    ['1.5', 1.5],
  ])("'%s' -> %d", (cell, expected) => {
    const value = slowCellValue(cell, false);
    if (Number.isNaN(expected)) expect(Number.isNaN(value)).toBe(true);
    else expect(value).toBe(expected);
  });

  it.each(['abc', '0x1A', '1.2k', '12 V', '5/26/2021', '--5'])("'%s' is junk (null), never zero", (cell) => {
    expect(slowCellValue(cell, true)).toBeNull();
  });

  it('reads a decimal comma only when allowed', () => {
    expect(slowCellValue('2,25', true)).toBe(2.25);
    expect(slowCellValue('2,25', false)).toBeNull();
  });

  it('reads the Unicode minus sign (U+2212) as a minus, in the number and in its exponent', () => {
    expect(slowCellValue('\u22122.5', false)).toBe(-2.5);
    expect(slowCellValue('1.5E\u22126', false)).toBe(1.5e-6);
    expect(slowCellValue('\u22121,5', true)).toBe(-1.5);
  });
});

describe('groupingCause', () => {
  it.each([
    ['1,234.5', 'a comma'],
    ['-1.234,5', 'a point'],
    ['1 234,5', 'a space'],
    ['1\u00a0234\u00a0567,25', 'a no-break space'],
    ['12\u202f345', 'a narrow no-break space'],
    ["1'234.5", 'an apostrophe'],
    ['"1,234,567.0"', 'a comma'],
  ])('%s: a thousands separator (%s)', (cell, separator) => {
    expect(groupingCause(cell)).toBe(`a number written with a thousands separator (${separator}); export the numbers without digit grouping`);
  });

  it.each(['1,2345.6', '1234,567.8', '1,23.4', '1.234.5', '1,234,56', '1, 234', '1e3', 'abc', '1.2k', '12,5'])('%s: no digit groups', (cell) => {
    expect(groupingCause(cell)).toBeNull();
  });
});

describe('isTimestamp', () => {
  it.each([
    ['5/26/2021  11:44:55.465797', true],
    ['2024-03-14T09:26:05.125Z', true],
    ['2024-03-14 09:26:05', true],
    ['14.03.2024 09:26:05,125', true],
    ['11:44:55.4', true],
    ['11:44:55 PM', true],
    // Minutes and seconds without zero padding, as some loggers write them.
    ['10:0:0.5', true],
    ['2024-3-4 9:5:7', true],
    ['2.000000E-6', false],
    // A date alone, its year in full: a logger's date column beside its time-of-day column.
    ['5/26/2021', true],
    ['2026-12-05', true],
    ['05.12.2026', true],
    ['5.26', false],
    ['2026-12', false],
    ['12:30', false],
    ['abc', false],
  ])("'%s' -> %s", (cell, expected) => {
    expect(isTimestamp(cell)).toBe(expected);
  });
});
