// The bench log as report text for the window, rendered exactly as `ringbench report` writes it.

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { realpathSync } from 'node:fs';
import { isAbsolute, relative } from 'node:path';
import { writeReport, type CaptureReadPolicy } from '../app/reportFile';
import type { NamedText, ReportFormat } from '../../core/bench/benchApiTypes';
import { BenchApiError } from './apiError';

/**
 * What the window's report may read again: a capture inside the project folder, or one `granted` allows (the
 * page opened it); any other path a record names is not read, and the report says so.
 */
export function captureReadPolicy(projectRoot: string, granted: (path: string) => boolean): CaptureReadPolicy {
  const root = realOrNull(projectRoot);
  return (path) => {
    const real = isAbsolute(path) ? realOrNull(path) : null;
    if (real === null) return null; // missing or not a path: the read itself says so
    const inside = root !== null && !relative(root, real).startsWith('..') && !isAbsolute(relative(root, real));
    return inside || granted(path) ? null : 'was not opened in this session or from the project folder, so the bench does not read it again';
  };
}

function realOrNull(path: string): string | null {
  try {
    return realpathSync(path);
  } catch {
    return null;
  }
}

export function renderLogReport(logPath: string, format: ReportFormat, clock: () => Date, mayReadCapture: CaptureReadPolicy): NamedText {
  const name = `bench-report.${format}`;
  // writeReport renders and writes atomically; a private temporary folder gives us its text.
  const folder = mkdtempSync(join(tmpdir(), 'ringbench-report-'));
  try {
    const out = join(folder, name);
    const written = writeReport(logPath, out, { clock, mayReadCapture });
    if (written.records === 0) throw new BenchApiError('the bench log has no measurements yet: add one first');
    return { name, text: readFileSync(out, 'utf8') };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
