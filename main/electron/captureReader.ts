// Reads a granted capture or design file for the window, within a size limit.

import { basename } from 'node:path';
import { statSync } from 'node:fs';
import { readFileBytes } from '../io/captureFile';
import { BenchApiError } from '../api/apiError';
import type { NamedText, OpenedCapture } from '../../core/bench/benchApiTypes';

const MAX_CAPTURE_BYTES = 512 * 1024 * 1024;
const MAX_DESIGN_BYTES = 1024 * 1024;

export function readCaptureFile(path: string): OpenedCapture {
  return { ...readLimited(path, MAX_CAPTURE_BYTES), path, sampleId: null };
}

export function readDesignText(path: string): NamedText {
  return readLimited(path, MAX_DESIGN_BYTES);
}

function readLimited(path: string, limit: number): NamedText {
  let size: number;
  try {
    size = statSync(path).size;
  } catch {
    throw new BenchApiError(`cannot read '${path}': no such file`);
  }
  if (size > limit) throw new BenchApiError(`'${basename(path)}' is ${size} bytes, more than the ${limit} the window reads`);
  return { name: basename(path), text: readFileBytes(path).toString('utf8') };
}
