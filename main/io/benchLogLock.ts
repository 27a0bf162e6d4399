// The exclusive lock beside a bench log (`<log>.lock`): one writer at a time, stale locks recovered.
//
// The lock file is created with O_EXCL and holds "<pid> <host>". A lock whose process no longer runs
// on this host is stale: it is renamed aside (atomic), checked to be the one judged stale, and
// removed; a fresh lock taken meanwhile by another process is put back. A lock file left empty
// (its writer died between create and write) counts as stale after EMPTY_LOCK_GRACE_MS.

import { closeSync, linkSync, openSync, readdirSync, readFileSync, renameSync, statSync, unlinkSync, writeSync, type Stats } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { hostname } from 'node:os';
import { randomBytes } from 'node:crypto';
import { LogError } from '../../core/report/benchRecord';

const EMPTY_LOCK_GRACE_MS = 2000;

/** Take the lock for `logPath`, waiting up to `timeoutMs`; returns the function that releases it. */
export function acquireLogLock(logPath: string, timeoutMs: number): () => void {
  const lockPath = `${logPath}.lock`;
  const mine = `${process.pid} ${hostname()}\n`;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      const fd = openSync(lockPath, 'wx');
      try {
        writeSync(fd, mine);
      } finally {
        closeSync(fd);
      }
      sweepAsideFiles(lockPath);
      return () => releaseLock(lockPath, mine);
    } catch (error) {
      if (codeOf(error) !== 'EEXIST') throw lockFailure(lockPath, error);
    }
    if (removeIfStale(lockPath)) continue;
    if (Date.now() > deadline) {
      const holder = readText(lockPath)?.trim() || 'an unknown process';
      throw new LogError(`bench log '${logPath}' is locked by ${holder} (${lockPath}); delete the lock file if no ringbench is running`);
    }
    sleep(2 + Math.random() * 10);
  }
}

/**
 * A writer killed between renaming a stale lock aside and removing it leaves `<lock>.stale-<pid>-*`;
 * once we hold the lock, such files of processes that no longer run are removed.
 */
function sweepAsideFiles(lockPath: string): void {
  const folder = dirname(lockPath);
  const prefix = `${basename(lockPath)}.stale-`;
  for (const name of readdirSync(folder)) {
    const match = name.startsWith(prefix) ? /^(\d+)-/.exec(name.slice(prefix.length)) : null;
    if (match && Number(match[1]) !== process.pid && !isRunning(Number(match[1]))) {
      try {
        unlinkSync(join(folder, name));
      } catch (error) {
        if (codeOf(error) !== 'ENOENT') throw lockFailure(lockPath, error);
      }
    }
  }
}

function releaseLock(lockPath: string, mine: string): void {
  if (readText(lockPath) === mine) unlinkSync(lockPath);
}

/** True when the lock was stale and is gone now. */
function removeIfStale(lockPath: string): boolean {
  const content = readText(lockPath);
  if (content === null) return true; // released meanwhile
  if (!isStale(lockPath, content)) return false;
  const aside = `${lockPath}.stale-${process.pid}-${randomBytes(4).toString('hex')}`;
  try {
    renameSync(lockPath, aside);
  } catch (error) {
    if (codeOf(error) === 'ENOENT') return true;
    throw lockFailure(lockPath, error);
  }
  if (readText(aside) !== content) {
    // A fresh lock replaced the stale one between our read and rename: give it back.
    try {
      linkSync(aside, lockPath);
    } catch (error) {
      if (codeOf(error) !== 'EEXIST') throw lockFailure(lockPath, error);
    }
    unlinkSync(aside);
    return false;
  }
  unlinkSync(aside);
  return true;
}

function isStale(lockPath: string, content: string): boolean {
  const match = /^(\d+) (\S+)\n$/.exec(content);
  if (!match) {
    const age = Date.now() - (statOrNull(lockPath)?.mtimeMs ?? Date.now());
    return age > EMPTY_LOCK_GRACE_MS;
  }
  if (match[2] !== hostname()) return false; // cannot check a process on another machine
  return !isRunning(Number(match[1]));
}

function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return codeOf(error) === 'EPERM';
  }
}

function readText(path: string): string | null {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    if (codeOf(error) === 'ENOENT') return null;
    throw error;
  }
}

function statOrNull(path: string): Stats | null {
  try {
    return statSync(path);
  } catch {
    return null;
  }
}

function sleep(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

function codeOf(error: unknown): string | undefined {
  return (error as NodeJS.ErrnoException).code;
}

function lockFailure(lockPath: string, error: unknown): LogError {
  return new LogError(`cannot lock '${lockPath}': ${codeOf(error) ?? String(error)}`);
}
