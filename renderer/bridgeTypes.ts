// The window's view of the bench API: the preload's calls and the bridge both faces implement.
// The calls and their types are core/bench/benchApiTypes.ts, shared with main.

import type {
  BenchApi,
  BenchLogRequest,
  BenchLogView,
  DesignEntry,
  LogCorrectionRequest,
  MenuCommand,
  NamedText,
  OpenedCapture,
  OpenedCaptureFile,
  OpenedSample,
  ReportFormat,
  SampleEntry,
  SaveRequest,
  ApiResult,
} from '../core/bench/benchApiTypes';

import type { CaptureContent } from './workerProtocol';

export * from '../core/bench/benchApiTypes';

/** A capture file the user chose: its bytes as written (a browser upload) or the text main read for the window. */
export type OpenedFile = Omit<OpenedCapture, 'text'> & CaptureContent;

/** The calls both faces answer (HTTP in the browser bench, IPC in the window). */
export type BenchCalls = BenchApi;
export { BENCH_METHODS as BENCH_CALLS } from '../core/bench/benchApiTypes';

/** What the window's preload exposes as window.ringbench (each call answers with an ApiResult). */
export interface PreloadApi {
  listSamples(): Promise<ApiResult<SampleEntry[]>>;
  readSample(id: string): Promise<ApiResult<OpenedSample>>;
  listDesigns(): Promise<ApiResult<DesignEntry[]>>;
  readDesign(id: string): Promise<ApiResult<NamedText>>;
  readBenchLog(): Promise<ApiResult<BenchLogView>>;
  appendBenchLog(request: BenchLogRequest): Promise<ApiResult<BenchLogView>>;
  correctBenchLog(request: LogCorrectionRequest): Promise<ApiResult<BenchLogView>>;
  renderReport(format: ReportFormat): Promise<ApiResult<NamedText>>;
  openCaptureDialog(): Promise<ApiResult<OpenedCaptureFile | null>>;
  openDesignDialog(): Promise<ApiResult<NamedText | null>>;
  saveFileDialog(request: SaveRequest): Promise<ApiResult<string | null>>;
  openDroppedFile(file: File): Promise<ApiResult<OpenedCaptureFile>>;
  onMenuCommand(listener: (command: MenuCommand) => void): void;
  onCaptureOpened(listener: (capture: OpenedCaptureFile) => void): void;
}

/** Everything the window needs from outside the page, the same on both faces. */
export interface Bridge extends BenchCalls {
  face: 'window' | 'browser';
  /** Let the user choose a capture file; null when cancelled. */
  pickCapture(): Promise<OpenedFile | null>;
  /** A file dropped on the window. */
  openDropped(file: File): Promise<OpenedFile>;
  pickDesign(): Promise<NamedText | null>;
  /** Save through a dialog (window) or as a download (browser); the path when known. */
  saveFile(request: SaveRequest, mime: string): Promise<string | null>;
  onMenuCommand(listener: (command: MenuCommand) => void): void;
  onCaptureOpened(listener: (capture: OpenedFile) => void): void;
}
