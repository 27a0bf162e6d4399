// Runs captureBoundsProbe.ts in a child process, killing it (and saying so) when its memory passes a limit.

import { spawn } from 'node:child_process';
import { readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const PROBE = path.join(ROOT, 'test/core/captureBoundsProbe.ts');
const MB = 1024 * 1024;
/** What the bound allows beyond the file: a fixed 100 MB, as the importer promises. */
export const FIXED_MB = 100;
/** Memory allowed per byte of the file read. */
export const PER_FILE_BYTE = 10;
/** Resident memory of node with tsx before anything is read, allowed on top when the child is watched from outside. */
const RUNTIME_MB = 200;
/** How often the child's memory is looked at (Linux /proc only; elsewhere the child's own report is all). */
const POLL_MS = 20;
/** A child still running after this long has failed the test (a regression that hangs or thrashes). */
export const PROBE_TIMEOUT_MS = 30_000;

/** Node's arguments to run a TypeScript file of the repository from any folder (tsx found by path, not from the folder). */
export function tsxArgs(script: string, ...args: string[]): string[] {
  return ['--import', pathToFileURL(path.join(ROOT, 'node_modules/tsx/dist/loader.mjs')).href, script, ...args];
}

export interface ProbeResult {
  /** 'CaptureError: line 1: ...', or '' when the file was read. */
  message: string;
  rows: number;
  /** Peak resident memory beyond what the child held before reading, MB. */
  grewMB: number;
  /** The limit for this file, MB: PER_FILE_BYTE times its size plus FIXED_MB. */
  limitMB: number;
  /** Set when the child was killed for passing the limit or the time. */
  killed: string | null;
}

function residentMB(pid: number): number | null {
  try {
    const status = readFileSync(`/proc/${pid}/status`, 'utf8');
    const match = /VmRSS:\s+(\d+) kB/.exec(status);
    return match ? Number(match[1]) / 1024 : null;
  } catch {
    return null;
  }
}

/** Reads `file` in a child process (mode core or file) and reports what it said and how much memory it took. */
export function probe(mode: 'core' | 'file', file: string): Promise<ProbeResult> {
  const limitMB = (PER_FILE_BYTE * statSync(file).size) / MB + FIXED_MB;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, tsxArgs(PROBE, mode, file), { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    let killed: string | null = null;
    const kill = (why: string): void => {
      killed ??= why;
      child.kill('SIGKILL');
    };
    const watch = setInterval(() => {
      const rss = child.pid === undefined ? null : residentMB(child.pid);
      if (rss !== null && rss > limitMB + RUNTIME_MB) kill(`resident memory reached ${rss.toFixed(0)} MB`);
    }, POLL_MS);
    const timer = setTimeout(() => kill(`still running after ${PROBE_TIMEOUT_MS} ms`), PROBE_TIMEOUT_MS);
    child.stdout.on('data', (d: Buffer) => (out += d.toString()));
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    child.on('error', reject);
    child.on('close', () => {
      clearInterval(watch);
      clearTimeout(timer);
      if (killed !== null) {
        resolve({ message: '', rows: 0, grewMB: Infinity, limitMB, killed });
        return;
      }
      const line = out.trim().split('\n').pop() ?? '';
      if (!line.startsWith('{')) {
        reject(new Error(`probe printed no result: ${err.trim() || out.trim()}`));
        return;
      }
      const report = JSON.parse(line) as { message: string; rows: number; startMB: number; peakMB: number };
      resolve({ message: report.message, rows: report.rows, grewMB: report.peakMB - report.startMB, limitMB, killed: null });
    });
  });
}
