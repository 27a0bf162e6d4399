// `npm start`: the desktop window when an Electron runtime and a display are at hand, else one line
// saying why and the same bench served to a local browser.

import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

/** The Electron binary that the electron package has unpacked, or null. */
export function electronBinary(projectRoot: string): string | null {
  const pkg = join(projectRoot, 'node_modules', 'electron');
  const pathFile = join(pkg, 'path.txt');
  if (!existsSync(pathFile)) return null;
  const binary = join(pkg, 'dist', readFileSync(pathFile, 'utf8').trim());
  return existsSync(binary) ? binary : null;
}

/** A display to open a window on: always on macOS and Windows, DISPLAY or WAYLAND_DISPLAY elsewhere. */
export function hasDisplay(env: NodeJS.ProcessEnv = process.env, platform: NodeJS.Platform = process.platform): boolean {
  if (platform === 'darwin' || platform === 'win32') return true;
  return Boolean(env.DISPLAY || env.WAYLAND_DISPLAY);
}

/** Let the electron package fetch its runtime (needs the network); false when it cannot in time. */
export function fetchElectronRuntime(projectRoot: string, timeoutMs: number): boolean {
  const installer = join(projectRoot, 'node_modules', 'electron', 'install.js');
  if (!existsSync(installer)) return false;
  const result = spawnSync(process.execPath, [installer], { cwd: join(projectRoot, 'node_modules', 'electron'), stdio: 'ignore', timeout: timeoutMs });
  return result.status === 0 && electronBinary(projectRoot) !== null;
}

export type LaunchPlan = { kind: 'window'; binary: string } | { kind: 'browser'; reason: string };

/** Decide between the window and the browser bench; `fetch` is tried only when a window could be shown. */
export function planLaunch(projectRoot: string, display: boolean, fetch: () => boolean): LaunchPlan {
  const present = electronBinary(projectRoot);
  if (!display) return { kind: 'browser', reason: present ? 'no display for the desktop window here' : 'no Electron runtime and no display here' };
  if (present) return { kind: 'window', binary: present };
  if (!existsSync(join(projectRoot, 'node_modules', 'electron'))) return { kind: 'browser', reason: 'the electron package is not installed' };
  if (fetch()) return { kind: 'window', binary: electronBinary(projectRoot) as string };
  return { kind: 'browser', reason: 'no Electron runtime here (offline)' };
}

/** Run the window and resolve with its exit code. */
export function runWindow(binary: string, projectRoot: string): Promise<number> {
  return new Promise((resolve) => {
    const env = { ...process.env };
    delete env.ELECTRON_RUN_AS_NODE;
    const child = spawn(binary, [join(projectRoot, 'dist', 'electron', 'main.js')], { stdio: 'inherit', env });
    child.on('error', () => resolve(1));
    child.on('exit', (code) => resolve(code ?? 1));
  });
}
