// `batch --shard K/N`: file i of the folder (0-based, by code-point order of its name) belongs to shard (i mod N) + 1,
// so the shards of a folder partition it; a bad K/N is refused naming --shard before anything is fitted or logged.
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listCaptureFiles, shardShare } from '../../main/app/batchFolder';
import { runCliIn } from './cliHarness';

/**
 * In code-point order: upper case before lower case, digits by character, and U+FFFD before U+1F50B (an astral
 * character, which UTF-16 code units would sort first). Torn files: each fails fast, its line still names it.
 */
const IN_ORDER = ['B7.csv', 'a10.csv', 'a2.csv', 'b1.txt', 'c.DAT', 'z\u00e9.csv', '\ufffd.csv', '\u{1f50b}.csv'];
let folder: string;
let lot: string;

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-shard-'));
  lot = join(folder, 'lot');
  mkdirSync(lot);
  for (const name of [...IN_ORDER].reverse()) writeFileSync(join(lot, name), 'Time (s),V\n0,1\n');
  writeFileSync(join(lot, 'notes.md'), 'not a capture');
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

async function shardFiles(shard: string): Promise<string[]> {
  const { code, out } = await runCliIn(folder, ['batch', 'lot', '--shard', shard, '--json', '--jobs', '1']);
  expect(code).toBe(1); // every file is torn
  return (JSON.parse(out) as { file: string }[]).map((e) => e.file);
}

describe('batch --shard', () => {
  it('lists the captures by code point', () => {
    expect(listCaptureFiles(lot)).toEqual(IN_ORDER);
  });

  it("takes a data logger's measurement files (*.lvm) too, and nothing else", () => {
    const other = join(folder, 'logger');
    mkdirSync(other);
    for (const name of ['run.LVM', 'a.csv', 'b.md', 'c.lvm.bak']) writeFileSync(join(other, name), '');
    expect(listCaptureFiles(other)).toEqual(['a.csv', 'run.LVM']);
  });

  it.each([1, 2, 3, 5, 8])('the %i shards of the folder partition it: file i in shard (i mod N) + 1', async (count) => {
    const shares = [];
    for (let k = 1; k <= count; k++) shares.push(await shardFiles(`${k}/${count}`));
    shares.forEach((share, k) => expect(share).toEqual(IN_ORDER.filter((_, i) => i % count === k)));
    expect(shares.flat().sort()).toEqual([...IN_ORDER].sort());
  });

  it('a shard with no file in its share prints an empty result and says so, exit 0', async () => {
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--shard', '9/9', '--json']);
    expect(code).toBe(0);
    expect(JSON.parse(out)).toEqual([]);
    expect(err).toMatch(/shard 9\/9 holds none of the 8 captures/);
  });

  it.each(['0/3', '4/3', '1/0', '3', '1/2/3', 'a/b', '-1/2', '1.5/3', ''])('--shard %j is bad input: exit 2 naming --shard, nothing logged', async (shard) => {
    const log = join(folder, 'refused.jsonl');
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--shard', shard, '--log', log]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toContain('--shard');
    expect(existsSync(log)).toBe(false);
  });

  it('takes the same share of any list', () => {
    expect(shardShare(['a', 'b', 'c', 'd', 'e'], { index: 2, count: 2 })).toEqual(['b', 'd']);
  });
});
