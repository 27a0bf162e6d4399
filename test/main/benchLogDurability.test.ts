// The bench log across processes: writers killed with SIGKILL mid-loop, and two writers at once.
// 20 kills in the normal run; RINGBENCH_DURABILITY=1 makes it 100 (the soak run).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import { appendBenchLog, readBenchLog } from '../../main/io/benchLog';
import { createRandom } from '../../core/random';
import { sampleRecord } from '../fixtures/benchLog/sampleRecord';

const here = dirname(fileURLToPath(import.meta.url));
const repo = resolve(here, '../..');
const childScript = join(repo, 'test/fixtures/benchLog/appendLoop.mjs');
// 100 kills, as the durability goal asks; RINGBENCH_DURABILITY sets another count for a longer soak.
const kills = Number(process.env.RINGBENCH_DURABILITY ?? 100);

let folder: string;
let bundle: string;
let template: string;

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-durability-'));
  bundle = join(folder, 'benchLog.mjs');
  // Bundled once so that each child starts in plain node, fast.
  await build({ entryPoints: [join(repo, 'main/io/benchLog.ts')], bundle: true, platform: 'node', format: 'esm', outfile: bundle, logLevel: 'error' });
  template = join(folder, 'template.json');
  writeFileSync(template, JSON.stringify(sampleRecord()));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function startWriter(log: string, tag: number, count: number | 'forever', noteBytes: number): { child: ChildProcess; ready: Promise<void>; exit: Promise<number | null> } {
  const child = spawn(process.execPath, [childScript, bundle, log, template, String(tag), String(count), String(noteBytes)], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stderr = '';
  child.stderr!.on('data', (d) => (stderr += d));
  const ready = new Promise<void>((resolveReady, reject) => {
    child.stdout!.on('data', (d: Buffer) => d.toString().includes('ready') && resolveReady());
    child.on('exit', () => reject(new Error(`writer ${tag} ended before it was ready: ${stderr}`)));
  });
  const exit = new Promise<number | null>((resolveExit) =>
    child.on('exit', (code) => {
      if (code !== 0 && code !== null) console.error(stderr);
      resolveExit(code);
    }),
  );
  return { child, ready, exit };
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('bench log durability', () => {
  it(`keeps every earlier record when a writer is killed with SIGKILL, ${kills} times`, async () => {
    const log = join(folder, 'killed.jsonl');
    const random = createRandom(20250314);
    let seenIds: string[] = [];
    const tornTexts: string[] = [];
    for (let k = 0; k < kills; k++) {
      // Notes from 0 to 200 kB make some writes large enough to be caught in the middle.
      const writer = startWriter(log, k + 1, 'forever', Math.floor(random.uniform() * 200_000));
      await writer.ready;
      await sleep(10 + random.uniform() * 140);
      writer.child.kill('SIGKILL');
      expect(await writer.exit).toBeNull();

      const contents = readBenchLog(log);
      expect(contents.bad).toEqual([]);
      const ids = contents.records.map((r) => r.id);
      // Nothing logged before is lost or changed in order; the new ones follow.
      expect(ids.slice(0, seenIds.length)).toEqual(seenIds);
      expect(new Set(ids).size).toBe(ids.length);
      if (contents.torn) {
        expect(contents.torn.line).toBe(ids.length + 1);
        tornTexts.push(contents.torn.text);
      }
      seenIds = ids;
    }
    expect(seenIds.length).toBeGreaterThanOrEqual(kills);
    // One more append here recovers any lock the last writer died holding and saves its torn tail.
    appendBenchLog(log, sampleRecord({ id: 'ffffffffffff' }), { lockTimeoutMs: 5000 });
    const final = readBenchLog(log);
    expect(final.torn).toBeNull();
    expect(final.records.map((r) => r.id)).toEqual([...seenIds, 'ffffffffffff']);
    const files = readdirSync(folder).filter((f) => f.startsWith('killed.jsonl.'));
    const saved = files.filter((f) => f.startsWith('killed.jsonl.torn-')).map((f) => readFileSync(join(folder, f), 'utf8').replace(/\n$/, ''));
    for (const text of tornTexts) expect(saved).toContain(text);
    expect(files.filter((f) => !f.startsWith('killed.jsonl.torn-'))).toEqual([]);
    console.info(`durability: ${kills} kills, ${final.records.length} records, ${tornTexts.length} torn tails seen and saved`);
  }, kills * 6_000);

  it('two writers appending 200 records each at once leave 400 whole lines', async () => {
    const log = join(folder, 'shared.jsonl');
    const writers = [startWriter(log, 1, 200, 3000), startWriter(log, 2, 200, 5000)];
    expect(await Promise.all(writers.map((w) => w.exit))).toEqual([0, 0]);
    const text = readFileSync(log, 'utf8');
    expect(text.endsWith('\n')).toBe(true);
    const contents = readBenchLog(log);
    expect(contents.bad).toEqual([]);
    expect(contents.torn).toBeNull();
    expect(contents.records).toHaveLength(400);
    for (const tag of [1, 2]) {
      const mine = contents.records.filter((r) => r.unit.startsWith(`T${tag}-`)).map((r) => r.unit);
      expect(mine).toEqual(Array.from({ length: 200 }, (_, i) => `T${tag}-${i}`));
    }
    expect(readdirSync(folder).filter((f) => f.startsWith('shared.jsonl.'))).toEqual([]);
  });
});
