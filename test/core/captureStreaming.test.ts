// The incremental reader: any split of the text into chunks gives the same capture; large files import fast.

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

describe('import speed', () => {
  // 10^6 rows, two columns (about 23 MB): within 3x of a bare loop that splits lines and calls Number/parseFloat.
  const rows = 1_000_000;
  const parts: string[] = ['Time (s),CH1 (V)\n'];
  for (let i = 0; i < rows; i++) parts.push(`${(i * 2e-9).toExponential(6)},${(3.3 * Math.sin(i / 50)).toFixed(6)}\n`);
  const big = parts.join('');

  function bareLoop(text: string): number {
    let sum = 0;
    const lines = text.split('\n');
    for (let i = 1; i < lines.length; i++) {
      const cells = lines[i].split(',');
      if (cells.length < 2) continue;
      sum += Number(cells[0]) + parseFloat(cells[1]);
    }
    return sum;
  }

  /** Fastest of two runs (the first also warms the code up), and the last result. */
  function timed<T>(run: () => T): { ms: number; result: T } {
    let ms = Infinity;
    let result = run();
    for (let k = 0; k < 2; k++) {
      const start = performance.now();
      result = run();
      ms = Math.min(ms, performance.now() - start);
    }
    return { ms, result };
  }

  it('imports 10^6 rows within 3x of the bare loop', () => {
    expect(big.length).toBeGreaterThan(20e6);
    const baseline = timed(() => bareLoop(big)).ms;
    const { ms, result: capture } = timed(() => parseCapture(big));
    console.info(`import of ${rows} rows: ${ms.toFixed(0)} ms; bare split loop ${baseline.toFixed(0)} ms`);
    expect(ms).toBeLessThan(3 * baseline);
    expect(capture.channels[0].values.length).toBe(rows);
    expect(capture.sampleInterval).toBeCloseTo(2e-9, 20);
  });
});
