// The captures of a batch folder, in code-point order of their names, and one shard's deterministic share of them.

import { readdirSync, statSync } from 'node:fs';
import { extname, join } from 'node:path';
import { FileError } from '../io/fileError';

const CAPTURE_EXTENSIONS = new Set(['.csv', '.txt', '.dat', '.lvm']);

/** Shard K of N (1 <= K <= N), as `--shard K/N` gives it. */
export interface Shard {
  index: number;
  count: number;
}

/** Code-point order, the same on every machine and locale: UTF-8 bytes compare in code-point order. */
function byCodePoint(a: string, b: string): number {
  return Buffer.compare(Buffer.from(a, 'utf8'), Buffer.from(b, 'utf8'));
}

/** Capture files of a folder (*.csv, *.txt, *.dat, *.lvm: a data logger's measurement file; any case), sorted by the code points of their names. */
export function listCaptureFiles(folder: string): string[] {
  let names: string[];
  try {
    if (!statSync(folder).isDirectory()) throw new FileError(`'${folder}' is not a folder`);
    names = readdirSync(folder);
  } catch (error) {
    if (error instanceof FileError) throw error;
    throw new FileError(`cannot read folder '${folder}': ${(error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such folder' : (error as NodeJS.ErrnoException).code}`);
  }
  return names.filter((name) => CAPTURE_EXTENSIONS.has(extname(name).toLowerCase()) && statSync(join(folder, name)).isFile()).sort(byCodePoint);
}

/** Shard K of N takes file i (0-based, in the order of listCaptureFiles) when i mod N = K - 1. */
export function shardShare<T>(files: readonly T[], shard: Shard): T[] {
  return files.filter((_, i) => i % shard.count === shard.index - 1);
}
