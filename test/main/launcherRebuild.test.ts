// bin/ringbench.js builds dist/ on first use and again when a source changed since the build (edited in place, added,
// removed: after a pull or an edit), never otherwise; processes started together while it builds wait for that one build.
// It runs the build with the code cache the build made from it, and without one that is missing, another build's or damaged.
import { spawn, spawnSync } from 'node:child_process';
import { appendFileSync, copyFileSync, cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, statSync, symlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { Script } from 'node:vm';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');
/** Each test builds the bundles once or more: seconds, more on a busy machine (no time is asserted). */
const SLOW = 180_000;
let copy: string;
const version = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version as string;

/** A checkout of the repository in a temporary folder: the launcher, build script, sources and sample captures (the code cache's training run reads one) copied (the tests change them), the packages linked. */
beforeAll(() => {
  copy = mkdtempSync(join(tmpdir(), 'ringbench-launcher-'));
  for (const dir of ['bin', 'build']) mkdirSync(join(copy, dir));
  copyFileSync(join(ROOT, 'bin', 'ringbench.js'), join(copy, 'bin', 'ringbench.js'));
  copyFileSync(join(ROOT, 'build', 'build.mjs'), join(copy, 'build', 'build.mjs'));
  copyFileSync(join(ROOT, 'package.json'), join(copy, 'package.json'));
  for (const dir of ['core', 'main', 'renderer', 'sample-captures']) cpSync(join(ROOT, dir), join(copy, dir), { recursive: true });
  symlinkSync(join(ROOT, 'node_modules'), join(copy, 'node_modules'), 'dir');
});
afterAll(() => rmSync(copy, { recursive: true, force: true }));

const at = (path: string) => join(copy, path);
/** When the build last finished: it writes its list of sources last. */
const builtAt = () => statSync(at('dist/sources.json')).mtimeMs;
const run = () => spawnSync(process.execPath, [at('bin/ringbench.js'), '--version'], { encoding: 'utf8' });

/** Runs the command line after `change`: whether it built again; it runs, and a second run builds nothing. */
function rebuildsAfter(change: () => void): boolean {
  const before = builtAt();
  change();
  const first = run();
  expect(first.status).toBe(0);
  expect(first.stdout.trim()).toBe(version);
  const after = builtAt();
  expect(run().status).toBe(0);
  expect(builtAt()).toBe(after);
  return after !== before;
}

describe('the command-line launcher', () => {
  it('builds on first use, and not again while nothing changed', () => {
    const first = run();
    expect(first.status).toBe(0);
    expect(first.stdout.trim()).toBe(version);
    expect(rebuildsAfter(() => {})).toBe(false);
    // Only what the build reads counts: the build's own output being touched is no change.
    expect(rebuildsAfter(() => utimesSync(at('dist/cli.cjs'), new Date(0), new Date(0)))).toBe(false);
  }, SLOW);

  it('builds again after a source is edited in place, even to the same size', () => {
    // A chunk of an earlier build, when the command line was split: dist/ keeps only what the latest wrote.
    writeFileSync(at('dist/cli-chunk-EARLIER.js'), '');
    expect(rebuildsAfter(() => appendFileSync(at('core/quantity.ts'), '\n'))).toBe(true);
    expect(existsSync(at('dist/cli-chunk-EARLIER.js'))).toBe(false);
    const hourAhead = new Date(Date.now() + 3_600_000);
    expect(rebuildsAfter(() => utimesSync(at('main/version.ts'), hourAhead, hourAhead))).toBe(true);
  }, SLOW);

  it('makes a code cache of the build it belongs to, and runs without one or with a damaged or foreign one', () => {
    const idLine = (path: string) => readFileSync(at(path), 'latin1').split('\n')[0];
    expect(run().status).toBe(0);
    expect(idLine('dist/cli.codecache')).toMatch(/^\/\/ ringbench build \S+$/);
    expect(idLine('dist/cli.codecache')).toBe(idLine('dist/cli.cjs'));
    const made = readFileSync(at('dist/cli.codecache'));
    // V8 takes it for the bundle, wrapped as the launcher wraps it (another Node, or other V8 flags, would refuse it).
    const wrapped = `(function (exports, require, module, __filename, __dirname) {${readFileSync(at('dist/cli.cjs'), 'utf8')}\n})`;
    const cachedData = made.subarray(made.indexOf(10) + 1);
    expect(new Script(wrapped, { filename: at('dist/cli.cjs'), cachedData }).cachedDataRejected).toBe(false);
    const fit = () => spawnSync(process.execPath, [at('bin/ringbench.js'), 'fit', at('sample-captures/switch-node-before.csv'), '--json'], { encoding: 'utf8' });
    const expected = fit();
    expect(expected.status).toBe(0);
    try {
      // This build's id over bytes V8 refuses, and a cache made by another build: each is compiled without.
      const header = Buffer.from(`${idLine('dist/cli.cjs')}\n`, 'latin1');
      for (const cache of [Buffer.concat([header, Buffer.alloc(made.length - header.length, 7)]), Buffer.from(made.toString('latin1').replace(/^\/\/ ringbench build \S+/, '// ringbench build another'), 'latin1')]) {
        writeFileSync(at('dist/cli.codecache'), cache);
        expect(fit().stdout).toBe(expected.stdout);
      }
      rmSync(at('dist/cli.codecache'));
      expect(fit().stdout).toBe(expected.stdout);
    } finally {
      writeFileSync(at('dist/cli.codecache'), made);
    }
  }, SLOW);

  it('builds again after a source is added or removed', () => {
    expect(rebuildsAfter(() => writeFileSync(at('main/cli/added.ts'), '// a module no one imports yet\n'))).toBe(true);
    expect(rebuildsAfter(() => rmSync(at('main/cli/added.ts')))).toBe(true);
    expect(rebuildsAfter(() => mkdirSync(at('core/added')))).toBe(true);
  }, SLOW);

  it('builds again when no list of its sources is left (a first build that failed, or one older than the list)', () => {
    expect(rebuildsAfter(() => rmSync(at('dist/sources.json')))).toBe(true);
  }, SLOW);

  it('never builds a copy without its sources', () => {
    renameSync(at('renderer'), at('renderer-away'));
    try {
      expect(rebuildsAfter(() => appendFileSync(at('core/quantity.ts'), '\n'))).toBe(false);
    } finally {
      renameSync(at('renderer-away'), at('renderer'));
    }
  }, SLOW);

  it('a start while another process holds the build lock waits for it, then runs', async () => {
    mkdirSync(at('dist/.building'));
    const child = spawn(process.execPath, [at('bin/ringbench.js'), '--version'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString()));
    await new Promise((done) => setTimeout(done, 1000));
    // Still waiting: nothing printed while the lock is held.
    expect(out).toBe('');
    rmSync(at('dist/.building'), { recursive: true });
    const code = await new Promise<number | null>((done) => child.on('close', done));
    expect(code).toBe(0);
    expect(out.trim()).toBe(version);
  }, SLOW);
});
