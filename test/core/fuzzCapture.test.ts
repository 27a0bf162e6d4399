// Property-based tests of the importer: any text yields a Capture or one CaptureError naming the line, never a crash, hang or silent zero.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createCaptureReader, parseCapture, parseCaptureBytes, parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { CaptureError, type Capture } from '../../core/capture/types';
import { encodeText, exportHabits } from '../fixtures/exportHabits';

/** A case slower than this is treated as a hang (generous: a case takes well under a millisecond). */
const HANG_MS = 2000;
/** Errors about the whole text, where no single line is to blame (one that would be a row but for its cells may be named). */
const WHOLE_TEXT = [/^the file is empty: no rows of numbers$/, /^no rows of numbers found in \d+ line\(s\)(?:; line \d+ holds '.*)?$/, /at least 20 samples are needed$/];

type Outcome = { capture: Capture } | { error: CaptureError };

/** Parses, checking that only a CaptureError escapes and that the case ends in time. */
function outcomeOf(text: string, read: (text: string) => Capture = parseCapture): Outcome {
  const start = performance.now();
  try {
    return { capture: read(text) };
  } catch (error) {
    if (!(error instanceof CaptureError)) throw new Error(`not a CaptureError: ${String(error)}`);
    return { error };
  } finally {
    const ms = performance.now() - start;
    if (ms > HANG_MS) throw new Error(`took ${ms.toFixed(0)} ms`);
  }
}

function lineCount(text: string): number {
  return text.split(/\r\n|\r|\n/).length;
}

/** One error, naming its line when a line is to blame. */
function checkError(error: CaptureError, text: string): void {
  expect(error.name).toBe('CaptureError');
  expect(error.message.includes('\n')).toBe(false);
  if (error.line === null) {
    expect(WHOLE_TEXT.some((r) => r.test(error.message)), error.message).toBe(true);
  } else {
    expect(error.message).toMatch(new RegExp(`^line ${error.line}: `));
    expect(error.line).toBeGreaterThanOrEqual(1);
    expect(error.line).toBeLessThanOrEqual(lineCount(text));
  }
}

/** A well-formed capture: channels of equal-length, finite arrays with strictly increasing time. */
function checkCapture(capture: Capture): void {
  expect(capture.channels.length).toBeGreaterThan(0);
  for (const channel of capture.channels) {
    const { time, values, clipped } = channel;
    expect([values.length, clipped.length]).toEqual([time.length, time.length]);
    const nonFinite = values.findIndex((v) => !Number.isFinite(v));
    const backwards = time.findIndex((t, i) => i > 0 && !(t > time[i - 1]));
    expect({ nonFinite, backwards }).toEqual({ nonFinite: -1, backwards: -1 });
  }
}

function check(text: string): Outcome {
  const outcome = outcomeOf(text);
  if ('error' in outcome) checkError(outcome.error, text);
  else checkCapture(outcome.capture);
  return outcome;
}

// Generators -------------------------------------------------------------------------------------------

const JUNK = ['abc', '.', '-', '+', '-.', 'e', '1e', '1e+', '--1', '1.2.3', '1.2k', 'N/A', 'null', 'x', 'V', '0x1F', '1_000', '∞', '½', '—', 'ok', '#', '"', "'"];
const MISSING = ['', 'NaN', 'nan', 'inf', '-inf', 'Infinity', '****', '9.9E37', '-9.9e37'];
const DELIMITERS = [',', ';', '\t', ' '];
const ENDINGS = ['\n', '\r\n', '\r'];

/** Never zero, so that a 0 in a capture can only have been invented by the importer. */
const nonZeroNumber = fc
  .tuple(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), fc.boolean(), fc.constantFrom('plain', 'exp', 'fixed', 'precision'), fc.integer({ min: 1, max: 8 }))
  .map(([magnitude, negative, style, digits]) => {
    const x = negative ? -magnitude : magnitude;
    if (style === 'exp') return x.toExponential(digits);
    if (style === 'fixed') return x.toFixed(4);
    if (style === 'precision') return x.toPrecision(digits);
    return String(x);
  });

/** Free text for headers, preambles and footers: no '0', so it can never spell a zero (every zero needs that digit). */
const text = (maxLength: number) => fc.string({ maxLength }).map((s) => s.replaceAll('0', ''));

const junkCell = fc.oneof(fc.constantFrom(...JUNK), fc.string({ unit: fc.constantFrom(...'abcxyzVmµ%$.-+e_/()[]'.split('')), minLength: 1, maxLength: 6 }));

/** A cell that replaces a number: mostly a missing-value marker (dropped), sometimes junk (an error or a footer). */
const spoiler = fc.oneof({ weight: 2, arbitrary: fc.constantFrom(...MISSING) }, { weight: 1, arbitrary: junkCell });

const header = fc.oneof(
  fc.constantFrom('Time (s),CH1 (V),CH2 (A)', 'time,ch1', 'Time [us];V [mV]', 'x\ty', 'TIME CH1', '"Time (s)","Vout (V)"', 't/ns,i/mA'),
  fc.array(text(10), { minLength: 1, maxLength: 4 }).map((cells) => cells.join(',')),
);

const preambleLine = fc.oneof(
  fc.constantFrom('Sample Interval,1e-9', 'Record Length,100', '# comment', '; note', '// tool', 'Model,bench scope', 'xincrement;2e-9', ''),
  text(30),
);

/** Rows of numbers, time first and increasing, with a few cells spoilt by markers or junk; under any header and preamble. */
const table = fc
  .record({
    preamble: fc.array(preambleLine, { maxLength: 4 }),
    header: fc.option(header, { nil: undefined }),
    delimiter: fc.constantFrom(...DELIMITERS),
    ending: fc.constantFrom(...ENDINGS),
    columns: fc.oneof({ weight: 1, arbitrary: fc.constant(1) }, { weight: 6, arbitrary: fc.integer({ min: 2, max: 3 }) }),
    rows: fc.oneof({ weight: 1, arbitrary: fc.integer({ min: 0, max: 25 }) }, { weight: 3, arbitrary: fc.integer({ min: 20, max: 60 }) }),
    numbers: fc.array(nonZeroNumber, { minLength: 40, maxLength: 40 }),
    spoilt: fc.array(fc.tuple(fc.nat({ max: 39 }), spoiler), { maxLength: 3 }),
    start: fc.double({ min: 1e-6, max: 1, noNaN: true }),
    footer: fc.array(fc.oneof(junkCell, text(12)), { maxLength: 2 }),
  })
  .map((t) => {
    const cells = [...t.numbers];
    for (const [at, replacement] of t.spoilt) cells[at] = replacement;
    const lines = [...t.preamble, ...(t.header === undefined ? [] : [t.header])];
    for (let r = 0; r < t.rows; r++) {
      const values = Array.from({ length: t.columns - 1 }, (_, j) => cells[(r * 2 + j) % cells.length]);
      lines.push([(t.start + r * 1e-3).toPrecision(9), ...values].join(t.delimiter));
    }
    return [...lines, ...t.footer].join(t.ending) + t.ending;
  });

/** Characters that end a cell or a line in any habit: a token is a run of anything else. */
const CELL_END = /[,;\t \r\n]/;

/** The text with the cell (run of non-delimiter characters) at `at` replaced, or the replacement put in at `at`. */
function replaceCell(text: string, at: number, replacement: string): string {
  let start = Math.min(at, text.length);
  let end = start;
  while (start > 0 && !CELL_END.test(text[start - 1])) start--;
  while (end < text.length && !CELL_END.test(text[end])) end++;
  return text.slice(0, start) + replacement + text.slice(end);
}

const HABITS = exportHabits();

/** A habit's text with a few cells spoilt (junk, markers, numbers) and perhaps a line cut short. */
const spoiltHabit = fc
  .record({
    habit: fc.nat({ max: HABITS.length - 1 }),
    spoilt: fc.array(fc.tuple(fc.nat(), fc.oneof(spoiler, nonZeroNumber, fc.constant(''))), { minLength: 1, maxLength: 4 }),
    cut: fc.option(fc.nat(), { nil: undefined }),
  })
  .map(({ habit, spoilt, cut }) => {
    let text = HABITS[habit].text;
    for (const [at, replacement] of spoilt) text = replaceCell(text, at % text.length, replacement);
    return cut === undefined ? text : text.slice(0, cut % text.length);
  });

// Properties -------------------------------------------------------------------------------------------

describe('the importer on arbitrary input (fast-check)', () => {
  it('any byte string (decoded as UTF-8): a capture or one CaptureError naming the line', () => {
    const decoder = new TextDecoder();
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 600 }), (bytes) => {
        check(decoder.decode(bytes));
      }),
      { numRuns: 2500, seed: 20261 },
    );
  });

  it('any string built from the characters of a capture file: the same', () => {
    const alphabet = fc.constantFrom(...'0123456789.,;:-+eE \t\n\r"#NaIif*()[]/skmuµV'.split(''));
    fc.assert(
      fc.property(fc.string({ unit: alphabet, maxLength: 800 }), (text) => {
        check(text);
      }),
      { numRuns: 2500, seed: 20262 },
    );
  });

  it('any mix of numbers, junk and missing cells under any header: no silent zero, errors name their line', () => {
    fc.assert(
      fc.property(table, (text) => {
        const outcome = check(text);
        if ('capture' in outcome) {
          // No cell was a zero, so no value may be one: a junk cell must never become 0.
          for (const channel of outcome.capture.channels) expect(channel.values.includes(0)).toBe(false);
        }
      }),
      { numRuns: 3000, seed: 20263 },
    );
  });

  it('every export habit with cells spoilt at random: a capture or one CaptureError naming the line', () => {
    fc.assert(
      fc.property(spoiltHabit, (text) => {
        check(text);
      }),
      { numRuns: 2000, seed: 20266 },
    );
  });

  it('every export habit, spoilt or not, reads the same from its UTF-8 bytes as from its text', () => {
    const encoder = new TextEncoder();
    const decoder = new TextDecoder();
    const fromBytes = (text: string) => parseCaptureBytes(encoder.encode(text), (bytes) => decoder.decode(bytes));
    fc.assert(
      fc.property(fc.oneof(spoiltHabit, fc.constantFrom(...HABITS.map((h) => h.text))), (text) => {
        const whole = check(text);
        const bytes = outcomeOf(text, fromBytes);
        if ('error' in whole) expect('error' in bytes && bytes.error.message).toBe(whole.error.message);
        else expect('capture' in bytes && bytes.capture).toEqual(whole.capture);
      }),
      { numRuns: 800, seed: 20267 },
    );
  });

  it('every export habit, spoilt or not, reads the same from its UTF-16 or Windows-1252 bytes as from its text', () => {
    // Windows-1252 writes U+00A0..U+00FF as one byte each; a text with other characters beyond ASCII is not written in it.
    const inLatin1 = (text: string) => /^[\u0000-\u007f\u00a0-\u00ff]*$/.test(text);
    const withoutEncoding = (outcome: Outcome) => {
      if ('error' in outcome) return { error: outcome.error.message };
      const { encoding: _, ...summary } = outcome.capture.importSummary;
      return { capture: { ...outcome.capture, importSummary: summary } };
    };
    fc.assert(
      fc.property(
        fc.oneof(spoiltHabit, fc.constantFrom(...HABITS.map((h) => h.text))),
        fc.constantFrom('UTF-16LE', 'UTF-16BE', 'Windows-1252' as const),
        (text, encoding) => {
          fc.pre(encoding !== 'Windows-1252' || inLatin1(text));
          const whole = check(text);
          const encoded = outcomeOf(text, (t) => parseCaptureFileBytes(encodeText(t, encoding)));
          expect(withoutEncoding(encoded)).toEqual(withoutEncoding(whole));
        },
      ),
      { numRuns: 600, seed: 20268 },
    );
  });

  it('junk in the middle of a good table: one CaptureError naming exactly that line', () => {
    // Cells no importer may take for a number or a missing-value marker ('∞' is one: an overrange sample, as 'inf').
    const junk = fc.oneof(
      fc.constantFrom('abc', '.', '+', '-.', 'e', '1e', '1e+', '--1', '1.2.3', '1.2k', 'x', '0x1F', '1_000', '§', '½', 'ok'),
      fc.string({ unit: fc.constantFrom(...'abcxyzVm%$/()[]'.split('')), minLength: 1, maxLength: 6 }),
    );
    fc.assert(
      fc.property(fc.integer({ min: 3, max: 27 }), fc.integer({ min: 1, max: 2 }), junk, nonZeroNumber, (row, column, bad, good) => {
        const rows = Array.from({ length: 30 }, (_, i) => [(1e-6 * (i + 1)).toExponential(3), good, good]);
        rows[row][column] = bad;
        const text = `Time (s),CH1 (V),CH2 (V)\n${rows.map((r) => r.join(',')).join('\n')}\n`;
        const outcome = check(text);
        expect('error' in outcome && outcome.error.line).toBe(row + 2);
      }),
      { numRuns: 1000, seed: 20265 },
    );
  });

  it('gives the same capture, or the same error, however the text is split into chunks', () => {
    const chunked = (cuts: number[]) => (text: string) => {
      const reader = createCaptureReader();
      let previous = 0;
      for (const cut of [...cuts].map((c) => Math.min(c, text.length)).sort((a, b) => a - b)) {
        reader.push(text.slice(previous, cut));
        previous = cut;
      }
      reader.push(text.slice(previous));
      return reader.finish();
    };
    const texts = fc.oneof({ weight: 3, arbitrary: table }, { weight: 1, arbitrary: spoiltHabit });
    fc.assert(
      fc.property(texts, fc.array(fc.nat({ max: 4000 }), { maxLength: 8 }), (text, cuts) => {
        const whole = check(text);
        const pieces = outcomeOf(text, chunked(cuts));
        if ('error' in whole) expect('error' in pieces && pieces.error.message).toBe(whole.error.message);
        else expect('capture' in pieces && pieces.capture).toEqual(whole.capture);
      }),
      { numRuns: 1500, seed: 20264 },
    );
  });
});

