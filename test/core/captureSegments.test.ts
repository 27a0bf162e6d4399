// Segmented records (repeated acquisitions of one shape): which blocks are segments, which stay errors, and the segment option.

import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { CaptureError } from '../../core/capture/types';

/** One acquisition: `rows` rows from time `start` (µs steps), values scaled by `gain` so that segments differ. */
function block(rows: number, gain: number, start = -2): string[] {
  return Array.from({ length: rows }, (_, i) => `${((start + i) * 1e-6).toExponential(4)},${(gain * Math.cos(i / 2)).toFixed(5)}`);
}

function capture(lines: string[], segment?: number) {
  return parseCapture(`Time (s),CH1 (V)\n${lines.join('\n')}\n`, segment === undefined ? {} : { segment });
}

const THREE = [...block(30, 1), ...block(30, 2), ...block(30, 3)];

describe('segments', () => {
  it('reads the first by default and the one asked for, each on its own time axis, listing all of them', () => {
    const first = capture(THREE);
    const third = capture(THREE, 3);
    expect(first.channels[0].values[0]).toBe(1);
    expect(third.channels[0].values[0]).toBe(3);
    expect(third.channels[0].time[0]).toBeCloseTo(-2e-6, 15);
    expect(third.channels[0].values.length).toBe(30);
    expect(third.importSummary.segments).toEqual([
      { firstLine: 2, lastLine: 31, rows: 30, read: false },
      { firstLine: 32, lastLine: 61, rows: 30, read: false },
      { firstLine: 62, lastLine: 91, rows: 30, read: true },
    ]);
    expect(third.importSummary.firstDataLine).toBe(62);
    expect(third.importSummary.rows).toBe(30);
  });

  it('refuses a segment number that names none, giving the count', () => {
    for (const asked of [0, 4, 1.5, -1]) {
      expect(() => capture(THREE, asked)).toThrow(CaptureError);
      expect(() => capture(THREE, asked)).toThrow(`segment ${asked} was asked for, but the file has 3 segments; segments count from 1`);
    }
    expect(() => capture(block(30, 1), 2)).toThrow(/but the file has one segment/);
    expect(capture(block(30, 1), 1).importSummary.segments).toEqual([]);
  });

  it('keeps a lone time reset that is no clean repeat an error, as before', () => {
    // Too short a second block, and a second block that does not start where the first did.
    expect(() => capture([...block(30, 1), ...block(10, 2)])).toThrow(/^line 32: time .* is earlier than .*time must increase/);
    expect(() => capture([...block(30, 1), ...block(30, 2, 5)])).toThrow(/^line 32: time .* time must increase/);
  });

  it('keeps a text line where the time goes on an error naming that line, as before', () => {
    const lines = [...block(30, 1), 'Segment 2', ...block(30, 2, 28)];
    expect(() => capture(lines)).toThrow(/^line 32: expected 2 numeric columns, found 'Segment 2'/);
    const short = [...block(30, 1), 'Segment 2', ...block(8, 2)];
    expect(() => capture(short)).toThrow(/^line 32: expected 2 numeric columns, found 'Segment 2'/);
  });

  it('keeps a header repeated where the time goes on a skipped line, with its warning', () => {
    const c = capture([...block(30, 1), 'Time (s),CH1 (V)', ...block(30, 1, 28)]);
    expect(c.importSummary.segments).toEqual([]);
    expect(c.channels[0].values.length).toBe(60);
    expect(c.warnings.join('\n')).toMatch(/repeating the header were skipped \(first on line 32\)/);
  });
});
