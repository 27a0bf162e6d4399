// Reads a capture file from disk into a Capture and the trace chosen for fitting.

import { closeSync, constants, fstatSync, openSync, readFileSync, readSync, statSync, type Stats } from 'node:fs';
import { createHash } from 'node:crypto';
import { isAbsolute, resolve } from 'node:path';
import { createCaptureFileReader, type CaptureFileReader } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import type { Capture, CaptureOptions, Channel } from '../../core/capture/types';
import { FileError } from './fileError';

export interface LoadedCapture {
  path: string;
  /** Null unless asked for (loadCapture's `hash`): only a bench-log record names its capture by the hash. */
  sha256: string | null;
  bytes: number;
  capture: Capture;
  channel: Channel;
}

/**
 * Largest file read (2 GiB less a byte, the most one read of Node's gives): its samples alone would take several
 * times that in memory.
 */
const MAX_FILE_BYTES = 2 ** 31 - 1;
/** Opening never waits for a writer (a FIFO); a regular file reads as usual. Absent on Windows, where FIFOs are not files. */
const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);
/**
 * Bytes a capture file is read in, into one reused buffer: where the first touch of fresh memory is dear (a VM taking
 * a page fault per 4 KiB), reading 22 MB (10^6 rows) into a fresh buffer of its size took 57 ms, into a touched one 1.4 ms.
 */
const PIECE_BYTES = 1 << 20;
/** The buffer every read takes its pieces in, kept for the next file (a batch reads hundreds): made on first use. */
let pieceBuffer: Buffer | null = null;

/** A smaller bound than MAX_FILE_BYTES for a kind of file, and why: a file over it is refused before it is read. */
export interface ReadLimit {
  bytes: number;
  why: string;
}

/** Read bytes, failing with a message that names the path; only a regular file is read (never a FIFO, device or socket). */
export function readFileBytes(path: string, limit?: ReadLimit): Buffer {
  let fd: number | null = null;
  try {
    fd = openSync(path, OPEN_FLAGS);
    const stats = fstatSync(fd);
    refuseUnreadable(path, stats);
    if (limit && stats.size > limit.bytes) throw new FileError(`'${path}' is ${(stats.size / 2 ** 20).toFixed(1)} MiB: ${limit.why}`, path);
    return readFileSync(fd);
  } catch (error) {
    throw readFailure(path, error);
  } finally {
    if (fd !== null) closeSync(fd);
  }
}

/** The FileError for what opening or reading `path` threw, naming the path. */
function readFailure(path: string, error: unknown): FileError {
  if (error instanceof FileError) return error;
  const code = (error as NodeJS.ErrnoException).code;
  if (code === 'EISDIR') return new FileError(`'${path}' is a folder, not a capture file`, path);
  const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : String(code ?? error);
  return new FileError(`cannot read '${path}': ${why}`, path);
}

/**
 * Reads a file as readFileBytes does (the same refusals and messages, the size it had when opened, or up to its end
 * when that is 0), but in pieces of PIECE_BYTES into pieceBuffer: `open` gets the file's size and gives what takes
 * each piece, valid only during that call (no read starts inside it: the reading is synchronous). What they throw
 * passes through. Returns the bytes read.
 */
function readFileInPieces(path: string, open: (size: number) => (piece: Uint8Array) => void): number {
  let fd: number | null = null;
  try {
    let size: number;
    try {
      fd = openSync(path, OPEN_FLAGS);
      const stats = fstatSync(fd);
      refuseUnreadable(path, stats);
      size = stats.size;
    } catch (error) {
      throw readFailure(path, error);
    }
    const take = open(size);
    pieceBuffer ??= Buffer.allocUnsafe(PIECE_BYTES);
    const buffer = pieceBuffer;
    let done = 0;
    for (;;) {
      const wanted = size > 0 ? Math.min(buffer.length, size - done) : buffer.length;
      let n = 0;
      try {
        n = wanted > 0 ? readSync(fd, buffer, 0, wanted, null) : 0;
      } catch (error) {
        throw readFailure(path, error);
      }
      if (n === 0) return done;
      done += n;
      take(buffer.subarray(0, n));
    }
  } finally {
    if (fd !== null) closeSync(fd);
  }
}

