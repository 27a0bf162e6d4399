// The bench API shared by the preload, the Electron main process and the local server: its types,
// its one list of channels, and the events the main process sends to the window.

import type { BenchRecord, LoggedCautions, MeasurementSettings } from '../../core/report/benchRecord';
import type { FitSummary } from '../../core/report/fitSummary';
import type { Verdict } from '../../core/circuit/verdict';
import type { Design } from '../../core/circuit/design';

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

export interface OpenedSample extends OpenedCapture {
  sample: SampleEntry;
  design: NamedText | null;
}

export interface DesignEntry {
  id: string;
  name: string;
}

/** One measurement to log, as the window computed it; main adds the id, time and software. */
export interface BenchLogRequest {
  unit: string;
  operator: string | null;
  note: string | null;
  capture: { path: string; sha256: string; bytes: number; channel: string };
  settings: MeasurementSettings;
  fit: FitSummary;
  verdict: Verdict | null;
  design: { path: string; name: string; sha256: string; spec: Design } | null;
  cautions: LoggedCautions;
}

export interface BenchLogView {
  /** Where the log lives, for the window to show. */
  path: string;
  records: BenchRecord[];
  /** Plain notes: a cut-off last line, lines that are not records. */
  notes: string[];
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
  /** The bench log as a report (the same as `ringbench report`), to be saved by the window. */
  renderReport(format: ReportFormat): Promise<NamedText>;
}

export type ReportFormat = 'html' | 'md' | 'csv';

/** The window only: native dialogs, and paths the user granted through them or by dropping a file. */
export interface ShellApi {
  openCaptureDialog(): Promise<OpenedCapture | null>;
  /** The path of a dropped file, found by the preload from the File itself. */
  openDroppedPath(path: string): Promise<OpenedCapture>;
  openDesignDialog(): Promise<NamedText | null>;
  saveFileDialog(request: SaveRequest): Promise<string | null>;
}

export type BenchMethod = keyof BenchApi;
export type ShellMethod = keyof ShellApi;
export type ApiMethod = BenchMethod | ShellMethod;

/** Every call and its IPC channel: the one list the preload and main are built from. */
export const CHANNELS = {
  listSamples: 'bench:list-samples',
  readSample: 'bench:read-sample',
  listDesigns: 'bench:list-designs',
  readDesign: 'bench:read-design',
  readBenchLog: 'bench:read-log',
  appendBenchLog: 'bench:append-log',
  renderReport: 'bench:render-report',
  openCaptureDialog: 'shell:open-capture',
  openDroppedPath: 'shell:open-dropped',
  openDesignDialog: 'shell:open-design',
  saveFileDialog: 'shell:save-file',
} as const satisfies Record<ApiMethod, string>;

/** The calls the HTTP server also answers (the shell calls need the window's dialogs). */
export const BENCH_METHODS = ['listSamples', 'readSample', 'listDesigns', 'readDesign', 'readBenchLog', 'appendBenchLog', 'renderReport'] as const satisfies readonly BenchMethod[];

/** Messages from main to the window. */
export const EVENTS = {
  /** A menu item that the window carries out; payload a MenuCommand. */
  menuCommand: 'event:menu-command',
  /** A capture main opened itself (recent files); payload an OpenedCapture. */
  captureOpened: 'event:capture-opened',
} as const;

export const MENU_COMMANDS = ['open-capture', 'open-design', 'save-report', 'export-png', 'export-svg', 'toggle-theme'] as const;
export type MenuCommand = (typeof MENU_COMMANDS)[number];

/** What the preload exposes to the page as `window.ringbench`: every call returns an ApiResult. */
export type ExposedApi = {
  [M in Exclude<ApiMethod, 'openDroppedPath'>]: (...args: Parameters<(BenchApi & ShellApi)[M]>) => Promise<ApiResult<Awaited<ReturnType<(BenchApi & ShellApi)[M]>>>>;
} & {
  /** Opens a dropped or picked File by its path on disk (the page never sees or forges the path). */
  openDroppedFile(file: unknown): Promise<ApiResult<OpenedCapture>>;
  onMenuCommand(listener: (command: MenuCommand) => void): void;
  onCaptureOpened(listener: (capture: OpenedCapture) => void): void;
};

export const EXPOSED_NAME = 'ringbench';
