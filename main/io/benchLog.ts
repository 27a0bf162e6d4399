// The bench log: one append-only JSON Lines file per project, one measurement record per line.
//
// An append builds the whole line (record + '\n') in memory and, holding `<log>.lock`, writes it
// with one write() on a descriptor opened with O_APPEND, then fsyncs. O_APPEND single writes of a
// few 100 kB do not interleave on a local Linux file system; the lock makes that hold everywhere and
// guards the repair below. A line cut by a crash (no '\n' and not a whole record) can only be the last
// one: readers report it and keep the records before it; the next append copies it to
// `<log>.torn-<time>` and truncates it off before writing, so nothing is dropped silently. A whole
// record missing only its '\n' is a record: the next append ends its line first.
//
// A line anywhere else that is not a record (broken, blank, edited by hand) is skipped and reported
// with its number; every other record is read. A byte-order mark before a line is dropped. An append
// writes only to a file that is a bench log already (or empty, or new): never to a capture or a design.

import { closeSync, constants, fstatSync, fsyncSync, ftruncateSync, openSync, readFileSync, readSync, statSync, writeSync, type Stats } from 'node:fs';
import { dirname } from 'node:path';
import { LogError, parseLogLine, RECORD_KIND, type BenchRecord } from '../../core/report/benchRecord';
import { applyCorrections, CORRECTION_KIND, describeCorrections, isCorrection, logEntryFrom, type CorrectionRecord, type LogEntry, type StandingLog } from '../../core/report/logCorrection';
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
  /** Every measurement and correction, in log order. */
  entries: LogEntry[];
  /** The measurements as logged (corrections not applied: see core/report/logCorrection.ts). */
  records: BenchRecord[];
  corrections: CorrectionRecord[];
  /** The last line when it was cut short (no '\n' and not a whole record). */
  torn: { line: number; text: string } | null;
  /** Lines skipped: not JSON, blank, not a record, or a record with a bad field. */
  bad: { line: number; message: string }[];
}

const TAIL_CHUNK = 64 * 1024;
/** A file is taken for a bench log when one of the lines in its first 8 MiB is a ringbench record (a record is a few kB to a few 100 kB). */
const LOG_SIGNATURE_SCAN_BYTES = 8 * 1024 * 1024;
/** How every record line starts (JSON.stringify puts "record" first): a file holding only a cut-off start of it is a log whose first write was interrupted. */
const RECORD_LINE_START = '{"record":"ringbench-';
const BYTE_ORDER_MARK = '\uFEFF';
/** Opening never waits (a FIFO named as the log); it is refused once fstat shows what it is. Absent on Windows. */
const LOG_OPEN_FLAGS = constants.O_RDWR | constants.O_APPEND | constants.O_CREAT | (constants.O_NONBLOCK ?? 0);

/**
 * Append one record (a measurement or a correction) as one line, after checking it as a reader would.
 * Fails with LogError when the folder is missing, the lock is held, or the file is not a bench log.
 */
