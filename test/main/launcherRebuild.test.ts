// bin/ringbench.js builds dist/ on first use and again when a source changed since the build (edited in place, added,
// removed: after a pull or an edit), never otherwise; processes started together while it builds wait for that one build.
import { spawn, spawnSync } from 'node:child_process';
import { appendFileSync, copyFileSync, cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, statSync, symlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');
/** Each test builds the bundles once or more: seconds, more on a busy machine (no time is asserted). */
const SLOW = 180_000;
let copy: string;
const version = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version as string;

/** A checkout of the repository in a temporary folder: the launcher, build script and sources copied (the tests change them), the packages linked. */
beforeAll(() => {
  copy = mkdtempSync(join(tmpdir(), 'ringbench-launcher-'));
  for (const dir of ['bin', 'build']) mkdirSync(join(copy, dir));
  copyFileSync(join(ROOT, 'bin', 'ringbench.js'), join(copy, 'bin', 'ringbench.js'));
  copyFileSync(join(ROOT, 'build', 'build.mjs'), join(copy, 'build', 'build.mjs'));
  copyFileSync(join(ROOT, 'package.json'), join(copy, 'package.json'));
  for (const dir of ['core', 'main', 'renderer']) cpSync(join(ROOT, dir), join(copy, dir), { recursive: true });
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
    expect(rebuildsAfter(() => utimesSync(at('dist/cli.js'), new Date(0), new Date(0)))).toBe(false);
  }, SLOW);

  it('builds again after a source is edited in place, even to the same size', () => {
    // A chunk of an earlier build: dist/ keeps only the chunks of the latest.
    writeFileSync(at('dist/cli-chunk-EARLIER.js'), '');
    expect(rebuildsAfter(() => appendFileSync(at('core/quantity.ts'), '\n'))).toBe(true);
    expect(existsSync(at('dist/cli-chunk-EARLIER.js'))).toBe(false);
    const hourAhead = new Date(Date.now() + 3_600_000);
    expect(rebuildsAfter(() => utimesSync(at('main/version.ts'), hourAhead, hourAhead))).toBe(true);
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
