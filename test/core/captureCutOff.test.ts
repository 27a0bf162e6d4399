// A file whose last line has no line end and was cut off mid-row: that row is left out with a warning, a whole one kept.

import { describe, expect, it } from 'vitest';
import { parseCapture, parseCaptureBytes } from '../../core/capture/parseCapture';

const N = 30;
const DT = 2e-7;
const timeAt = (i: number): string => (-1e-6 + i * DT).toExponential(6);
const valueAt = (i: number): string => (Math.exp(-i / 10) * Math.cos(i / 2) + 1).toFixed(5);
const TABLE = `Time,CH1\n${Array.from({ length: N }, (_, i) => `${timeAt(i)},${valueAt(i)}`).join('\n')}`;
const utf8 = (bytes: Uint8Array): string => new TextDecoder().decode(bytes);

/** Reads the text both ways (text, and UTF-8 bytes) and checks they agree. */
function read(text: string) {
  const capture = parseCapture(text);
  const fromBytes = parseCaptureBytes(new TextEncoder().encode(text), utf8);
  expect(Array.from(fromBytes.channels[0].values)).toEqual(Array.from(capture.channels[0].values));
  expect(fromBytes.warnings).toEqual(capture.warnings);
  return capture;
}

describe('a last line cut off', () => {
  it.each([
    ['in its last value', 3, "its cell '0.98' has fewer digits than column 2 is written with"],
    ['after its time', 9, "holds 1 of the table's 2 cells"],
    ['in its time', 16, "holds 1 of the table's 2 cells"],
  ])('%s is left out with a warning naming it', (_, cut, reason) => {
    const capture = read(TABLE.slice(0, TABLE.length - cut));
    const [channel] = capture.channels;
    expect(channel.values.length).toBe(N - 1);
    expect(channel.time[N - 2]).toBeCloseTo(Number(timeAt(N - 2)), 15);
    expect(capture.sampleInterval).toBeCloseTo(DT, 18);
    expect(capture.warnings).toContain(`line ${N + 1}, the last, has no line end and ${reason}: it was cut off and is left out`);
  });

  it('in the exponent of its last value is left out (it would read 1000 times too large)', () => {
    const milli = (i: number): string => (Number(valueAt(i)) * 1e-3).toExponential(4).replace(/e-(\d)$/, 'e-0$1');
    const text = `Time,CH1\n${Array.from({ length: N }, (_, i) => `${timeAt(i)},${milli(i)}`).join('\n')}`;
    const capture = read(text.slice(0, text.length - 1));
    expect(capture.channels[0].values.length).toBe(N - 1);
    expect(Math.max(...capture.channels[0].values)).toBeLessThan(0.01);
  });

  it('a whole last line without a line end is read, and so is a free-format one', () => {
    expect(read(TABLE).channels[0].values.length).toBe(N);
    const free = `Time (s),CH1\n${Array.from({ length: N }, (_, i) => `${i * DT},${Number(valueAt(i))}`).join('\n')}\n${N * DT},1.5`;
    const capture = read(free);
    expect(capture.channels[0].values.length).toBe(N + 1);
    expect(capture.warnings).toEqual([]);
  });

  it('a last line ending in a line end is never judged', () => {
    expect(read(`${TABLE.slice(0, TABLE.length - 3)}\n`).channels[0].values.length).toBe(N);
  });
});
