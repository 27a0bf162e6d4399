// The bench log as report text for the window, rendered exactly as `ringbench report` writes it.

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeReport } from '../app/reportFile';
import type { NamedText, ReportFormat } from '../../core/bench/benchApiTypes';
import { BenchApiError } from './apiError';

export function renderLogReport(logPath: string, format: ReportFormat, clock: () => Date): NamedText {
  const name = `bench-report.${format}`;
  // writeReport renders and writes atomically; a private temporary folder gives us its text.
  const folder = mkdtempSync(join(tmpdir(), 'ringbench-report-'));
  try {
    const out = join(folder, name);
    const written = writeReport(logPath, out, { clock });
    if (written.records === 0) throw new BenchApiError('the bench log has no measurements yet: add one first');
    return { name, text: readFileSync(out, 'utf8') };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
