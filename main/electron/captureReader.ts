// Reads a granted capture or design file for the window, within a size limit.

import { basename } from 'node:path';
import { statSync } from 'node:fs';
import { readFileBytes } from '../io/captureFile';
import { BenchApiError } from '../api/apiError';
import type { NamedText, OpenedCaptureFile } from '../../core/bench/benchApiTypes';

const MAX_CAPTURE_BYTES = 512 * 1024 * 1024;
const MAX_DESIGN_BYTES = 1024 * 1024;

/** The capture's bytes as written: the window's importer finds their encoding, as the command line's does. */
export function readCaptureFile(path: string): OpenedCaptureFile {
  return { name: basename(path), path, sampleId: null, bytes: readLimited(path, MAX_CAPTURE_BYTES) };
}

export function readDesignText(path: string): NamedText {
  return { name: basename(path), text: readLimited(path, MAX_DESIGN_BYTES).toString('utf8') };
}

function readLimited(path: string, limit: number): Buffer {
  let size: number;
  try {
    size = statSync(path).size;
  } catch {
    throw new BenchApiError(`cannot read '${path}': no such file`);
  }
  if (size > limit) throw new BenchApiError(`'${basename(path)}' is ${size} bytes, more than the ${limit} the window reads`);
  return readFileBytes(path);
}