/** Throws FileError for what is not a regular file, or a file too large to read. */
function refuseUnreadable(path: string, stats: Stats): void {
  if (stats.isDirectory()) throw new FileError(`'${path}' is a folder, not a capture file`, path);
  if (!stats.isFile()) {
    const what = stats.isFIFO() ? 'a named pipe (FIFO)' : stats.isSocket() ? 'a socket' : 'a device';
    throw new FileError(`'${path}' is ${what}, not a regular file; save what it gives to a file and read that`, path);
  }
  if (stats.size > MAX_FILE_BYTES) {
    throw new FileError(`'${path}' is ${(stats.size / 2 ** 30).toFixed(1)} GiB; capture files over 2 GiB are not read`, path);
  }
}

/** A capture a record names, read again: its bytes, or why it was not read (a phrase after the path). */
export type LoggedCaptureRead = { bytes: Buffer; refused: null } | { bytes: null; refused: string };

/**
 * The bytes of a capture a bench-log record names, only while it is still the file logged: a regular file
 * (stat first, opened without waiting, checked again on the descriptor) of exactly the logged size, of
 * which no more than that is read, with the logged sha256. A record's path is never trusted further.
 */
export function readLoggedCapture(path: string, logged: { bytes: number; sha256: string }): LoggedCaptureRead {
  const refuse = (refused: string): LoggedCaptureRead => ({ bytes: null, refused });
  if (!isAbsolute(path)) return refuse('was not opened from a file on this computer (no absolute path), so it cannot be read again');
  let fd: number | null = null;
  try {
    const kind = notRegular(statSync(path));
    if (kind) return refuse(`is ${kind}, not a regular file: it is not read`);
    fd = openSync(path, OPEN_FLAGS);
    const stats = fstatSync(fd);
    const kindNow = notRegular(stats);
    if (kindNow) return refuse(`is ${kindNow}, not a regular file: it is not read`);
    if (stats.size !== logged.bytes) return refuse(`has changed since it was logged (${stats.size} bytes instead of ${logged.bytes})`);
    const bytes = Buffer.alloc(logged.bytes);
    let done = 0;
    while (done < bytes.length) {
      const n = readSync(fd, bytes, done, bytes.length - done, done);
      if (n === 0) return refuse(`has changed since it was logged (shorter than the ${logged.bytes} bytes logged)`);
      done += n;
    }
    const now = createHash('sha256').update(bytes).digest('hex');
    if (now !== logged.sha256) return refuse(`has changed since it was logged (sha256 ${now.slice(0, 12)}… instead of ${logged.sha256.slice(0, 12)}…)`);
    return { bytes, refused: null };
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    return refuse(code === 'ENOENT' ? 'is missing' : `could not be read again (${code === 'EACCES' ? 'permission denied' : String(code ?? error)})`);
  } finally {
    if (fd !== null) closeSync(fd);
  }
}

/** 'a device', 'a named pipe (FIFO)'... for what is not a regular file; null for a regular file. */
function notRegular(stats: Stats): string | null {
  if (stats.isFile()) return null;
  if (stats.isDirectory()) return 'a folder';
  return stats.isFIFO() ? 'a named pipe (FIFO)' : stats.isSocket() ? 'a socket' : 'a device';
}

/** Node's UTF-8 decoding of a byte range, as Buffer.toString gives it (a byte-order mark is kept for the parser to drop). */
export function decodeUtf8(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
}

/**
 * Reads a capture file in pieces (never whole: see PIECE_BYTES); with `hash`, hashing each as it is parsed, so the
 * hash is that of the bytes read (a 10^6-row file's sha256 took 14 ms, a fortieth of a fit of it, wasted where no
 * record is written).
 */
export function loadCapture(
  path: string,
  options: CaptureOptions & { channel?: string | number; cwd?: string; hash?: boolean } = {},
): LoadedCapture {
  const full = resolve(options.cwd ?? process.cwd(), path);
  const hash = options.hash ? createHash('sha256') : null;
  let reader!: CaptureFileReader;
  const bytes = readFileInPieces(full, (size) => {
    reader = createCaptureFileReader(options, size);
    return (piece) => {
      hash?.update(piece);
      reader.pushBytes(piece);
    };
  });
  const capture = reader.finish();
  return { path: full, sha256: hash ? hash.digest('hex') : null, bytes, capture, channel: selectChannel(capture, options.channel) };
}
