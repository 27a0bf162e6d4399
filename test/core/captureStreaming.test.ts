// The incremental reader: any split of the text into chunks gives the same capture; a long export reads whole.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createCaptureReader, parseCapture } from '../../core/capture/parseCapture';
import type { Capture } from '../../core/capture/types';

/** A messy export: BOM, CRLF, comments, key/value preamble, quoted header, missing cells, a footer. */
function messyText(): string {
  const rows: string[] = [];
  for (let i = 0; i < 80; i++) {
    const t = (-1e-7 + i * 5e-9).toExponential(6);
    const v = (3.3 * Math.exp(-i / 30) * Math.cos(i / 3)).toFixed(5);
    const w = i % 17 === 5 ? 'NaN' : (0.2 * i).toFixed(2);
    rows.push(i === 40 ? `"${t}","${v}","${w}"` : `${t},${v},${w}`);
  }
  return `\ufeff# buck converter switch node, 12 V in\r\nSample Interval,5e-9\r\n\r\n"Time (s)","Vsw (V)","IL (A)"\r\n${rows.join('\r\n')}\r\nEnd of record\r\n`;
}

function readInChunks(text: string, cuts: number[]): Capture {
  const reader = createCaptureReader();
  let previous = 0;
  for (const cut of [...cuts].sort((a, b) => a - b)) {
    reader.push(text.slice(previous, cut));
    previous = cut;
  }
  reader.push(text.slice(previous));
  return reader.finish();
}

describe('createCaptureReader', () => {
  const text = messyText();
  const whole = parseCapture(text);

  it('reads the messy export as a whole', () => {
    expect(whole.channels.map((c) => c.name)).toEqual(['Vsw', 'IL']);
    expect(whole.layout).toEqual({ delimiter: ',', decimalComma: false, headerLine: 4, firstDataLine: 5, rows: 80 });
    expect(whole.channels[1].dropped).toBe(5);
  });

  it('gives the same capture for any chunking, CRLF pairs and the BOM split included (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: text.length }), { maxLength: 12 }), (cuts) => {
        expect(readInChunks(text, cuts)).toEqual(whole);
      }),
      { numRuns: 150, seed: 42 },
    );
  });

  it('gives the same capture when fed one character at a time', () => {
    const cuts = Array.from({ length: text.length }, (_, i) => i);
    expect(readInChunks(text, cuts)).toEqual(whole);
  });

  it('refuses text after finish()', () => {
    const reader = createCaptureReader();
    reader.push(text);
    reader.finish();
    expect(() => reader.push('1,2,3\n')).toThrow(/after finish/);
  });
});

describe('a long plain export', () => {
  // Import speed is measured by `npm run bench` (bench/speed.ts), not asserted here.
  const rows = 10_000;
  const parts: string[] = ['Time (s),CH1 (V)\n'];
  for (let i = 0; i < rows; i++) parts.push(`${(i * 2e-9).toExponential(6)},${(3.3 * Math.sin(i / 50)).toFixed(6)}\n`);
  const big = parts.join('');

  it('reads every row and the uniform interval', () => {
    const capture = parseCapture(big);
    expect(capture.channels[0].values.length).toBe(rows);
    expect(capture.sampleInterval).toBeCloseTo(2e-9, 20);
  });
});
