// Every call of the bench API by name: the shared calls of core/bench and the window-only shell calls.

import { BENCH_METHODS, type BenchApi, type NamedText, type OpenedCaptureFile, type SaveRequest } from '../../core/bench/benchApiTypes';

/** The window only: native dialogs, and paths the user granted through them or by dropping a file. */
export interface ShellApi {
  openCaptureDialog(): Promise<OpenedCaptureFile | null>;
  /** The path of a dropped file, found by the preload from the File itself. */
  openDroppedPath(path: string): Promise<OpenedCaptureFile>;
  openDesignDialog(): Promise<NamedText | null>;
  saveFileDialog(request: SaveRequest): Promise<string | null>;
}

export type BenchMethod = keyof BenchApi;
export type ShellMethod = keyof ShellApi;
export type ApiMethod = BenchMethod | ShellMethod;

export const SHELL_METHODS = ['openCaptureDialog', 'openDroppedPath', 'openDesignDialog', 'saveFileDialog'] as const satisfies readonly ShellMethod[];

/** Every call the dispatcher knows, in the order of the IPC channel list. */
export const API_METHODS: readonly ApiMethod[] = [...BENCH_METHODS, ...SHELL_METHODS];