export function appendBenchLog(logPath: string, record: LogEntry, options: AppendOptions = {}): AppendResult {
  const json = JSON.stringify(record);
  logEntryFrom(JSON.parse(json), 1);
  const line = Buffer.from(`${json}\n`, 'utf8');
  requireLogFolder(logPath);
  const release = acquireLogLock(logPath, options.lockTimeoutMs ?? 10_000);
  try {
    const fd = openLog(logPath);
    try {
      refuseForeignFile(fd, logPath);
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

/** Every record of the log, the torn tail if any, and the lines skipped. Only a regular file is read. */
export function readBenchLog(logPath: string): BenchLogContents {
  const text = readLogText(logPath);
  const lines = text.split('\n');
  const complete = text.endsWith('\n');
  if (complete || text === '') lines.pop();
  const contents: BenchLogContents = { entries: [], records: [], corrections: [], torn: null, bad: [] };
  lines.forEach((raw, i) => {
    const line = i + 1;
    const lineText = withoutMark(raw);
    const cutOff = i === lines.length - 1 && !complete;
    if (lineText.trim() === '' && !cutOff) {
      contents.bad.push({ line, message: `line ${line}: blank line` });
      return;
    }
    try {
      const entry = logEntryFrom(parseLogLine(lineText, line), line);
      contents.entries.push(entry);
      if (isCorrection(entry)) contents.corrections.push(entry);
      else contents.records.push(entry);
    } catch (error) {
      if (!(error instanceof LogError)) throw error;
      if (cutOff) contents.torn = { line, text: lineText };
      else contents.bad.push({ line, message: error.message });
    }
  });
  return contents;
}

/** The log as tables and reports show it: its corrections applied, the lines that are not records skipped. */
export interface CleanBenchLog extends StandingLog {
  torn: BenchLogContents['torn'];
  bad: BenchLogContents['bad'];
  /** One line per skipped line and per correction that names no measurement (the torn tail apart: describeTornTail). */
  notes: string[];
  /** One line per amendment and withdrawal applied. */
  changes: string[];
}

/** Read the log and apply its corrections; a bad line is skipped and noted, never fatal. `shown` names the log in notes. */
export function readCleanBenchLog(logPath: string, shown = logPath): CleanBenchLog {
  const contents = readBenchLog(logPath);
  const standing = applyCorrections(contents.entries);
  const notes = [...contents.bad.map((bad) => describeSkippedLine(shown, bad)), ...standing.notes];
  return { ...standing, torn: contents.torn, bad: contents.bad, notes, changes: describeCorrections(standing) };
}

/** A one-line note about a torn tail for the terminal and reports. */
export function describeTornTail(logPath: string, torn: { line: number }): string {
  return `bench log '${logPath}' ends in a cut-off line ${torn.line} (an interrupted write); it is not used and will be saved aside on the next append`;
}

/** A one-line note about a skipped line for the terminal and reports. */
function describeSkippedLine(logPath: string, bad: { message: string }): string {
  return `bench log '${logPath}' ${bad.message}: skipped, the other records are used`;
}

/**
 * Fails with LogError unless `logPath` is missing, empty, or a bench log (checked before anything is
 * fitted, and again under the lock before writing): a capture, a design or a link to one is never appended to.
 */
export function requireBenchLogFile(logPath: string): void {
  let fd: number;
  try {
    fd = openSync(logPath, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') return;
    throw new LogError(code === 'EISDIR' ? `bench log '${logPath}' is a folder` : `cannot open bench log '${logPath}': ${code}`);
  }
  try {
    refuseForeignFile(fd, logPath);
  } finally {
    closeSync(fd);
  }
}

function readLogText(logPath: string): string {
  let fd: number;
  try {
    fd = openSync(logPath, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new LogError(code === 'ENOENT' ? `no bench log at '${logPath}'` : `cannot read bench log '${logPath}': ${code}`);
  }
  try {
    const stats = fstatSync(fd);
    if (!stats.isFile()) throw new LogError(`bench log '${logPath}' is ${kindOf(stats)}, not a file`);
    return readFileSync(fd, 'utf8');
  } catch (error) {
    if (error instanceof LogError) throw error;
    throw new LogError(`cannot read bench log '${logPath}': ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
  } finally {
    closeSync(fd);
  }
}

/** Throws LogError when the open file is not a regular file or, holding data, has no ringbench record near its start. */
function refuseForeignFile(fd: number, logPath: string): void {
  const stats = fstatSync(fd);
  if (!stats.isFile()) throw new LogError(`'${logPath}' is ${kindOf(stats)}, not a bench log; nothing was written`);
  if (stats.size === 0) return;
  // Line by line from the start, so that a log is known by its first line, read alone.
  const scanEnd = Math.min(stats.size, LOG_SIGNATURE_SCAN_BYTES);
  let start = 0;
  while (start < scanEnd) {
    const end = lineEndFrom(fd, start, scanEnd);
    if (end === null) break;
    if (isLogLine(withoutMark(readAt(fd, start, end - start).toString('utf8')))) return;
    start = end + 1;
  }
  const only = start === 0 && stats.size <= LOG_SIGNATURE_SCAN_BYTES ? withoutMark(readAt(fd, 0, stats.size).toString('utf8')) : null;
  if (only !== null && !only.includes('\n') && (only.startsWith(RECORD_LINE_START) || RECORD_LINE_START.startsWith(only))) return;
  throw new LogError(`'${logPath}' is not a bench log (no ringbench record in it); nothing was written: give --log a new file or an existing log`);
}

/** Offset of the first '\n' at or after `from` and before `limit`, or null. */
function lineEndFrom(fd: number, from: number, limit: number): number | null {
  for (let at = from; at < limit; at += TAIL_CHUNK) {
    const newline = readAt(fd, at, Math.min(TAIL_CHUNK, limit - at)).indexOf(0x0a);
    if (newline >= 0) return at + newline;
  }
  return null;
}

function withoutMark(text: string): string {
  return text.startsWith(BYTE_ORDER_MARK) ? text.slice(BYTE_ORDER_MARK.length) : text;
}

/** A line that is a JSON object of one of our record kinds (its fields are checked when it is read). */
function isLogLine(line: string): boolean {
  try {
    const value = JSON.parse(line) as { record?: unknown } | null;
    return typeof value === 'object' && value !== null && (value.record === RECORD_KIND || value.record === CORRECTION_KIND);
  } catch {
    return false;
  }
}

function kindOf(stats: Stats): string {
  if (stats.isDirectory()) return 'a folder';
  if (stats.isFIFO()) return 'a named pipe (FIFO)';
  if (stats.isSocket()) return 'a socket';
  return 'a device';
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
    return openSync(logPath, LOG_OPEN_FLAGS, 0o644);
  } catch (error) {
    throw new LogError(`cannot open bench log '${logPath}': ${(error as NodeJS.ErrnoException).code}`);
  }
}

function writeFully(fd: number, data: Buffer): void {
  let offset = 0;
  // One write() in practice; a short write (disk full) continues under the lock.
  while (offset < data.length) offset += writeSync(fd, data, offset, data.length - offset);
}

/** Save and cut off a torn last line, or end a whole last record's line; null when the log ends cleanly. */
function repairTornTail(fd: number, logPath: string, clock: () => Date): AppendResult['repairedTail'] {
  const size = fstatSync(fd).size;
  if (size === 0) return null;
  if (readAt(fd, size - 1, 1)[0] === 0x0a) return null;
  const start = lineStartBefore(fd, size);
  const tail = readAt(fd, start, size - start);
  const text = tail.toString('utf8');
  if (isWholeEntry(text)) {
    writeFully(fd, Buffer.from('\n'));
    return null;
  }
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

/** A last line that is a whole record, only its '\n' missing. */
function isWholeEntry(text: string): boolean {
  try {
    logEntryFrom(JSON.parse(withoutMark(text)), 1);
    return true;
  } catch {
    return false;
  }
}
