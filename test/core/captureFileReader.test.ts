// The file reader: a capture file's bytes in any pieces, its size known or not, give what parseCaptureFileBytes gives them whole, in every encoding.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createCaptureFileReader, parseCaptureFileBytes } from '../../core/capture/parseCapture';
import type { Capture } from '../../core/capture/types';
import { encodeText } from '../fixtures/exportHabits';

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);
const latin1 = (text: string): Uint8Array => Uint8Array.from(Buffer.from(text, 'latin1'));
const concat = (...parts: Uint8Array[]): Uint8Array => Uint8Array.from(Buffer.concat(parts));

type Outcome = { capture: Capture } | { error: string };

function outcome(read: () => Capture): Outcome {
  try {
    return { capture: read() };
  } catch (error) {
    return { error: `${(error as Error).name}: ${(error as Error).message}` };
  }
}

function inPieces(bytes: Uint8Array, cuts: number[], sized: boolean): Capture {
  const reader = createCaptureFileReader({}, sized ? bytes.length : null);
  let previous = 0;
  for (const cut of [...cuts].sort((a, b) => a - b)) {
    reader.pushBytes(bytes.subarray(previous, cut));
    previous = cut;
  }
  reader.pushBytes(bytes.subarray(previous));
  return reader.finish();
}

/** `count` rows of time and a ringing value, CRLF or LF, one cell quoted now and then. */
function rows(count: number, newline = '\n', from = 0): string {
  let text = '';
  for (let i = from; i < from + count; i++) {
    const value = (Math.exp(-i / 400) * Math.cos(i / 5)).toFixed(6);
    text += `${(i * 1e-7).toExponential(6)},${i % 97 === 13 ? `"${value}"` : value}${newline}`;
  }
  return text;
}

/** `count` rows of wall-clock stamps and a value, from row `from` on. */
function stamped(from: number, count: number): string {
  const two = (n: number) => String(n).padStart(2, '0');
  return Array.from({ length: count }, (_, k) => from + k).map((i) => `2021/05/26 1${Math.floor(i / 3600)}:${two(Math.floor(i / 60) % 60)}:${two(i % 60)},${i}\n`).join('');
}

/** A preamble of comment lines longer than several pieces of the head (16 kB each). */
const longPreamble = Array.from({ length: 1500 }, (_, i) => `# note ${i}: the probe sat on the low side of the shunt`).join('\n') + '\n';

const files: Record<string, Uint8Array> = {
  'UTF-8, CRLF, µ in the header and quoted cells': utf8(`Time (µs),CH1 (mV)\r\n${rows(3000, '\r\n')}`),
  'a preamble longer than the head pieces': utf8(`${longPreamble}Time (s),CH1 (V)\n${rows(2000)}`),
  'Windows-1252 after 30 kB of ASCII': latin1(`${longPreamble.slice(0, 30_000)}\n# Meßaufbau\nTime (s),CH1 (V)\n${rows(2000)}`),
  // Whole, the first piece of the head holds both: not UTF-8, so read as Windows-1252 (the UTF-8 µ as two characters).
  'valid UTF-8 and a stray byte in one piece of the head': concat(utf8('# Zeit in µs\n'), latin1('# Spannung, Tastkopf 10:1 ± 2 % µ\nTime (s),CH1 (V)\n'), utf8(rows(2000))),
  // Wall-clock stamps are read as text: all the text after the head is one piece, so the stray byte late in it decides for the µ before.
  'valid UTF-8 and a stray byte in the text after the head': concat(
    utf8(`Sample Interval,1e-3\nTimestamp,CH1 (V)\n${stamped(0, 800)}# µ\n${stamped(800, 700)}`),
    latin1('# \xb5\n'),
    utf8(stamped(1500, 1)),
  ),
  'UTF-16LE with a byte-order mark': encodeText(`Time (µs),CH1 (mV)\r\n${rows(1500, '\r\n')}`, 'UTF-16LE'),
  'UTF-16BE with a byte-order mark': encodeText(`Time (µs),CH1 (mV)\n${rows(1500)}`, 'UTF-16BE'),
  'UTF-16LE without a byte-order mark': encodeText(`Time (s),CH1 (V)\n${rows(1500)}`, 'UTF-16LE without BOM'),
  'UTF-8 with a byte-order mark, CR line ends': encodeText(`Time (s),CH1 (V)\r${rows(2000, '\r')}`, 'UTF-8 with BOM'),
  'no line end after the last row': utf8(`Time (s),CH1 (V)\n${rows(2000).trimEnd()}`),
  'a PNG image': Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]),
  'a NUL byte late in the table': concat(utf8(`Time (s),CH1 (V)\n${rows(2000)}`), Uint8Array.from([0x31, 0, 0x0a]), utf8(rows(500, '\n', 2000))),
  'NUL padding after the table': concat(utf8(`Time (s),CH1 (V)\n${rows(2000)}`), new Uint8Array(3000)),
  'NUL bytes only': new Uint8Array(3000),
  'an empty file': new Uint8Array(0),
  'three bytes': utf8('1,2'),
  'a header alone': utf8('Time (s),CH1 (V)\n'),
};

describe('createCaptureFileReader', () => {
  for (const [name, bytes] of Object.entries(files)) {
    it(`reads ${name} in any pieces as parseCaptureFileBytes reads it whole (property)`, () => {
      const whole = outcome(() => parseCaptureFileBytes(bytes));
      fc.assert(
        fc.property(fc.array(fc.integer({ min: 0, max: bytes.length }), { maxLength: 10 }), fc.boolean(), (cuts, sized) => {
          expect(outcome(() => inPieces(bytes, cuts, sized))).toEqual(whole);
        }),
        { numRuns: 40, seed: 31 },
      );
    });
  }

  it('reads the encodings as named', () => {
    const encoding = (name: string) => (parseCaptureFileBytes(files[name]) as Capture).importSummary.encoding;
    expect(encoding('valid UTF-8 and a stray byte in one piece of the head')).toEqual({ name: 'Windows-1252', byteOrderMark: false, note: 'not valid UTF-8 at line 2' });
    expect(encoding('valid UTF-8 and a stray byte in the text after the head')).toMatchObject({ name: 'Windows-1252', note: 'not valid UTF-8 at line 1504' });
    expect(encoding('UTF-16LE without a byte-order mark')).toMatchObject({ name: 'UTF-16LE', byteOrderMark: false });
  });

  it('reads pieces cut at every line of the head and one byte at a time', () => {
    const bytes = files['valid UTF-8 and a stray byte in one piece of the head'];
    const whole = parseCaptureFileBytes(bytes);
    const head = bytes.subarray(0, 200);
    const lineEnds = head.reduce<number[]>((cuts, b, i) => (b === 10 ? [...cuts, i, i + 1] : cuts), []);
    expect(inPieces(bytes, lineEnds, true)).toEqual(whole);
    expect(inPieces(bytes, Array.from({ length: 200 }, (_, i) => i), false)).toEqual(whole);
  });

  it('refuses an unfinished line over the limit without holding the rest', () => {
    const reader = createCaptureFileReader({}, null);
    reader.pushBytes(utf8(`Time (s),CH1 (V)\n${rows(30)}`));
    const long = utf8('1'.repeat(1 << 19));
    reader.pushBytes(long);
    reader.pushBytes(long);
    expect(() => reader.pushBytes(long)).toThrow(/^line 32: the line is longer than/);
  });
});
