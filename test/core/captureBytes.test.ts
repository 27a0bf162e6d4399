// The byte reader: a file's UTF-8 bytes, whole or in any chunks, give exactly what the text reader gives for its text.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createCaptureReader, parseCapture, parseCaptureBytes } from '../../core/capture/parseCapture';
import type { Capture } from '../../core/capture/types';

const encoder = new TextEncoder();
/** Keeps a byte-order mark, as Node's Buffer decoding does, so the parser sees what the text path sees. */
const decoder = new TextDecoder('utf-8', { ignoreBOM: true });
const decode = (bytes: Uint8Array): string => decoder.decode(bytes);

type Outcome = { capture: Capture } | { error: string };

function outcome(read: () => Capture): Outcome {
  try {
    return { capture: read() };
  } catch (error) {
    return { error: `${(error as Error).name}: ${(error as Error).message}` };
  }
}

function inChunks(bytes: Uint8Array, cuts: number[]): Capture {
  const reader = createCaptureReader({}, decode);
  let previous = 0;
  for (const cut of [...cuts].sort((a, b) => a - b)) {
    reader.pushBytes(bytes.subarray(previous, cut));
    previous = cut;
  }
  reader.pushBytes(bytes.subarray(previous));
  return reader.finish();
}

function expectSame(text: string): Outcome {
  const expected = outcome(() => parseCapture(text));
  const bytes = encoder.encode(text);
  expect(outcome(() => parseCaptureBytes(bytes, decode))).toEqual(expected);
  return expected;
}

/** Rows before the ones a case is about: well past the text the reader decodes while it learns the layout. */
const LEAD = 1200;

function table(rows: string[], header = 'Time (s),CH1 (V)', newline = '\n'): string {
  return [header, ...rows].join(newline) + newline;
}

/** LEAD + 60 rows, row i from `row(i)`; the rows a case is about start at LEAD. */
function rows(row: (i: number) => string): string[] {
  return Array.from({ length: LEAD + 60 }, (_, i) => row(i));
}

/** Comma rows of time and a value; from LEAD on, the value cell from `cell`. */
function ramp(cell: (i: number) => string = (i) => (Math.sin(i / 3) * 2.5).toFixed(4)): string[] {
  return rows((i) => `${(i * 1e-6).toExponential(8)},${i < LEAD ? (Math.sin(i / 3) * 2.5).toFixed(4) : cell(i)}`);
}

const late = (i: number, every: number, at: number): boolean => i >= LEAD && i % every === at;

