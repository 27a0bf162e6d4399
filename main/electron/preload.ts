// The preload: the bench API exposed to the page as window.ringbench, built from the one channel list.

import { contextBridge, ipcRenderer, webUtils } from 'electron';
import { MENU_COMMANDS, type MenuCommand, type OpenedCaptureFile } from '../../core/bench/benchApiTypes';
import type { ApiMethod } from '../api/apiMethods';
import { CHANNELS, EVENTS, EXPOSED_NAME, type ExposedApi } from './channels';

/** One invoker per channel except the dropped-file one, whose path the preload itself finds. */
export function buildExposedApi(): ExposedApi {
  const calls: Record<string, (...args: unknown[]) => Promise<unknown>> = {};
  for (const method of Object.keys(CHANNELS) as ApiMethod[]) {
    if (method === 'openDroppedPath') continue;
    calls[method] = (...args) => ipcRenderer.invoke(CHANNELS[method], ...args);
  }
  return {
    ...(calls as unknown as Omit<ExposedApi, 'openDroppedFile' | 'onMenuCommand' | 'onCaptureOpened'>),
    openDroppedFile: async (file) => {
      let path: string;
      try {
        path = webUtils.getPathForFile(file as Parameters<typeof webUtils.getPathForFile>[0]);
      } catch {
        return { ok: false, error: 'only a file dropped from disk can be opened' };
      }
      if (!path) return { ok: false, error: 'the dropped item is not a file on disk' };
      return ipcRenderer.invoke(CHANNELS.openDroppedPath, path);
    },
    onMenuCommand: (listener) => {
      ipcRenderer.on(EVENTS.menuCommand, (_event, command: unknown) => {
        if ((MENU_COMMANDS as readonly unknown[]).includes(command)) listener(command as MenuCommand);
      });
    },
    onCaptureOpened: (listener) => {
      ipcRenderer.on(EVENTS.captureOpened, (_event, capture: OpenedCaptureFile) => listener(capture));
    },
  };
}

contextBridge.exposeInMainWorld(EXPOSED_NAME, buildExposedApi());
