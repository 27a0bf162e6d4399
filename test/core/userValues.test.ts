// What a person types, read the same way by the command line and the window: tolerances, times, values.

import { describe, expect, it } from 'vitest';
import { parseAddedCapacitances, parseKnown, parsePositiveValue, parseSignedTime, parseTolerance } from '../../core/workflow/userValues';

describe('parseTolerance: a percentage, the % sign optional', () => {
  it.each([
    ['', 0],
    ['5', 0.05],
    ['5%', 0.05],
    ['5 %', 0.05],
    ['0.5%', 0.005],
    ['0.05', 0.0005],
    ['99.9', 0.999],
  ])('reads %j as %s', (text, expected) => {
    expect(parseTolerance(text, 'known C')).toBeCloseTo(expected, 15);
  });

  it.each(['-1', '100', '100%', 'five', '5%%'])('refuses %j, naming where it was typed', (text) => {
    expect(() => parseTolerance(text, 'known C')).toThrow(/^known C: tolerance .* percentage/);
  });

  it('reads the tolerance of --known in percent too', () => {
    expect(parseKnown('L=2.2u,10').tolerance).toBeCloseTo(0.1, 15);
    expect(parseKnown('L=2.2u,10%').tolerance).toBeCloseTo(0.1, 15);
    expect(parseKnown('C=470n').tolerance).toBeUndefined();
  });
});

describe('the other typed values', () => {
  it('reads a time before the trigger', () => {
    expect(parseSignedTime('-5n', '--from')).toBeCloseTo(-5e-9, 20);
    expect(parseSignedTime('20n', '--to')).toBeCloseTo(20e-9, 20);
    expect(() => parseSignedTime('soon', '--from')).toThrow(/^--from 'soon'/);
  });

  it('reads one added capacitance per capture after the first', () => {
    expect(parseAddedCapacitances('C=470p,1n', 3)).toEqual([470e-12, 1e-9]);
    expect(() => parseAddedCapacitances('470p', 3)).toThrow(/1 value\(s\) for 2 capture/);
    expect(() => parseAddedCapacitances('0p', 2)).toThrow(/positive capacitance/);
  });

  it('reads an optional positive value', () => {
    expect(parsePositiveValue(undefined, '--probe-c', 'F')).toBeUndefined();
    expect(parsePositiveValue('12p', '--probe-c', 'F')).toBeCloseTo(12e-12, 20);
    expect(() => parsePositiveValue('-1', '--voltage', 'V')).toThrow(/^--voltage '-1': must be a positive value/);
  });
});

describe('parsePositiveValue: values with SI prefixes, as the panels and the options take them', () => {
  it.each([
    ['470n', 'F', 470e-9],
    ['47 uF', 'F', 47e-6],
    ['4k7', 'ohm', 4700],
    ['2.2u', 'H', 2.2e-6],
    ['1e-6', 'H', 1e-6],
  ])('reads %s as %s', (text, unit, expected) => {
    expect(parsePositiveValue(text, 'known C', unit)).toBeCloseTo(expected, 15);
  });

  it.each(['0', '-1n', 'abc', '', '47 H'])('refuses %j as a positive capacitance, naming the field', (text) => {
    expect(() => parsePositiveValue(text, 'known C', 'F')).toThrow(/^known C '.*': /);
  });

});
