// bin/ringbench.js builds dist/ on first use and again when a source is newer than the build (after a pull or an edit),
// never otherwise; processes started together while it builds wait for that one build.
import { spawn, spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, symlinkSync, utimesSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');
/** Each test builds the bundles once or more: seconds, more on a busy machine (no time is asserted). */
const SLOW = 180_000;
let copy: string;
const version = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version as string;

/** A checkout of the repository in a temporary folder: the launcher and build script copied, the sources linked. */
beforeAll(() => {
  copy = mkdtempSync(join(tmpdir(), 'ringbench-launcher-'));
  for (const dir of ['bin', 'build']) mkdirSync(join(copy, dir));
  copyFileSync(join(ROOT, 'bin', 'ringbench.js'), join(copy, 'bin', 'ringbench.js'));
  copyFileSync(join(ROOT, 'build', 'build.mjs'), join(copy, 'build', 'build.mjs'));
  copyFileSync(join(ROOT, 'package.json'), join(copy, 'package.json'));
  for (const dir of ['core', 'main', 'renderer', 'node_modules']) symlinkSync(join(ROOT, dir), join(copy, dir), 'dir');
});
afterAll(() => rmSync(copy, { recursive: true, force: true }));

const built = () => join(copy, 'dist', 'cli.js');
const run = () => spawnSync(process.execPath, [join(copy, 'bin', 'ringbench.js'), '--version'], { encoding: 'utf8' });

describe('the command-line launcher', () => {
  it('builds on first use, rebuilds when a source is newer than the build, and not otherwise', () => {
    const first = run();
    expect(first.status).toBe(0);
    expect(first.stdout.trim()).toBe(version);
    // The build made an hour before the sources last changed: a pull or an edit since.
    const hourAgo = new Date(Date.now() - 3_600_000);
    utimesSync(built(), hourAgo, hourAgo);
    expect(run().status).toBe(0);
    const rebuiltAt = statSync(built()).mtimeMs;
    expect(rebuiltAt).toBeGreaterThan(hourAgo.getTime() + 60_000);
    expect(run().status).toBe(0);
    expect(statSync(built()).mtimeMs).toBe(rebuiltAt);
  }, SLOW);

  it('a start while another process holds the build lock waits for it, then runs', async () => {
    mkdirSync(join(copy, 'dist', '.building'));
    const child = spawn(process.execPath, [join(copy, 'bin', 'ringbench.js'), '--version'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString()));
    await new Promise((done) => setTimeout(done, 1000));
    // Still waiting: nothing printed while the lock is held.
    expect(out).toBe('');
    rmSync(join(copy, 'dist', '.building'), { recursive: true });
    const code = await new Promise<number | null>((done) => child.on('close', done));
    expect(code).toBe(0);
    expect(out.trim()).toBe(version);
  }, SLOW);
});
