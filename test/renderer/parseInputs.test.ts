// What the panels read from typed text: signed values, a sample's known option (parts, tolerances, positive values: test/core/userValues.test.ts).

import { describe, expect, it } from 'vitest';
import { parseSigned, percentText, splitKnownOption } from '../../renderer/parseInputs';
import { plainMessage } from '../../renderer/plainMessage';
import { CaptureError } from '../../core/capture/types';

describe('panel inputs', () => {
  it.each([
    ['-5', -5],
    ['0', 0],
    ['12m', 0.012],
    ['-600u', -600e-6],
  ])('reads the signed value %s', (text, expected) => {
    expect(parseSigned(text, 's', 'window start')).toBeCloseTo(expected, 15);
  });

  it.each([
    ['C=47u', { name: 'C', text: '47u' }],
    ['l = 10u', { name: 'L', text: '10u' }],
    ['R=390,1%', { name: 'R', text: '390' }],
    ['X=1', null],
  ])('splits the known option %s', (option, expected) => {
    expect(splitKnownOption(option)).toEqual(expected);
  });

  it('writes a tolerance back as percent', () => {
    expect(percentText(0.05)).toBe('5');
    expect(percentText(0)).toBe('');
    expect(percentText(0.001)).toBe('0.1');
  });

  it('shows input errors in their own words and anything else as a plain sentence, never a stack', () => {
    expect(plainMessage(new CaptureError('no numeric rows', 3))).toBe('line 3: no numeric rows');
    const bug = new TypeError('Cannot read properties of undefined (reading "x")\n    at f (worker.ts:1:1)');
    expect(plainMessage(bug)).toBe('something went wrong: Cannot read properties of undefined (reading "x")');
    expect(plainMessage('text')).toBe('something went wrong: text');
  });
});