describe('the importer on long lines built to make pattern matching backtrack', () => {
  // Each a line of 300 000 characters or so (a third of the 1 MiB line limit): a preamble line of words and spaces ran
  // for minutes and a comment of '(' for 35 s before key/value lines were read by scanning (core/capture/preamble.ts),
  // and a cell of digits ended by a word for 11 s in the no-table message (core/capture/dataShape.ts). HANG_MS bounds each.
  const REPEATS = 150_000;
  const PATTERNS: Record<string, string> = {
    'words and spaces': 'x '.repeat(REPEATS),
    'a key, spaces, a word': `Key${' '.repeat(2 * REPEATS)}value`,
    'opening brackets': '('.repeat(2 * REPEATS),
    'digits then a word': `${'1'.repeat(REPEATS)}x,${'2'.repeat(REPEATS)}y`,
    'digits and spaces': '1 '.repeat(REPEATS),
    'colons': 'a:'.repeat(REPEATS),
    'points': '1.'.repeat(REPEATS),
    'unit brackets': '(s)'.repeat(REPEATS),
  };
  const rows = Array.from({ length: 200 }, (_, i) => `${i * 1e-9},${Math.sin(i / 5) * Math.exp(-i / 60)}`).join('\n');

  it.each(Object.entries(PATTERNS))('%s: before the header, in it, amid the rows, after them, or as the only row', (_, line) => {
    const half = rows.split('\n');
    for (const text of [
      `${line}\nTime (s),CH1 (V)\n${rows}\n`,
      `Time (s),${line}\n${rows}\n`,
      `Time (s),CH1 (V)\n${half.slice(0, 100).join('\n')}\n1e-7,${line}\n${half.slice(100).join('\n')}\n`,
      `Time (s),CH1 (V)\n${rows}\n${line}\n`,
      `a,b\n${line}\n`,
    ]) {
      check(text);
    }
  });
});
