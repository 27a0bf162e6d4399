// The Electron side of the bench API: the one list of IPC channels, the events main sends to the window,
// and what the preload exposes. The calls and their types live in core/bench and main/api.

import type { ApiResult, BenchApi, MenuCommand, OpenedCaptureFile } from '../../core/bench/benchApiTypes';
import type { ApiMethod, ShellApi } from '../api/apiMethods';

/** Every call and its IPC channel: the one list the preload and main are built from. */
export const CHANNELS = {
  listSamples: 'bench:list-samples',
  readSample: 'bench:read-sample',
  listDesigns: 'bench:list-designs',
  readDesign: 'bench:read-design',
  readBenchLog: 'bench:read-log',
  appendBenchLog: 'bench:append-log',
  renderReport: 'bench:render-report',
  correctBenchLog: 'bench:correct-log',
  openCaptureDialog: 'shell:open-capture',
  openDroppedPath: 'shell:open-dropped',
  openDesignDialog: 'shell:open-design',
  saveFileDialog: 'shell:save-file',
} as const satisfies Record<ApiMethod, string>;


/** Messages from main to the window. */
export const EVENTS = {
  /** A menu item that the window carries out; payload a MenuCommand. */
  menuCommand: 'event:menu-command',
  /** A capture main opened itself (recent files); payload an OpenedCaptureFile. */
  captureOpened: 'event:capture-opened',
} as const;


/** What the preload exposes to the page as `window.ringbench`: every call returns an ApiResult. */
export type ExposedApi = {
  [M in Exclude<ApiMethod, 'openDroppedPath'>]: (...args: Parameters<(BenchApi & ShellApi)[M]>) => Promise<ApiResult<Awaited<ReturnType<(BenchApi & ShellApi)[M]>>>>;
} & {
  /** Opens a dropped or picked File by its path on disk (the page never sees or forges the path). */
  openDroppedFile(file: unknown): Promise<ApiResult<OpenedCaptureFile>>;
  onMenuCommand(listener: (command: MenuCommand) => void): void;
  onCaptureOpened(listener: (capture: OpenedCaptureFile) => void): void;
};

export const EXPOSED_NAME = 'ringbench';