describe('parseCaptureBytes', () => {
  const cases: Record<string, string> = {
    'plain comma table': table(ramp()),
    'CRLF, BOM, comments and a preamble': `\ufeff# bench\r\nSample Interval,1e-6\r\n\r\n${table(ramp(), 'Time (s),CH1 (V)', '\r\n')}`,
    'quoted cells and a quoted header': table(ramp((i) => (i % 7 === 3 ? `"${i}.5"` : `${i}.25`)), '"Time (s)","CH1 (V)"'),
    'decimal commas in a semicolon table': table(rows((i) => `${i};${(i * 0.5).toFixed(2).replace('.', ',')}`), 'Time (s);CH1 (V)'),
    'tab separated with empty and padded cells': table(
      rows((i) => `${i}e-6\t${late(i, 9, 0) ? '' : late(i, 9, 1) ? ' 5 ' : i * 2}\t${i}`),
      'Time (s)\tA (V)\tB (V)',
    ),
    'whitespace separated, padded': table(
      rows((i) => `  ${i}e-6   ${-i}.5\t${i} `),
      'time   a   b',
    ),
    'whitespace separated, a sign glued to a number': table(
      rows((i) => (i === LEAD + 30 ? `${i}e-6 5-3` : `${i}e-6 ${i} ${-i}`)),
      'time a b',
    ),
    'missing-value markers, overrange and stars': table(ramp((i) => ['NaN', '9.9E37', '****', '', '-inf'][i % 9] ?? `${i}`)),
    'numbers the fast path leaves to the text path': table(
      ramp((i) => ['1234567890123456', '1e', '1e-', '1e123456', '.5', '5.', '+7', '-0', '00012', '1.5e+3', ' 2 ', '0x10'][i % 12]),
    ),
    'non-ASCII in cells and a unit header': table(ramp((i) => (i === LEAD + 20 ? '3\u00a0V' : `${i}`)), 'Zeit (µs),Spannung (mV)'),
    'extra blank and extra filled cells': table(ramp((i) => (i === LEAD + 30 ? `${i},, ` : i === LEAD + 35 ? `${i},7` : `${i},`))),
    'a trailing footer': `${table(ramp())}End of record\n`,
    'metadata beside the first rows, empty fields opening the others': rows(
      (i) => `${['Record Length', 'Sample Interval', '', 'Source'][i] ?? ''},${['1260', '1e-6', '', 'CH1'][i] ?? ''},,${i}e-6,${i % 7 === 3 ? '' : -i},`,
    ).join('\n'),
    'junk inside the table': table(ramp((i) => (i === LEAD + 25 ? 'overload!' : `${i}`))),
    'a stray CR inside a line': table(ramp((i) => (i === LEAD + 12 ? '1\r2' : `${i}`))),
    'CR line endings': table(ramp(), 'Time (s),CH1 (V)', '\r'),
    'no final line end': table(ramp()).trimEnd(),
    'blank lines and comments inside the table': table(ramp().flatMap((r, i) => (late(i, 10, 5) ? [r, '', '  # note', '%x', '//y', ' \r'] : [r]))),
    'wall-clock time stamps': `Sample Interval,1e-3\n${table(
      rows((i) => `2021/05/26 ${String(10 + Math.floor(i / 3600)).padStart(2, '0')}:${String(Math.floor(i / 60) % 60).padStart(2, '0')}:${String(i % 60).padStart(2, '0')},${i}`),
      'Timestamp,CH1 (V)',
    )}`,
    'one column': `Sample Interval,1e-6\n${table(
      rows((i) => `${i * 3}`),
      'CH1 (V)',
    )}`,
    'a long preamble': `${Array.from({ length: 3000 }, (_, i) => `# comment line ${i} with some words in it`).join('\n')}\n${table(ramp())}`,
  };

  for (const [name, text] of Object.entries(cases)) {
    it(`reads ${name} as the text reader does`, () => {
      expectSame(text);
    });
  }

  it('reads the same capture for any chunking of the bytes (property)', () => {
    const text = cases['CRLF, BOM, comments and a preamble'] + cases['non-ASCII in cells and a unit header'].split('\n').slice(1).join('\n');
    const bytes = encoder.encode(text);
    const whole = outcome(() => parseCapture(text));
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: bytes.length }), { maxLength: 12 }), (cuts) => {
        expect(outcome(() => inChunks(bytes, cuts))).toEqual(whole);
      }),
      { numRuns: 150, seed: 7 },
    );
  });

  it('reads random cells as the text reader does (property)', () => {
    const cell = fc.oneof(
      fc.double({ noNaN: true }).map(String),
      fc.integer().map(String),
      fc.stringMatching(/^ ?[-+]?\d{0,17}(\.\d{0,6})?([eE][-+]?\d{0,6})? ?$/),
      fc.constantFrom('', ' ', 'NaN', '"1.5"', '1,5', '\t', '#', '1e', '-'),
    );
    const row = fc.tuple(cell, cell).map(([a, b]) => `${a},${b}`);
    fc.assert(
      fc.property(fc.array(row, { maxLength: 30 }), (cells) => {
        expectSame(table([...ramp().slice(0, LEAD), ...cells.map((r, i) => `${(LEAD + i) * 1e-6},${r.split(',')[1]}`), ...cells]));
      }),
      { numRuns: 200, seed: 11 },
    );
  });

  it('refuses bytes without a decoder, and after finish()', () => {
    expect(() => createCaptureReader().pushBytes(encoder.encode('1,2\n'))).toThrow(/decoder/);
    const reader = createCaptureReader({}, decode);
    reader.pushBytes(encoder.encode(cases['plain comma table']));
    reader.finish();
    expect(() => reader.pushBytes(encoder.encode('1,2\n'))).toThrow(/after finish/);
  });
});
