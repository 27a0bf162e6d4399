// Two shards of a lot run side by side under GNU parallel with the built command line, each appending to its own
// bench log: together the logs hold every capture exactly once, and `report` merges them into one report.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readBenchLog } from '../../main/io/benchLog';
import { NOMINAL_LOOP, writeLoopCapture } from '../fixtures/benchLog/captures';

/** Two shards fitting three captures each take minutes, not seconds, on a busy machine (no time is asserted). */
const SLOW = 300_000;
const ROOT = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');
const CLI = join(ROOT, 'bin/ringbench.js');
/** Six units of the gate loop, their damping resistor spread from 1 to 2.25 ohm. */
const UNITS = ['sn101', 'sn102', 'sn103', 'sn104', 'sn105', 'sn106'];
const hasParallel = spawnSync('parallel', ['--version'], { encoding: 'utf8' }).status === 0;
// In CI the test must run: .ci/run installs GNU parallel (Debian package `parallel`).
const runs = hasParallel || Boolean(process.env.CI);
let folder: string;

beforeAll(() => {
  if (!runs) return;
  folder = mkdtempSync(join(tmpdir(), 'ringbench-parallel-'));
  mkdirSync(join(folder, 'lot'));
  UNITS.forEach((unit, i) => writeLoopCapture(join(folder, 'lot'), `${unit}.csv`, { ...NOMINAL_LOOP, R: 1 + 0.25 * i }, 300 + i));
});
afterAll(() => {
  if (folder) rmSync(folder, { recursive: true, force: true });
});

if (!runs) console.warn('batchParallel.test.ts skipped: GNU parallel is not installed (apt-get install parallel); in CI it runs');

describe.skipIf(!runs)('two shards under GNU parallel', () => {
  it('log every capture exactly once between them, merged into one report', () => {
    expect(hasParallel, 'GNU parallel is missing: .ci/run installs it (Debian package parallel)').toBe(true);
    const shards = spawnSync('parallel', ['--halt', 'never', process.execPath, CLI, 'batch', 'lot', '--shard', '{}/2', '--jobs', '1', '--log', 'shard-{}.jsonl', ':::', '1', '2'], {
      cwd: folder,
      encoding: 'utf8',
    });
    expect(shards.error).toBeUndefined();
    expect(shards.stderr).toBe('');
    expect(shards.status).toBe(0);

    const logged = [1, 2].map((k) => readBenchLog(join(folder, `shard-${k}.jsonl`)).records.map((r) => r.unit));
    expect(logged[0].sort()).toEqual(['sn101', 'sn103', 'sn105']);
    expect(logged[1].sort()).toEqual(['sn102', 'sn104', 'sn106']);

    const report = spawnSync(process.execPath, [CLI, 'report', 'shard-1.jsonl', 'shard-2.jsonl', '--out', 'lot.csv'], { cwd: folder, encoding: 'utf8' });
    expect(report.stderr).toBe('');
    expect(report.status).toBe(0);
    expect(report.stdout).toMatch(/6 measurements from 2 logs/);
    const [header, ...rows] = readFileSync(join(folder, 'lot.csv'), 'utf8').trimEnd().split('\n');
    const unitColumn = header.split(',').indexOf('unit');
    expect(rows.map((row) => row.split(',')[unitColumn]).sort()).toEqual(UNITS);
  }, SLOW);
});
