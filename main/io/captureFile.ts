// Reads a capture file from disk into a Capture and the trace chosen for fitting.

import { readFileSync, statSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { resolve } from 'node:path';
import { parseCaptureBytes } from '../../core/capture/parseCapture';
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

/** Read bytes, failing with a message that names the path. */
export function readFileBytes(path: string): Buffer {
  try {
    if (statSync(path).isDirectory()) throw new FileError(`'${path}' is a folder, not a capture file`);
    return readFileSync(path);
  } catch (error) {
    if (error instanceof FileError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : String(code ?? error);
    throw new FileError(`cannot read '${path}': ${why}`);
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
  const capture = parseCaptureBytes(bytes, decodeUtf8, options);
  return {
    path: full,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    bytes: bytes.length,
    capture,
    channel: selectChannel(capture, options.channel),
  };
}
