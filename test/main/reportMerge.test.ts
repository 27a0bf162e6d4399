// `report` and `log list` over several bench logs: merged by time, a record in two logs reported with
// both files and counted once, the old single --log form unchanged, bad input exit 2 with nothing written.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { appendBenchLog } from '../../main/io/benchLog';
import { loggedCapture } from '../fixtures/benchLog/loggedCapture';
import { NOMINAL_LOOP } from '../fixtures/benchLog/captures';
import { sampleDesign, sampleVerdict } from '../fixtures/benchLog/sampleRecord';
import { runCliIn } from './cliHarness';

let folder: string;
const design = { path: '/bench/gate-loop.json', name: 'gate loop rev C', sha256: 'cd'.repeat(32), spec: sampleDesign() };

/** A checked record of `unit` logged at minute `minute` of the shift. */
function checked(id: string, unit: string, minute: number, pass: boolean) {
  return loggedCapture(folder, id, unit, `${unit.toLowerCase()}-${id}.csv`, pass ? NOMINAL_LOOP : { ...NOMINAL_LOOP, R: 2 }, {
    time: new Date(Date.UTC(2026, 11, 2, 8, minute)).toISOString(),
    verdict: sampleVerdict(pass),
    design,
  });
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-merge-'));
  // Shard 1 and shard 2 of one lot; SN12 is measured in shard 1, failed, and measured again in shard 2.
  // Record ...0a3 was copied into shard 2 as well.
  const shard1 = join(folder, 'shard-1.jsonl');
  const shard2 = join(folder, 'shard-2.jsonl');
  appendBenchLog(shard1, checked('0000000000a1', 'SN11', 1, true));
  appendBenchLog(shard1, checked('0000000000a2', 'SN12', 2, false));
  appendBenchLog(shard2, checked('0000000000b1', 'SN13', 3, true));
  const copied = checked('0000000000a3', 'SN14', 4, true);
  appendBenchLog(shard1, copied);
  appendBenchLog(shard2, copied);
  appendBenchLog(shard2, checked('0000000000b2', 'SN12', 5, true));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('log list over several logs', () => {
  it('lists the records of both logs by time, the copied record once, and names both files on stderr', async () => {
    const run = await runCliIn(folder, ['log', 'list', 'shard-2.jsonl', '--log', 'shard-1.jsonl', '--json']);
    expect(run.code).toBe(0);
    const listed = JSON.parse(run.out);
    expect(listed.records.map((r: { id: string }) => r.id)).toEqual(['0000000000a1', '0000000000a2', '0000000000b1', '0000000000a3', '0000000000b2']);
    expect(listed.duplicates).toEqual([{ id: '0000000000a3', kept: 'shard-1.jsonl', dropped: 'shard-2.jsonl', identical: true }]);
    expect(listed.logs.map((l: { log: string; records: number }) => [l.log, l.records])).toEqual([['shard-1.jsonl', 3], ['shard-2.jsonl', 3]]);
    expect(run.err).toBe('ringbench: note: record 0000000000a3 (unit SN14) is in both shard-1.jsonl and shard-2.jsonl: counted once, as first read from shard-1.jsonl\n');
  });

  it('keeps the one-log form as it was: --log FILE, the log order, { records, torn }', async () => {
    const run = await runCliIn(folder, ['log', 'list', '--log', 'shard-2.jsonl', '--json']);
    expect(run.code).toBe(0);
    const listed = JSON.parse(run.out);
    expect(listed.records.map((r: { id: string }) => r.id)).toEqual(['0000000000b1', '0000000000a3', '0000000000b2']);
    expect(listed.torn).toBeNull();
    expect(run.err).toBe('');
  });

  it('prints the merged table as text', async () => {
    const run = await runCliIn(folder, ['log', 'list', 'shard-1.jsonl', 'shard-2.jsonl']);
    expect(run.code).toBe(0);
    expect(run.out.match(/SN1\d/g)).toEqual(['SN11', 'SN12', 'SN13', 'SN14', 'SN12']);
  });
});

describe('report over several logs', () => {
  it('merges the logs into one report, counting the copied record once', async () => {
    const run = await runCliIn(folder, ['report', 'shard-1.jsonl', 'shard-2.jsonl', '--out', 'merged.csv']);
    expect(run.code).toBe(0);
    expect(run.out).toBe('wrote merged.csv (csv, 5 measurements from 2 logs)\n');
    expect(run.err).toMatch(/record 0000000000a3 \(unit SN14\) is in both .*shard-1\.jsonl and .*shard-2\.jsonl: counted once/);
    const rows = readFileSync(join(folder, 'merged.csv'), 'utf8').trimEnd().split('\r\n');
    expect(rows).toHaveLength(6);
    expect(rows.filter((r) => r.startsWith('0000000000a3,'))).toHaveLength(1);
  });

  it('writes the lot report of the merged logs: SN12 fails first in shard 1 and passes in shard 2', async () => {
    const run = await runCliIn(folder, ['report', '--log', 'shard-1.jsonl', '--log', 'shard-2.jsonl', '--lot', '--out', 'lot.md']);
    expect(run.code).toBe(0);
    expect(run.out).toBe('wrote lot.md (md lot report, 5 measurements from 2 logs)\n');
    const md = readFileSync(join(folder, 'lot.md'), 'utf8');
    expect(md).toContain('- First-pass yield: 75.0 % (3 of 4)');
    expect(md).toContain('- Final yield: 100.0 % (4 of 4)');
    expect(md).toMatch(/\| SN12 \| pass \| yes \| no \| 2 \|/);
    expect(md).toMatch(/record 0000000000a3 \(unit SN14\) is in both/);
  });

  it('the lot report in HTML names both logs and draws a histogram per quantity', async () => {
    const run = await runCliIn(folder, ['report', 'shard-1.jsonl', 'shard-2.jsonl', '--lot', '--out', 'lot.html']);
    expect(run.code).toBe(0);
    const html = readFileSync(join(folder, 'lot.html'), 'utf8');
    expect(html).toMatch(/logs <code>.*shard-1\.jsonl<\/code>, <code>.*shard-2\.jsonl<\/code>/);
    expect(html.match(/class="lot-histogram"/g)).toHaveLength(2);
    expect(html).not.toContain('<script');
  });

  it.each([
    { args: ['report', '--out', 'x.html'], message: /^ringbench: no bench log given: name one with --log FILE/ },
    { args: ['report', 'shard-1.jsonl', '--log', './shard-1.jsonl', '--out', 'x.html'], message: /bench log '.*shard-1\.jsonl' is given twice/ },
    { args: ['report', 'shard-1.jsonl', 'missing.jsonl', '--out', 'x.html'], message: /no bench log at '.*missing\.jsonl'/ },
    { args: ['log', 'list'], message: /no bench log given: name one with --log FILE/ },
    { args: ['log', 'list', 'shard-1.jsonl', 'shard-1.jsonl'], message: /bench log 'shard-1\.jsonl' is given twice/ },
  ])('refuses $args with exit 2 and writes nothing', async ({ args, message }) => {
    const before = readdirSync(folder).sort();
    const run = await runCliIn(folder, args);
    expect(run.code).toBe(2);
    expect(run.out).toBe('');
    expect(run.err).toMatch(message);
    expect(readdirSync(folder).sort()).toEqual(before);
  });

  it('a log copied whole is counted once', async () => {
    copyFileSync(join(folder, 'shard-1.jsonl'), join(folder, 'copy.jsonl'));
    const run = await runCliIn(folder, ['report', 'shard-1.jsonl', 'copy.jsonl', '--out', 'copy.csv']);
    expect(run.code).toBe(0);
    expect(run.out).toBe('wrote copy.csv (csv, 3 measurements from 2 logs)\n');
    expect(run.err.trim().split('\n')).toHaveLength(3);
  });
});
