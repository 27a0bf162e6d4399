// Property-based tests of the command line: any capture file or option value gives a result or exit 2 with one line, and writes nothing.

import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { InputError } from '../../core/inputError';
import { messageFor, namingFile } from '../../main/cli/errors';
import { runCliIn } from './cliHarness';

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-fuzz-cli-'));
const FILE = 'capture.csv';
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = (args: string[]) => runCliIn(dir, args);

/** What the importer alone says about the file's bytes (or text, as UTF-8), as the command line prints it: null when it reads. */
function importError(file: Uint8Array | string): string | null {
  try {
    namingFile(FILE, () => parseCaptureFileBytes(typeof file === 'string' ? new TextEncoder().encode(file) : file));
    return null;
  } catch (error) {
    if (error instanceof InputError) return messageFor(error);
    throw error;
  }
}

/** The command's contract: 0 or 1 with one JSON line, or 2 with one line on stderr; never an internal error; no file written. */
async function checkFit(bytes: Uint8Array | string, extra: string[] = []): Promise<{ code: number; err: string }> {
  writeFileSync(path.join(dir, FILE), bytes);
  const { code, out, err } = await run(['fit', FILE, '--json', ...extra]);
  expect(err).not.toMatch(/internal error/);
  expect([0, 1, 2]).toContain(code);
  if (code === 2) {
    expect(out).toBe('');
    expect(err).toMatch(/^ringbench: [^\n]+\n$/);
  } else {
    expect(err).toBe('');
    const lines = out.trimEnd().split('\n');
    expect(lines).toHaveLength(1);
    expect(typeof JSON.parse(lines[0]).status).toBe('string');
  }
  expect(readdirSync(dir)).toEqual([FILE]);
  return { code, err };
}

const number = fc.double({ min: -1e3, max: 1e3, noNaN: true }).map((x) => x.toPrecision(6));
const cell = fc.oneof({ weight: 20, arbitrary: number }, fc.constantFrom('', 'NaN', '****', 'abc', '1.2k', '.', '+', 'x1'));

/** A two- or three-column table under a header, mostly numbers, sometimes junk. */
const table = fc
  .record({
    header: fc.oneof(fc.constantFrom('Time (s),CH1 (V)', 'Time (s),CH1 (V),CH2 (A)', 't,v', ''), fc.string({ maxLength: 20 })),
    rows: fc.integer({ min: 0, max: 50 }),
    columns: fc.integer({ min: 1, max: 2 }),
    cells: fc.array(cell, { minLength: 100, maxLength: 100 }),
  })
  .map(({ header, rows, columns, cells }) => {
    const lines = header ? [header] : [];
    for (let r = 0; r < rows; r++) lines.push([(1e-8 * (r + 1)).toExponential(4), ...cells.slice(r * columns, r * columns + columns)].join(','));
    return `${lines.join('\n')}\n`;
  });

describe('ringbench fit on arbitrary files (fast-check)', () => {
  it('any bytes: a result or exit 2 with one line naming the line to blame', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 400 }), async (bytes) => {
        const { code, err } = await checkFit(bytes);
        const expected = importError(bytes);
        if (expected !== null) {
          expect(code).toBe(2);
          expect(err).toBe(`ringbench: ${expected}\n`);
        }
      }),
      { numRuns: 200, seed: 7001 },
    );
  }, 240_000);

  it('tables of numbers and junk: the same, and the importer\'s line is the one reported', async () => {
    await fc.assert(
      fc.asyncProperty(table, async (text) => {
        const { code, err } = await checkFit(text);
        const expected = importError(text);
        if (expected !== null) {
          expect(code).toBe(2);
          expect(err).toBe(`ringbench: ${expected}\n`);
        }
      }),
      { numRuns: 250, seed: 7002 },
    );
  }, 240_000);

  it('any option value on a good file: a result or exit 2 with one line', async () => {
    const rows = Array.from({ length: 200 }, (_, i) => `${(i * 1e-8).toExponential(4)},${(i < 20 ? 0 : 1 - Math.exp(-(i - 20) / 30) * Math.cos((i - 20) / 5)).toFixed(5)}`);
    const good = `Time (s),CH1 (V)\n${rows.join('\n')}\n`;
    const value = fc.oneof(fc.constantFrom('C=470n', 'L=2.2u,10%', 'R=4k7', 'C=0', 'C=-1u', 'C=lots', 'series', 'parallel', '1', 'CH1', '-2n', '5n', '1e-6'), fc.string({ maxLength: 12 }));
    const option = fc.constantFrom('--known', '--topology', '--column', '--from', '--to', '--sample-interval');
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(option, value), { maxLength: 3 }), async (pairs) => {
        await checkFit(good, pairs.flat());
      }),
      { numRuns: 100, seed: 7003 },
    );
  }, 240_000);
});
