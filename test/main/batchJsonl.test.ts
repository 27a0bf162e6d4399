// `batch --jsonl`: one JSON object per line for every capture as it finishes, each naming its file; a capture that
// cannot be read (hostile bytes, a hostile name, an empty file) is a line of its own with its status and message.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRandom } from '../../core/random';
import { readBenchLog } from '../../main/io/benchLog';
import { NOMINAL_LOOP, writeLoopCapture } from '../fixtures/benchLog/captures';
import { runCliIn } from './cliHarness';

/** Fitting the lot takes minutes, not seconds, on a busy machine (no time is asserted). */
const SLOW = 300_000;

/** A name that breaks a line and quotes itself: one JSON line must still hold it. */
const HOSTILE_NAME = 'unit\n7 "quoted" \u001b[2J.csv';
const GOOD = ['a1.csv', 'a2.csv', 'a3.csv'];
let folder: string;
let lot: string;

interface Line {
  file: string;
  status: string;
  message: string;
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-jsonl-'));
  lot = join(folder, 'lot');
  mkdirSync(lot);
  GOOD.forEach((name, i) => writeLoopCapture(lot, name, NOMINAL_LOOP, 200 + i));
  const random = createRandom(5);
  writeFileSync(join(lot, 'noise.csv'), Buffer.from(Array.from({ length: 4096 }, () => Math.floor(256 * random.uniform())))); // seeded random bytes
  writeFileSync(join(lot, HOSTILE_NAME), 'Time (s),V\n0,1\n');
  writeFileSync(join(lot, 'empty.dat'), '');
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function parseLines(out: string): Line[] {
  expect(out.endsWith('\n')).toBe(true);
  return out
    .slice(0, -1)
    .split('\n')
    .map((line) => JSON.parse(line) as Line);
}

describe('batch --jsonl', () => {
  it.each([1, 2])('with --jobs %i: one parsable line per capture, every file exactly once, the hostile ones failing their own line only', async (jobs) => {
    const log = join(folder, `jsonl-${jobs}.jsonl`);
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--jsonl', '--jobs', String(jobs), '--log', log]);
    expect(err).toBe('');
    expect(code).toBe(1);
    const lines = parseLines(out);
    expect(lines.map((l) => l.file).sort()).toEqual([...GOOD, 'empty.dat', 'noise.csv', HOSTILE_NAME].sort());
    const byFile = new Map(lines.map((l) => [l.file, l]));
    for (const name of GOOD) expect(byFile.get(name)).toMatchObject({ status: 'converged', regime: 'underdamped' });
    for (const name of ['empty.dat', 'noise.csv', HOSTILE_NAME]) {
      const line = byFile.get(name)!;
      expect(Object.keys(line)).toEqual(['file', 'status', 'message']);
      expect(line.status).toBe('error');
      expect(line.message).not.toMatch(/internal error/);
    }
    expect(readBenchLog(log).records.map((r) => r.unit).sort()).toEqual(['a1', 'a2', 'a3']);
  }, SLOW);

  it("a line is --json's element for the same capture", async () => {
    const [jsonl, json] = await Promise.all([runCliIn(folder, ['batch', 'lot', '--jsonl', '--jobs', '1']), runCliIn(folder, ['batch', 'lot', '--json', '--jobs', '1'])]);
    const elements = JSON.parse(json.out) as { file: string; error?: string }[];
    const lines = new Map(parseLines(jsonl.out).map((l) => [l.file, l]));
    for (const element of elements) {
      if (element.error === undefined) expect(lines.get(element.file)).toEqual(element);
      else expect(lines.get(element.file)).toEqual({ file: element.file, status: 'error', message: element.error });
    }
  }, SLOW);

  it('the table keeps the hostile name on a row of its own, its controls shown escaped', async () => {
    const { out } = await runCliIn(folder, ['batch', 'lot', '--jobs', '1']);
    const rows = out.trimEnd().split('\n');
    expect(rows).toHaveLength(7); // the header and six files
    expect(rows).toContainEqual(expect.stringMatching(/^unit\\u000a7 "quoted" \\u001b\[2J\.csv  error: /));
  }, SLOW);

  it('refuses --json with --jsonl: exit 2, nothing printed', async () => {
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--jsonl', '--json']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(/--json and --jsonl/);
  });
});
