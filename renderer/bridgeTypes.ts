// The window's view of the bench API (mirrors main/electron/channels.ts; a test keeps the two in step).

import type { BenchRecord, LoggedCautions, MeasurementSettings } from '../core/report/benchRecord';
import type { FitSummary } from '../core/report/fitSummary';
import type { Verdict } from '../core/circuit/verdict';
import type { Design } from '../core/circuit/design';

export type ApiResult<T> = { ok: true; value: T } | { ok: false; error: string; code?: string };

export interface SampleOptions {
  column?: string;
  sampleInterval?: string;
  from?: string;
  to?: string;
  topology?: string;
  known?: string;
}

export interface SampleEntry {
  id: string;
  title: string;
  description: string;
  file: string;
  designId: string | null;
  options: SampleOptions;
  addedCapacitor: { group: string; added: number } | null;
}

export interface NamedText {
  name: string;
  text: string;
}

export interface OpenedCapture extends NamedText {
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
  path: string;
  records: BenchRecord[];
  notes: string[];
}

export interface SaveRequest {
  suggestedName: string;
  content: string;
  encoding: 'utf8' | 'base64';
}

/** The calls both faces answer (HTTP in the browser bench, IPC in the window). */
export interface BenchCalls {
  listSamples(): Promise<SampleEntry[]>;
  readSample(id: string): Promise<OpenedSample>;
  listDesigns(): Promise<DesignEntry[]>;
  readDesign(id: string): Promise<NamedText>;
  readBenchLog(): Promise<BenchLogView>;
  appendBenchLog(request: BenchLogRequest): Promise<BenchLogView>;
  renderReport(format: ReportFormat): Promise<NamedText>;
}

export type ReportFormat = 'html' | 'md' | 'csv';

export const BENCH_CALLS = ['listSamples', 'readSample', 'listDesigns', 'readDesign', 'readBenchLog', 'appendBenchLog', 'renderReport'] as const satisfies readonly (keyof BenchCalls)[];

export const MENU_COMMANDS = ['open-capture', 'open-design', 'save-report', 'export-png', 'export-svg', 'toggle-theme'] as const;
export type MenuCommand = (typeof MENU_COMMANDS)[number];

/** What the window's preload exposes as window.ringbench (each call answers with an ApiResult). */
export interface PreloadApi {
  listSamples(): Promise<ApiResult<SampleEntry[]>>;
  readSample(id: string): Promise<ApiResult<OpenedSample>>;
  listDesigns(): Promise<ApiResult<DesignEntry[]>>;
  readDesign(id: string): Promise<ApiResult<NamedText>>;
  readBenchLog(): Promise<ApiResult<BenchLogView>>;
  appendBenchLog(request: BenchLogRequest): Promise<ApiResult<BenchLogView>>;
  renderReport(format: ReportFormat): Promise<ApiResult<NamedText>>;
  openCaptureDialog(): Promise<ApiResult<OpenedCapture | null>>;
  openDesignDialog(): Promise<ApiResult<NamedText | null>>;
  saveFileDialog(request: SaveRequest): Promise<ApiResult<string | null>>;
  openDroppedFile(file: File): Promise<ApiResult<OpenedCapture>>;
  onMenuCommand(listener: (command: MenuCommand) => void): void;
  onCaptureOpened(listener: (capture: OpenedCapture) => void): void;
}

/** Everything the window needs from outside the page, the same on both faces. */
export interface Bridge extends BenchCalls {
  face: 'window' | 'browser';
  /** Let the user choose a capture file; null when cancelled. */
  pickCapture(): Promise<OpenedCapture | null>;
  /** A file dropped on the window. */
  openDropped(file: File): Promise<OpenedCapture>;
  pickDesign(): Promise<NamedText | null>;
  /** Save through a dialog (window) or as a download (browser); the path when known. */
  saveFile(request: SaveRequest, mime: string): Promise<string | null>;
  onMenuCommand(listener: (command: MenuCommand) => void): void;
  onCaptureOpened(listener: (capture: OpenedCapture) => void): void;
}
