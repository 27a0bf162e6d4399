// Hostile capture files: very wide tables, endless lines and rows far shorter than their table stay within bounded memory.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { MAX_COLUMNS, MAX_LINE_LENGTH } from '../../core/capture/captureLimits';
import { ColumnStore } from '../../core/capture/columnStore';
import { parseCapture, parseCaptureBytes } from '../../core/capture/parseCapture';
import { CaptureError } from '../../core/capture/types';
import { PROBE_TIMEOUT_MS, probe } from './boundsRun';

const decode = (bytes: Uint8Array): string => new TextDecoder().decode(bytes);
const encoder = new TextEncoder();

/** One row of `columns` cells of `cell`, comma-separated. */
function row(columns: number, cell: string): string {
  return `${`${cell},`.repeat(columns - 1)}${cell}\n`;
}

function refusal(text: string): string {
  try {
    parseCaptureBytes(encoder.encode(text), decode);
  } catch (error) {
    expect(error).toBeInstanceOf(CaptureError);
    return (error as Error).message;
  }
  throw new Error('the capture was read');
}

/** Folders made by the tests, removed at the end (one holds 50 MB). */
const made: string[] = [];
afterAll(() => made.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

function tempFile(name: string, content: string | Buffer): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-bounds-'));
  made.push(dir);
  const file = path.join(dir, name);
  writeFileSync(file, content);
  return file;
}

describe('the column store', () => {
  it('reserves for a wide table what a narrow one reserves, not a block per column', () => {
    const store = new ColumnStore(new Array<boolean>(60_000).fill(true), () => 1);
    const cells = store.columns.reduce((sum, c) => sum + c.length, 0);
    const narrow = new ColumnStore([true, true], () => 1).columns.reduce((sum, c) => sum + c.length, 0);
    expect(cells).toBeLessThanOrEqual(Math.max(60_000, 4 * narrow));
  });
});

describe('column limit', () => {
  it('refuses 2,000 columns with one message naming the line and the count', () => {
    const text = `# wide\n${row(2000, '1').repeat(3)}`;
    expect(refusal(text)).toBe(`line 2: the table has 2000 columns, more than the ${MAX_COLUMNS} a capture can hold`);
    expect(() => parseCapture(text)).toThrow(/^line 2: the table has 2000 columns/);
  });

  it('names the header line when the header is the wide part', () => {
    const header = Array.from({ length: 1500 }, (_, i) => `c${i}`).join(',');
    const text = `${header}\n${Array.from({ length: 30 }, (_, i) => `${i},${i % 3}\n`).join('')}`;
    expect(refusal(text)).toBe(`line 1: the table has 1500 columns, more than the ${MAX_COLUMNS} a capture can hold`);
  });

  it(`reads a table of exactly ${MAX_COLUMNS} columns`, () => {
    const rows = Array.from({ length: 25 }, (_, i) => `${i},${'0.5,'.repeat(MAX_COLUMNS - 2)}0.5\n`).join('');
    const capture = parseCaptureBytes(encoder.encode(rows), decode);
    expect(capture.channels).toHaveLength(MAX_COLUMNS - 1);
  });
});

describe('line limit', () => {
  it('refuses a line over the limit on the byte path and the text path alike, naming it', () => {
    const rows = Array.from({ length: 25 }, (_, i) => `${i},1\n`).join('');
    const long = `${'1,'.repeat(MAX_LINE_LENGTH / 2)}1\n`;
    const expected = `line 26: the line is longer than ${MAX_LINE_LENGTH} characters, far longer than any row of a capture`;
    expect(refusal(rows + long + rows)).toBe(expected);
    expect(() => parseCapture(rows + long + rows)).toThrow(expected);
    // In the head, before any table, and unfinished at the end of the file.
    expect(refusal(`# note\n${long}${rows}`)).toBe(expected.replace('26', '2'));
    expect(refusal(rows + long.trimEnd())).toBe(expected);
    expect(() => parseCapture(rows + long.trimEnd())).toThrow(expected);
  });

  it('counts lines ended by CR when the long line is the last', () => {
    const rows = Array.from({ length: 25 }, (_, i) => `${i},1\r`).join('');
    expect(refusal(rows + '1,'.repeat(MAX_LINE_LENGTH))).toMatch(/^line 26: the line is longer/);
  });
});

describe('rows far shorter than their table', () => {
  it('refuses them once they would take more than the file justifies, naming the line', () => {
    const header = `time,${Array.from({ length: 999 }, (_, i) => `c${i}`).join(',')}\n`;
    const rows = Array.from({ length: 20_000 }, (_, i) => `${i},1\n`).join('');
    expect(refusal(header + rows)).toMatch(/^line \d+: \d+ rows hold far fewer cells than the table's 1000 columns/);
  });

  it('still reads a modest file whose rows are shorter than its header', () => {
    const rows = Array.from({ length: 50_000 }, (_, i) => `${i},1\n`).join('');
    expect(parseCaptureBytes(encoder.encode(`t,a,b,c,d,e,f,g,h,i\n${rows}`), decode).layout.rows).toBe(50_000);
  });
});

describe('memory, measured in a child process', () => {
  it('refuses 60,000 columns in a few hundred kB without reserving for them', async () => {
    const file = tempFile('wide.csv', row(60_000, '1').repeat(3));
    const result = await probe('core', file);
    expect(result.killed).toBeNull();
    expect(result.message).toBe(`CaptureError: line 1: the table has 60000 columns, more than the ${MAX_COLUMNS} a capture can hold`);
    expect(result.grewMB).toBeLessThan(result.limitMB);
  }, PROBE_TIMEOUT_MS * 2);

  it('refuses a 50 MB line with no line end, in bounded memory', async () => {
    const file = tempFile('line.csv', Buffer.alloc(50 * 1024 * 1024, '1,'));
    const result = await probe('core', file);
    expect(result.killed).toBeNull();
    expect(result.message).toBe(`CaptureError: line 1: the line is longer than ${MAX_LINE_LENGTH} characters, far longer than any row of a capture`);
    expect(result.grewMB).toBeLessThan(result.limitMB);
  }, PROBE_TIMEOUT_MS * 2);

  it(`reads ${MAX_COLUMNS} columns of a few thousand rows in memory that follows the data`, async () => {
    const header = `time,${Array.from({ length: MAX_COLUMNS - 1 }, (_, i) => `c${i}`).join(',')}\n`;
    const rows = Array.from({ length: 3000 }, (_, i) => `${i}${',0.25'.repeat(MAX_COLUMNS - 1)}\n`).join('');
    const result = await probe('core', tempFile('thousand.csv', header + rows));
    expect(result.killed).toBeNull();
    expect(result.message).toBe('');
    expect(result.rows).toBe(3000);
    expect(result.grewMB).toBeLessThan(result.limitMB);
  }, PROBE_TIMEOUT_MS * 2);
});
