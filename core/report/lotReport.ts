// The lot report of some records in one of its three forms: HTML (with histograms), Markdown or CSV.

import type { BenchRecord } from './benchRecord';
import { renderLotCsv } from './lotCsv';
import { renderLotHtml } from './lotHtml';
import { renderLotMarkdown } from './lotMarkdown';
import { summarizeLot } from './lotSummary';
import { showTime } from './resultRows';

export interface LotReportInput {
  format: 'html' | 'md' | 'csv';
  /** The logs the records came from, as shown to the reader. */
  logPaths: readonly string[];
  /** ISO time the report was made. */
  generatedAt: string;
  software: { name: string; version: string };
  /** Notes about the logs (duplicate records, a cut-off last line). */
  logNotes: readonly string[];
}

/** Records in time order (a merged log is sorted by its reader). */
export function renderLotReport(records: readonly BenchRecord[], input: LotReportInput): string {
  const summary = summarizeLot(records);
  if (input.format === 'csv') return renderLotCsv(summary);
  if (input.format === 'html') return renderLotHtml(summary, input);
  const made = `Made ${showTime(input.generatedAt)} by ${input.software.name} ${input.software.version}`;
  return renderLotMarkdown(summary, { meta: [`Log${input.logPaths.length === 1 ? '' : 's'} ${input.logPaths.join(', ')}`, made, ...input.logNotes] });
}
