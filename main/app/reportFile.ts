// Writes a report file from a bench log: reloads each capture for its plot, renders, writes atomically.

import { statSync } from 'node:fs';
import { createHash } from 'node:crypto';
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
import { readFileBytes } from '../io/captureFile';
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

/** Each record's capture read again with its logged settings; only files with the logged sha256 are used. */
export function loadReportTraces(records: readonly BenchRecord[]): ReportTraces {
  const result: ReportTraces = { traces: {}, recordNotes: {} };
  for (const record of records) {
    const note = (text: string) => (result.recordNotes[record.id] ??= []).push(text);
    const { path, sha256 } = record.capture;
    try {
      const bytes = readFileBytes(path);
      const now = createHash('sha256').update(bytes).digest('hex');
      if (now !== sha256) {
        note(`The capture ${path} has changed since it was logged (sha256 ${now.slice(0, 12)}… instead of ${sha256.slice(0, 12)}…): the numbers are those logged, no plot is drawn.`);
        continue;
      }
      // Read as it was when logged: the same channel, interval, time order and stated units.
      const settings = settingsOfRecord(record.settings);
      const { channel: chosen, ...reading } = readingOptionsOf(settings);
      const channel = applyProbe(selectChannel(parseCaptureFileBytes(bytes, reading), chosen), parseMeasureSettings(settings).probe);
      result.traces[record.id] = { time: channel.time, values: channel.values, unit: channel.unit, name: channel.name };
    } catch (error) {
      const missing = error instanceof FileError && /no such file/.test(error.message);
      note(
        missing
          ? `The capture ${path} is missing: the numbers are those logged, no plot is drawn.`
          : `The capture ${path} could not be read again (${(error as Error).message}): the numbers are those logged, no plot is drawn.`,
      );
    }
  }
  return result;
}

export interface WriteReportOptions {
  /** Clock for the report's date. Default: the system clock. */
  clock?: () => Date;
  /** The lot report (yields, capability, failures by cause) instead of every measurement. Default false. */
  lot?: boolean;
}

export interface WrittenReport {
  format: ReportFormat;
  records: number;
  /** Notes for the terminal: torn tail, captures without plots. */
  notes: string[];
}

/** Render the log(s) at `logPaths`, merged (mergedLogs.ts), into `outPath` (format by extension), replacing it atomically. */
export function writeReport(logPaths: string | readonly string[], outPath: string, options: WriteReportOptions = {}): WrittenReport {
  const format = reportFormatFor(outPath);
  if (format === null) throw new FileError(`report '${outPath}': the name must end in .html, .md or .csv`);
  requireFolder(outPath);
  const logs = typeof logPaths === 'string' ? [logPaths] : [...logPaths];
  const logPath = logs.join(', ');
  const merged = readMergedLogs(logs.map((path) => ({ path, shown: path })), readOneLog);
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
    const { traces, recordNotes } = loadReportTraces(records);
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
  return { format, records: records.length, notes };
}

/** One log as a report reads it: a bad line refuses the log, a cut-off last line is noted. */
function readOneLog({ path }: LogSource): ReadLog {
  const contents = readCleanBenchLog(path);
  return { records: contents.records, notes: contents.torn ? [describeTornTail(path, contents.torn)] : [] };
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
