// The bench API both faces of the window use (IPC in the desktop window, HTTP in the browser bench):
// the calls, what they take and answer, and the menu commands. Types only, plus the two name lists.

import type { BenchRecord } from '../report/benchRecord';
import type { CorrectionAction, LabelChanges } from '../report/logCorrection';

/** What crosses IPC and HTTP: a value or a plain message, never a thrown stack. */
export type ApiResult<T> = { ok: true; value: T } | { ok: false; error: string; code?: ApiErrorCode };
export type ApiErrorCode = 'unknown-method' | 'bad-argument' | 'failed';

/** A bundled sample capture, as the manifest states it. */
export interface SampleEntry {
  id: string;
  title: string;
  description: string;
  /** File name inside sample-captures/. */
  file: string;
  /** Id of its design in sample-captures/designs/, or null. */
  designId: string | null;
  /** Options the sample needs to be read or fitted (as the command line would take them). */
  options: SampleOptions;
  /** Member of an added-capacitor set: the set's name and the capacitance added, F. */
  addedCapacitor: { group: string; added: number } | null;
}

export interface SampleOptions {
  column?: string;
  sampleInterval?: string;
  from?: string;
  to?: string;
  topology?: string;
  known?: string;
}

export interface NamedText {
  name: string;
  text: string;
}

/** A capture's text with where it came from: a path the user granted, a sample, or neither. */
export interface OpenedCapture extends NamedText {
  /** Absolute path (window) or the sample's path in the repository; null for a browser upload. */
  path: string | null;
  sampleId: string | null;
}

/** A capture file the window read from disk: its bytes as written, so the importer finds the encoding (UTF-16, Windows-1252). */
export interface OpenedCaptureFile {
  name: string;
  path: string;
  sampleId: null;
  bytes: Uint8Array;
}

export interface OpenedSample extends OpenedCapture {
  sample: SampleEntry;
  design: NamedText | null;
}

export interface DesignEntry {
  id: string;
  name: string;
}

/** One measurement to log, as the window computed it; main adds the record kind, id, time and software. */
export type BenchLogRequest = Omit<BenchRecord, 'record' | 'schema' | 'id' | 'time' | 'software'>;

export interface BenchLogView {
  /** Where the log lives, for the window to show. */
  path: string;
  records: BenchRecord[];
  /** Plain notes: a cut-off last line, lines that are not records. */
  notes: string[];
  /** Logged measurements withdrawn since, each with the withdrawal's time and reason (absent when none). */
  withdrawn?: { record: BenchRecord; time: string; reason: string }[];
  /** Ids of the measurements whose labels were amended (absent when none). */
  amended?: string[];
}

/** Amend the labels of a logged measurement or withdraw it; kept in the log as a correction record, nothing rewritten. */
export interface LogCorrectionRequest {
  /** Id of the measurement. */
  target: string;
  action: CorrectionAction;
  /** The labels an amendment changes; {} for a withdrawal. */
  changes: LabelChanges;
  reason: string;
}

/** A file the window asks to save through a dialog. */
export interface SaveRequest {
  suggestedName: string;
  content: string;
  encoding: 'utf8' | 'base64';
}

/** Served by main to both faces: over IPC in the window and over HTTP to the browser bench. */
export interface BenchApi {
  listSamples(): Promise<SampleEntry[]>;
  readSample(id: string): Promise<OpenedSample>;
  listDesigns(): Promise<DesignEntry[]>;
  readDesign(id: string): Promise<NamedText>;
  readBenchLog(): Promise<BenchLogView>;
  appendBenchLog(request: BenchLogRequest): Promise<BenchLogView>;
  /** Append an amendment or withdrawal of a logged measurement; answers the log as it stands then. */
  correctBenchLog(request: LogCorrectionRequest): Promise<BenchLogView>;
  /** The bench log as a report (the same as `ringbench report`), to be saved by the window. */
  renderReport(format: ReportFormat): Promise<NamedText>;
}

export type ReportFormat = 'html' | 'md' | 'csv';

/** The calls the HTTP server answers too (the shell calls need the window's dialogs). */
export const BENCH_METHODS = ['listSamples', 'readSample', 'listDesigns', 'readDesign', 'readBenchLog', 'appendBenchLog', 'renderReport', 'correctBenchLog'] as const satisfies readonly (keyof BenchApi)[];

export const MENU_COMMANDS = ['open-capture', 'open-design', 'save-report', 'export-png', 'export-svg', 'toggle-theme'] as const;
export type MenuCommand = (typeof MENU_COMMANDS)[number];
