// `npm start` and `ringbench serve`: the choice between the window and the browser bench, and the one line.

import { afterEach, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { electronBinary, hasDisplay, planLaunch } from '../../main/start';
import { parsePort } from '../../main/cli/commands/serve';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const folders: string[] = [];
const children: ChildProcess[] = [];

afterEach(() => {
  for (const child of children.splice(0)) child.kill('SIGTERM');
  for (const folder of folders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

/** A fake project: with or without the electron package, with or without its unpacked runtime. */
function project(electron: 'none' | 'package' | 'runtime'): string {
  const folder = mkdtempSync(join(tmpdir(), 'ringbench-start-'));
  folders.push(folder);
  if (electron === 'none') return folder;
  const pkg = join(folder, 'node_modules', 'electron');
  mkdirSync(pkg, { recursive: true });
  if (electron === 'runtime') {
    writeFileSync(join(pkg, 'path.txt'), 'electron');
    mkdirSync(join(pkg, 'dist'));
    writeFileSync(join(pkg, 'dist', 'electron'), '');
  }
  return folder;
}

describe('planLaunch', () => {
  it.each([
    { electron: 'runtime', display: true, fetches: false, expected: { kind: 'window' } },
    { electron: 'runtime', display: false, fetches: false, expected: { kind: 'browser', reason: 'no display for the desktop window here' } },
    { electron: 'package', display: false, fetches: false, expected: { kind: 'browser', reason: 'no Electron runtime and no display here' } },
    { electron: 'package', display: true, fetches: false, expected: { kind: 'browser', reason: 'no Electron runtime here (offline)' } },
    { electron: 'none', display: true, fetches: false, expected: { kind: 'browser', reason: 'the electron package is not installed' } },
  ] as const)('electron $electron, display $display: $expected.kind', ({ electron, display, fetches, expected }) => {
    let tried = false;
    const plan = planLaunch(project(electron), display, () => ((tried = true), fetches));
    expect(plan).toMatchObject(expected);
    // The runtime is fetched only when a window could be shown and it is missing.
    expect(tried).toBe(display && electron === 'package');
  });

  it('uses the runtime the package fetched', () => {
    const folder = project('package');
    const plan = planLaunch(folder, true, () => {
      writeFileSync(join(folder, 'node_modules', 'electron', 'path.txt'), 'electron');
      mkdirSync(join(folder, 'node_modules', 'electron', 'dist'));
      writeFileSync(join(folder, 'node_modules', 'electron', 'dist', 'electron'), '');
      return true;
    });
    expect(plan).toEqual({ kind: 'window', binary: electronBinary(folder) });
  });

  it.each([
    [{ DISPLAY: ':0' }, 'linux', true],
    [{ WAYLAND_DISPLAY: 'wayland-0' }, 'linux', true],
    [{}, 'linux', false],
    [{}, 'darwin', true],
    [{}, 'win32', true],
  ] as const)('hasDisplay(%j, %s) is %s', (env, platform, expected) => {
    expect(hasDisplay(env, platform)).toBe(expected);
  });

  it.each([
    ['0', 0],
    ['8080', 8080],
  ])('reads --port %s', (text, port) => expect(parsePort(text)).toBe(port));

  it.each(['-1', '70000', 'http', '80a'])('refuses --port %s', (text) => {
    expect(() => parsePort(text)).toThrow(/--port/);
  });
});

/** Start the command and resolve with its first line of output. */
function firstLine(args: string[], env: NodeJS.ProcessEnv): Promise<string> {
  const cwd = mkdtempSync(join(tmpdir(), 'ringbench-cwd-'));
  folders.push(cwd);
  const child = spawn(process.execPath, [join(root, 'bin/ringbench.js'), ...args], { cwd, env, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  return new Promise((done, fail) => {
    let out = '';
    child.stdout.on('data', (chunk: Buffer) => {
      out += chunk;
      if (out.includes('\n')) done(out);
    });
    child.stderr.on('data', (chunk: Buffer) => (out += chunk));
    child.on('exit', (code) => fail(new Error(`exited ${code}: ${out}`)));
  });
}

describe.skipIf(!existsSync(join(root, 'dist', 'renderer', 'index.html')))('the commands (built bench)', () => {
  const env = { ...process.env, DISPLAY: '', WAYLAND_DISPLAY: '' };

  it('start: one line saying why, then the browser bench at a loopback address with a token', async () => {
    const line = await firstLine(['start', '--no-open'], env);
    expect(line).toMatch(/^ringbench: no (Electron runtime and no )?display( for the desktop window)? here; serving the bench at http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]{43}\n$/);
    const url = new URL(/http:\S+/.exec(line)![0]);
    const page = await fetch(url);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('<title>Ringbench</title>');
    expect((await fetch(new URL('/api/listSamples', url), { method: 'POST' })).status).toBe(401);
  });

  it('serve: prints its address and answers the API with the token', async () => {
    const line = await firstLine(['serve', '--port', '0', '--no-open'], env);
    expect(line).toMatch(/^ringbench: serving the bench at http:\/\/127\.0\.0\.1:\d+\/\?token=\S+ \(Ctrl\+C to stop\)\n$/);
    const url = new URL(/http:\S+/.exec(line)![0]);
    const reply = await fetch(new URL('/api/listSamples', url), {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-ringbench-token': url.searchParams.get('token')! },
      body: '{}',
    });
    expect((await reply.json()).ok).toBe(true);
  });
});
