// Reads a granted capture or design file for the window: a regular file only, within a size limit, and
// asynchronously, so that a large file never stalls the main process (menus, dialogs, every IPC call).

import { basename } from 'node:path';
import { constants } from 'node:fs';
import { open, type FileHandle } from 'node:fs/promises';
import { BenchApiError } from '../api/apiError';
import type { NamedText, OpenedCaptureFile } from '../../core/bench/benchApiTypes';

/** Largest capture the window takes: its samples are held several times over (parsed, fitted, plotted). */
export const MAX_CAPTURE_BYTES = 512 * 1024 * 1024;
/** Largest design file: a few hundred bytes of JSON in practice. */
export const MAX_DESIGN_BYTES = 1024 * 1024;
/** Bytes asked for per read: large enough to be quick, small enough that the cap is checked as the file comes in. */
const READ_CHUNK_BYTES = 8 * 1024 * 1024;
/** Opening never waits for a writer (a FIFO); a regular file reads as usual. Absent on Windows, where FIFOs are not files. */
const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);

/** The capture's bytes as written: the window's importer finds their encoding, as the command line's does. */
export async function readCaptureFile(path: string): Promise<OpenedCaptureFile> {
  return { name: basename(path), path, sampleId: null, bytes: await readRegularFile(path, MAX_CAPTURE_BYTES) };
}

export async function readDesignText(path: string): Promise<NamedText> {
  return { name: basename(path), text: (await readRegularFile(path, MAX_DESIGN_BYTES)).toString('utf8') };
}

/**
 * The bytes of a regular file of at most `limit` bytes. What the path names is checked on the opened handle
 * (fstat), not by a stat of the path beforehand: a FIFO, a device (/dev/zero states size 0) or a socket, or a
 * link to one, is refused before a byte is read. Reading stops past the limit, so a file that grows after the
 * check is refused too, never read whole.
 */
export async function readRegularFile(path: string, limit: number): Promise<Buffer> {
  const name = basename(path);
  let handle: FileHandle;
  try {
    handle = await open(path, OPEN_FLAGS);
  } catch (error) {
    throw new BenchApiError(`cannot read '${name}': ${reasonOf(error)}`);
  }
  try {
    const stats = await handle.stat();
    if (stats.isDirectory()) throw new BenchApiError(`'${name}' is a folder, not a file`);
    if (!stats.isFile()) {
      const what = stats.isFIFO() ? 'a named pipe (FIFO)' : stats.isSocket() ? 'a socket' : 'a device';
      throw new BenchApiError(`'${name}' is ${what}, not a regular file; save what it gives to a file and open that`);
    }
    if (stats.size > limit) throw tooLarge(name, stats.size, limit);
    return await readAtMost(handle, name, limit);
  } finally {
    await handle.close();
  }
}

async function readAtMost(handle: FileHandle, name: string, limit: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  for (;;) {
    // One byte beyond the limit is asked for, to tell a file of exactly `limit` bytes from a longer one.
    const chunk = Buffer.allocUnsafe(Math.min(READ_CHUNK_BYTES, limit + 1 - total));
    const { bytesRead } = await handle.read(chunk, 0, chunk.length, null);
    if (bytesRead === 0) return Buffer.concat(chunks, total);
    chunks.push(chunk.subarray(0, bytesRead));
    total += bytesRead;
    if (total > limit) throw tooLarge(name, null, limit);
  }
}

/** `size` as the file stated it; null when it grew past the limit while being read. */
function tooLarge(name: string, size: number | null, limit: number): BenchApiError {
  return new BenchApiError(`'${name}' is ${size === null ? 'more than' : `${size} bytes, more than`} the ${limit} bytes the window reads`);
}

function reasonOf(error: unknown): string {
  const code = (error as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (code === 'EISDIR') return 'it is a folder';
  return String(code ?? error);
}
