// The window-only calls: native open and save dialogs, and opening files the user granted.

import { dialog, type BrowserWindow } from 'electron';
import { writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { OpenedCaptureFile } from '../../core/bench/benchApiTypes';
import type { ShellApi } from '../api/apiMethods';
import type { GrantedPaths } from './grantedPaths';
import { readCaptureFile, readDesignText } from './captureReader';
import { BenchApiError } from '../api/apiError';

export interface ShellContext {
  window(): BrowserWindow | null;
  granted: GrantedPaths;
  /** Where save dialogs start. */
  documentsDir: string;
  /** Called with every capture opened from a granted path (recent list, window title). */
  onCaptureOpened(path: string): void;
}

const CAPTURE_FILTERS = [
  { name: 'Captures (CSV, text)', extensions: ['csv', 'txt', 'tsv', 'dat'] },
  { name: 'All files', extensions: ['*'] },
];

export function createShellHandlers(context: ShellContext): ShellApi {
  const openGranted = async (path: string): Promise<OpenedCaptureFile> => {
    if (!context.granted.isGranted(path)) throw new BenchApiError('the window may open only files chosen in a dialog or dropped on it');
    const opened = await readCaptureFile(path);
    context.onCaptureOpened(path);
    return opened;
  };
  return {
    openCaptureDialog: async () => {
      const win = context.window();
      const options = { title: 'Open capture', properties: ['openFile' as const], filters: CAPTURE_FILTERS };
      const choice = win ? await dialog.showOpenDialog(win, options) : await dialog.showOpenDialog(options);
      if (choice.canceled || choice.filePaths.length === 0) return null;
      const path = context.granted.grant(choice.filePaths[0]);
      return path === null ? null : openGranted(path);
    },
    openDroppedPath: async (path) => {
      // Only the preload sends this, with a path it took from a real dropped File; the page cannot reach it.
      const granted = context.granted.grant(path);
      if (granted === null) throw new BenchApiError(`the dropped file '${path}' cannot be found`);
      return openGranted(granted);
    },
    openDesignDialog: async () => {
      const win = context.window();
      const options = { title: 'Open design', properties: ['openFile' as const], filters: [{ name: 'Designs (JSON)', extensions: ['json'] }] };
      const choice = win ? await dialog.showOpenDialog(win, options) : await dialog.showOpenDialog(options);
      if (choice.canceled || choice.filePaths.length === 0) return null;
      return readDesignText(choice.filePaths[0]);
    },
    saveFileDialog: async (request) => {
      const win = context.window();
      const options = { title: 'Save', defaultPath: join(context.documentsDir, request.suggestedName) };
      const choice = win ? await dialog.showSaveDialog(win, options) : await dialog.showSaveDialog(options);
      if (choice.canceled || !choice.filePath) return null;
      await writeFile(choice.filePath, request.encoding === 'base64' ? Buffer.from(request.content, 'base64') : request.content);
      return choice.filePath;
    },
  };
}
