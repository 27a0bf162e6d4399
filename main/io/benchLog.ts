// The bench log: one append-only JSON Lines file per project, one measurement record per line.
//
// An append builds the whole line (record + '\n') in memory and, holding `<log>.lock`, writes it
// with one write() on a descriptor opened with O_APPEND, then fsyncs. O_APPEND single writes of a
// few 100 kB do not interleave on a local Linux file system; the lock makes that hold everywhere and
// guards the repair below. A line cut by a crash (no '\n', or not JSON) can only be the last one:
// readers report it and keep the records before it; the next append copies it to
// `<log>.torn-<time>` and truncates it off before writing, so nothing is dropped silently.

import { closeSync, constants, fstatSync, fsyncSync, ftruncateSync, openSync, readFileSync, readSync, statSync, writeSync } from 'node:fs';
import { dirname } from 'node:path';
import { LogError, parseBenchRecord, type BenchRecord } from '../../core/report/benchRecord';
import { acquireLogLock } from './benchLogLock';

export interface AppendOptions {
  /** Clock for the name of a saved torn tail. Default: the system clock. */
  clock?: () => Date;
  /** How long to wait for another writer's lock, ms. Default 10000. */
  lockTimeoutMs?: number;
}

export interface AppendResult {
  /** A torn tail found before this append: its line, its text and where it was saved. */
  repairedTail: { line: number; text: string; savedTo: string } | null;
  /** Bytes written, including the '\n'. */
  bytes: number;
}

export interface BenchLogContents {
  records: BenchRecord[];
  /** The last line when it was cut short (no '\n' or not JSON). */
  torn: { line: number; text: string } | null;
  /** Lines before the last that are not valid records. */
  bad: { line: number; message: string }[];
}

const TAIL_CHUNK = 64 * 1024;

/** Append one record as one line. Fails with LogError when the folder is missing or the lock is held. */
export function appendBenchLog(logPath: string, record: BenchRecord, options: AppendOptions = {}): AppendResult {
  const line = Buffer.from(`${JSON.stringify(record)}\n`, 'utf8');
  requireLogFolder(logPath);
  const release = acquireLogLock(logPath, options.lockTimeoutMs ?? 10_000);
  try {
    const fd = openLog(logPath);
    try {
      const repairedTail = repairTornTail(fd, logPath, options.clock ?? (() => new Date()));
      writeFully(fd, line);
      fsyncSync(fd);
      return { repairedTail, bytes: line.length };
    } finally {
      closeSync(fd);
    }
  } finally {
    release();
  }
}

/** Every record of the log, the torn tail if any, and the bad lines before it. */
export function readBenchLog(logPath: string): BenchLogContents {
  let text: string;
  try {
    text = readFileSync(logPath, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new LogError(code === 'ENOENT' ? `no bench log at '${logPath}'` : `cannot read bench log '${logPath}': ${code}`);
  }
  const lines = text.split('\n');
  const complete = text.endsWith('\n');
  if (complete || text === '') lines.pop();
  const contents: BenchLogContents = { records: [], torn: null, bad: [] };
  lines.forEach((lineText, i) => {
    const line = i + 1;
    const last = i === lines.length - 1;
    if (last && (!complete || !isJson(lineText))) {
      contents.torn = { line, text: lineText };
      return;
    }
    try {
      contents.records.push(parseBenchRecord(lineText, line));
    } catch (error) {
      if (!(error instanceof LogError)) throw error;
      contents.bad.push({ line, message: error.message });
    }
  });
  return contents;
}

/** The records of a log that has no bad line (a torn tail is allowed: it is reported, not used). */
export function readCleanBenchLog(logPath: string): BenchLogContents {
  const contents = readBenchLog(logPath);
  if (contents.bad.length) {
    const more = contents.bad.length > 1 ? ` (and ${contents.bad.length - 1} more bad lines)` : '';
    throw new LogError(`bench log '${logPath}' ${contents.bad[0].message}${more}`);
  }
  return contents;
}

/** A one-line note about a torn tail for the terminal and reports. */
export function describeTornTail(logPath: string, torn: { line: number }): string {
  return `bench log '${logPath}' ends in a cut-off line ${torn.line} (an interrupted write); it is not used and will be saved aside on the next append`;
}

/** Fails with LogError unless the log's folder exists (checked before anything is fitted or written). */
export function requireLogFolder(logPath: string): void {
  const folder = dirname(logPath);
  let isFolder = false;
  try {
    isFolder = statSync(folder).isDirectory();
  } catch {
    isFolder = false;
  }
  if (!isFolder) throw new LogError(`bench log folder '${folder}' does not exist`);
}

function openLog(logPath: string): number {
  try {
    return openSync(logPath, constants.O_RDWR | constants.O_APPEND | constants.O_CREAT, 0o644);
  } catch (error) {
    throw new LogError(`cannot open bench log '${logPath}': ${(error as NodeJS.ErrnoException).code}`);
  }
}

function writeFully(fd: number, data: Buffer): void {
  let offset = 0;
  // One write() in practice; a short write (disk full) continues under the lock.
  while (offset < data.length) offset += writeSync(fd, data, offset, data.length - offset);
}

/** Save and cut off a torn last line; null when the log ends cleanly. */
function repairTornTail(fd: number, logPath: string, clock: () => Date): AppendResult['repairedTail'] {
  const size = fstatSync(fd).size;
  if (size === 0) return null;
  const lastByte = readAt(fd, size - 1, 1);
  const complete = lastByte[0] === 0x0a;
  const start = lineStartBefore(fd, complete ? size - 1 : size);
  const tail = readAt(fd, start, size - start);
  const text = tail.toString('utf8', 0, complete ? tail.length - 1 : tail.length);
  if (complete && isJson(text)) return null;
  const savedTo = saveTail(logPath, tail, clock());
  ftruncateSync(fd, start);
  fsyncSync(fd);
  return { line: countLines(fd, start) + 1, text, savedTo };
}

/** Offset just after the last '\n' before `end` (0 when there is none). */
function lineStartBefore(fd: number, end: number): number {
  let position = end;
  while (position > 0) {
    const from = Math.max(0, position - TAIL_CHUNK);
    const chunk = readAt(fd, from, position - from);
    const newline = chunk.lastIndexOf(0x0a);
    if (newline >= 0) return from + newline + 1;
    position = from;
  }
  return 0;
}

function countLines(fd: number, end: number): number {
  let count = 0;
  for (let from = 0; from < end; from += TAIL_CHUNK) {
    const chunk = readAt(fd, from, Math.min(TAIL_CHUNK, end - from));
    for (const byte of chunk) if (byte === 0x0a) count++;
  }
  return count;
}

function saveTail(logPath: string, tail: Buffer, time: Date): string {
  const stamp = time.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  for (let attempt = 0; ; attempt++) {
    const path = `${logPath}.torn-${stamp}${attempt ? `-${attempt}` : ''}`;
    let fd: number;
    try {
      fd = openSync(path, 'wx', 0o644);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'EEXIST') continue;
      throw new LogError(`cannot save the torn tail of '${logPath}' to '${path}': ${(error as NodeJS.ErrnoException).code}`);
    }
    try {
      writeFully(fd, tail);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    return path;
  }
}

function readAt(fd: number, position: number, length: number): Buffer {
  const buffer = Buffer.alloc(length);
  let done = 0;
  while (done < length) {
    const n = readSync(fd, buffer, done, length - done, position + done);
    if (n === 0) break;
    done += n;
  }
  return buffer.subarray(0, done);
}

function isJson(text: string): boolean {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
}
