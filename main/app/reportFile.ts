// Writes a report file from a bench log: reloads each capture for its plot, renders, writes atomically.

import { statSync } from 'node:fs';
import { dirname, extname } from 'node:path';
import type { BenchRecord } from '../../core/report/benchRecord';
import type { ReportTrace } from '../../core/report/overlay';
import { renderReportHtml } from '../../core/report/reportHtml';
import { renderReportMarkdown } from '../../core/report/reportMarkdown';
import { renderReportCsv } from '../../core/report/reportCsv';
import { showTime } from '../../core/report/resultRows';
import { describeTornTail, readCleanBenchLog } from '../io/benchLog';
import { renderLotReport } from '../../core/report/lotReport';
import { readMergedLogs, type LogSource, type ReadLog } from './mergedLogs';
import { readLoggedCapture } from '../io/captureFile';
import { InputError } from '../../core/inputError';
import { parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { readingOptionsOf, settingsOfRecord } from './readingOptions';
import { parseMeasureSettings } from '../../core/workflow/measureSettings';
import { applyProbe } from '../../core/workflow/probeScaling';
import { FileError } from '../io/fileError';
import { writeFileAtomic } from '../io/atomicFile';
import { VERSION } from '../version';

export type ReportFormat = 'html' | 'md' | 'csv';

const FORMATS: Record<string, ReportFormat> = { '.html': 'html', '.htm': 'html', '.md': 'md', '.csv': 'csv' };

/** The format an output path asks for by its extension, or null. */
export function reportFormatFor(path: string): ReportFormat | null {
  return FORMATS[extname(path).toLowerCase()] ?? null;
}

export interface ReportTraces {
  traces: Record<string, ReportTrace>;
  /** Why a record has no plot: capture missing, changed since logged, or unreadable. */
  recordNotes: Record<string, string[]>;
}

/** Why a capture may not be read for a report (a phrase after its path), or null when it may. */
export type CaptureReadPolicy = (path: string) => string | null;

/**
 * Each record's capture read again with its logged settings; only a regular file of the logged size and
 * sha256 that `mayRead` allows (default: any) is read, and never more than the logged bytes (readLoggedCapture).
 */
export function loadReportTraces(records: readonly BenchRecord[], mayRead: CaptureReadPolicy = () => null): ReportTraces {
  const result: ReportTraces = { traces: {}, recordNotes: {} };
  for (const record of records) {
    const note = (text: string) => (result.recordNotes[record.id] ??= []).push(text);
    const { path } = record.capture;
    const notRead = (why: string) => note(`The capture ${path} ${why}: the numbers are those logged, no plot is drawn.`);
    try {
      const refusal = mayRead(path);
      if (refusal !== null) {
        notRead(refusal);
        continue;
      }
      const { bytes, refused } = readLoggedCapture(path, record.capture);
      if (bytes === null) {
        notRead(refused);
        continue;
      }
      // Read as it was when logged: the same channel, interval, time order and stated units.
      const settings = settingsOfRecord(record.settings);
      const { channel: chosen, ...reading } = readingOptionsOf(settings);
      const channel = applyProbe(selectChannel(parseCaptureFileBytes(bytes, reading), chosen), parseMeasureSettings(settings).probe);
      result.traces[record.id] = { time: channel.time, values: channel.values, unit: channel.unit, name: channel.name };
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      notRead(`could not be read again (${error.message})`);
    }
  }
  return result;
}

export interface WriteReportOptions {
  /** Clock for the report's date. Default: the system clock. */
  clock?: () => Date;
  /** The lot report (yields, capability, failures by cause) instead of every measurement. Default false. */
  lot?: boolean;
  /** Which logged captures may be read again for the plots (the bench API's limits). Default: any. */
  mayReadCapture?: CaptureReadPolicy;
}

export interface WrittenReport {
  format: ReportFormat;
  records: number;
  /** Notes for the terminal: skipped lines, corrections, torn tail, captures without plots. */
  notes: string[];
  /** Lines of the log(s) skipped as not records (each in `notes` and in the report). */
  skippedLines: number;
}

/** Render the log(s) at `logPaths`, merged (mergedLogs.ts), into `outPath` (format by extension), replacing it atomically. */
export function writeReport(logPaths: string | readonly string[], outPath: string, options: WriteReportOptions = {}): WrittenReport {
  const format = reportFormatFor(outPath);
  if (format === null) throw new FileError(`report '${outPath}': the name must end in .html, .md or .csv`);
  requireFolder(outPath);
  const logs = typeof logPaths === 'string' ? [logPaths] : [...logPaths];
  const logPath = logs.join(', ');
  let skippedLines = 0;
  const merged = readMergedLogs(logs.map((path) => ({ path, shown: path })), (source) => {
    const log = readOneLog(source);
    skippedLines += log.skipped;
    return log;
  });
  const logNotes = merged.notes;
  const generatedAt = (options.clock ?? (() => new Date()))().toISOString();
  const { records } = merged;
  let text: string;
  const notes = [...logNotes];
  if (options.lot) {
    text = renderLotReport(records, { format, logPaths: logs, generatedAt, software: { name: 'ringbench', version: VERSION }, logNotes });
  } else if (format === 'csv') {
    text = renderReportCsv(records);
  } else {
    const { traces, recordNotes } = loadReportTraces(records, options.mayReadCapture);
    for (const list of Object.values(recordNotes)) notes.push(...list);
    text =
      format === 'html'
        ? renderReportHtml(records, { logPath, generatedAt, software: { name: 'ringbench', version: VERSION }, traces, recordNotes, logNotes })
        : renderReportMarkdown(records, {
            meta: [`Log ${logPath}`, `Made ${showTime(generatedAt)} by ringbench ${VERSION}`, ...logNotes],
            recordNotes,
          });
  }
  writeFileAtomic(outPath, text);
  return { format, records: records.length, notes, skippedLines };
}

/** One log as a report reads it: its corrections applied; a skipped line, a correction and a cut-off last line noted. */
function readOneLog({ path }: LogSource): ReadLog & { skipped: number } {
  const contents = readCleanBenchLog(path);
  const notes = [...contents.notes, ...contents.changes, ...(contents.torn ? [describeTornTail(path, contents.torn)] : [])];
  return { records: contents.records, notes, skipped: contents.bad.length };
}

function requireFolder(path: string): void {
  const folder = dirname(path);
  let ok = false;
  try {
    ok = statSync(folder).isDirectory();
  } catch {
    ok = false;
  }
  if (!ok) throw new FileError(`report folder '${folder}' does not exist`);
}
