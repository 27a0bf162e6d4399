// Writes a file whole or not at all: a temporary file beside it, flushed to disk, then renamed over it.

import { closeSync, fsyncSync, openSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join } from 'node:path';
import { FileError } from './fileError';

/** Write `text` to a temporary file beside `path`, fsync, then rename over it: never a half-written file. */
export function writeFileAtomic(path: string, text: string): void {
  const temporary = join(dirname(path), `.${basename(path)}.${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
  let fd: number | null = null;
  try {
    fd = openSync(temporary, 'wx', 0o644);
    const data = Buffer.from(text, 'utf8');
    let offset = 0;
    while (offset < data.length) offset += writeSync(fd, data, offset, data.length - offset);
    fsyncSync(fd);
    closeSync(fd);
    fd = null;
    renameSync(temporary, path);
  } catch (error) {
    if (fd !== null) closeSync(fd);
    try {
      unlinkSync(temporary);
    } catch {
      // already gone
    }
    throw new FileError(`cannot write report '${path}': ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
  }
}
