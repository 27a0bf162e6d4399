// The typed labels of a bench log record refuse what would show them wrongly: control and bidirectional characters.

import { describe, expect, it } from 'vitest';
import { checkLabel, checkNote } from '../../main/app/labels';

describe('checkLabel', () => {
  it('keeps a plain unit id, trimmed', () => {
    expect(checkLabel('  SN042 ', '--unit')).toBe('SN042');
  });
  it.each([
    ['right-to-left override', 'SN\u202e240'],
    ['right-to-left isolate', 'SN\u2067042'],
    ['left-to-right mark', 'SN\u200e042'],
  ])('refuses a %s, naming the option', (_, text) => {
    expect(() => checkLabel(text, '--unit')).toThrow(/--unit must not contain bidirectional control characters/);
  });
  it.each([
    ['NUL', 'SN\u0000042'],
    ['escape', 'SN\u001b[2J'],
    ['C1 control', 'SN\u009b042'],
    ['line feed', 'SN\n042'],
  ])('refuses a %s', (_, text) => {
    expect(() => checkLabel(text, '--operator')).toThrow(/--operator must not contain line breaks or control characters/);
  });
});

describe('checkNote', () => {
  it('keeps line breaks and tabs, and reads a blank note as none', () => {
    expect(checkNote('probe tip on Q2 drain\n\tground spring', '--note')).toBe('probe tip on Q2 drain\n\tground spring');
    expect(checkNote('   ', '--note')).toBeNull();
  });
  it.each([
    ['NUL', 'ok\u0000'],
    ['escape sequence', 'ok \u001b]0;title\u0007'],
  ])('refuses a %s', (_, text) => {
    expect(() => checkNote(text, '--note')).toThrow(/--note must not contain control characters other than line breaks and tabs/);
  });
  it('refuses a right-to-left override', () => {
    expect(() => checkNote('fixture \u202e3', '--note')).toThrow(/bidirectional/);
  });
  it('refuses a note longer than a paragraph', () => {
    expect(() => checkNote('x'.repeat(2001), '--note')).toThrow(/at most 2000 characters, got 2001/);
  });
});
