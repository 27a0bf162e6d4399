// Results no bench circuit can give are flagged as the first warning, with the likely cause and the option
// that fixes it: a misread time unit (the sample capture's microseconds read as seconds) or a wrong known part.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { implausibility } from '../../core/circuit/plausibility';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { quantity } from '../../core/quantity';
import { measureCapture } from '../../core/workflow/measure';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const parts = (R: number, L: number, C: number) => ({ R: quantity(R, null, 'ohm'), L: quantity(L, null, 'H'), C: quantity(C, null, 'F') });

describe('implausibility', () => {
  it.each([
    ['a ring below 1 mHz', { f0: 8.9e-3 * 1e-3, recordSpan: 1000 }, /time unit is probably misread.*--time-unit/],
    ['a ring above 1 THz', { f0: 8.9e15, recordSpan: 1e-12 }, /time unit is probably misread/],
    ['kilofarads', { f0: 1e3, recordSpan: 1, components: parts(1, 1e-6, 2e3) }, /C = 2\.00e\+3 F is outside.*--known/],
    ['an inductance below a femtohenry', { f0: 1e9, recordSpan: 1e-6, components: parts(1, 1e-18, 1e-9) }, /L = 1\.00e-18 H/],
  ])('flags %s', (_name, input, message) => {
    expect(implausibility(input)).toMatch(message);
  });

  it.each([
    ['an input filter', { f0: 8.9e3, recordSpan: 1e-3, components: parts(0.15, 6.8e-6, 47e-6) }],
    ['a switch node', { f0: 1e8, recordSpan: 3e-7, components: parts(0.28, 6.5e-9, 390e-12) }],
    ['a mains-frequency tank', { f0: 50, recordSpan: 2, components: parts(10, 1, 10e-6) }],
  ])('passes %s', (_name, input) => {
    expect(implausibility(input)).toBeNull();
  });
});

describe('measureCapture with a misread time unit', () => {
  it('puts the doubt first when the microsecond axis of a capture is read as seconds', () => {
    // The input-filter sample with its time column rewritten in microseconds and no unit to say so.
    const text = readFileSync(path.join(ROOT, 'sample-captures', 'input-filter-step.csv'), 'utf8');
    const capture = parseCapture(text);
    const channel = selectChannel(capture, 'CH1');
    const misread = { ...channel, time: Float64Array.from(channel.time, (t) => t * 1e6) };
    const result = measureCapture({ file: 'misread.csv', channel: misread, knownPart: { topology: 'series', known: { name: 'C', value: 47e-6 } } });
    expect(result.summary.warnings[0]).toMatch(/^implausible: /);
    const right = measureCapture({ file: 'right.csv', channel, knownPart: { topology: 'series', known: { name: 'C', value: 47e-6 } } });
    expect(right.summary.warnings.some((w) => w.startsWith('implausible'))).toBe(false);
  });
});
