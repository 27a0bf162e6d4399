// Reads a capture file from disk into a Capture and the trace chosen for fitting.

import { closeSync, constants, fstatSync, openSync, readFileSync, type Stats } from 'node:fs';
import { createHash } from 'node:crypto';
import { resolve } from 'node:path';
import { parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import type { Capture, CaptureOptions, Channel } from '../../core/capture/types';
import { FileError } from './fileError';

export interface LoadedCapture {
  path: string;
  sha256: string;
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

/** Read bytes, failing with a message that names the path; only a regular file is read (never a FIFO, device or socket). */
export function readFileBytes(path: string): Buffer {
  let fd: number | null = null;
  try {
    fd = openSync(path, OPEN_FLAGS);
    refuseUnreadable(path, fstatSync(fd));
    return readFileSync(fd);
  } catch (error) {
    if (error instanceof FileError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'EISDIR') throw new FileError(`'${path}' is a folder, not a capture file`, path);
    const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : String(code ?? error);
    throw new FileError(`cannot read '${path}': ${why}`, path);
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

/** Node's UTF-8 decoding of a byte range, as Buffer.toString gives it (a byte-order mark is kept for the parser to drop). */
export function decodeUtf8(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
}

export function loadCapture(
  path: string,
  options: CaptureOptions & { channel?: string | number; cwd?: string } = {},
): LoadedCapture {
  const full = resolve(options.cwd ?? process.cwd(), path);
  const bytes = readFileBytes(full);
  const capture = parseCaptureFileBytes(bytes, options);
  return {
    path: full,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    bytes: bytes.length,
    capture,
    channel: selectChannel(capture, options.channel),
  };
}
