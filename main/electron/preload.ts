// The preload: the bench API exposed to the page as window.ringbench, built from the one channel list. The page
// gets only checked, plain data from main, and every listener the preload adds is removed when the page goes.

import { contextBridge, ipcRenderer, webUtils, type IpcRendererEvent } from 'electron';
import type { ApiResult, MenuCommand, OpenedCaptureFile } from '../../core/bench/benchApiTypes';
import type { ApiMethod } from '../api/apiMethods';
import { CHANNELS, EVENTS, EXPOSED_NAME, type ExposedApi } from './channels';
import { apiResultFrom, menuCommandFrom, openedCaptureFrom } from './pagePayloads';

type Relay = (event: IpcRendererEvent, payload: unknown) => void;

/** The page's window as the preload sees it (main/ is typed without the DOM). */
function pageWindow(): { addEventListener(type: 'pagehide', listener: () => void): void } {
  return globalThis as unknown as ReturnType<typeof pageWindow>;
}

/** One invoker per channel except the dropped-file one, whose path the preload itself finds. */
export function buildExposedApi(): ExposedApi {
  const relays: [string, Relay][] = [];
  /** Listens on a channel of main's events; the relay is kept to be removed with the page. */
  const listen = (channel: string, relay: Relay) => {
    ipcRenderer.on(channel, relay);
    relays.push([channel, relay]);
  };
  // 'pagehide' fires whenever the page goes (reload, navigation, close); Chromium is retiring 'unload'.
  pageWindow().addEventListener('pagehide', () => {
    for (const [channel, relay] of relays.splice(0)) ipcRenderer.removeListener(channel, relay);
  });
  const invoke = async (channel: string, args: unknown[]): Promise<ApiResult<unknown>> => apiResultFrom(await ipcRenderer.invoke(channel, ...args));
  const calls: Record<string, (...args: unknown[]) => Promise<unknown>> = {};
  for (const method of Object.keys(CHANNELS) as ApiMethod[]) {
    if (method === 'openDroppedPath') continue;
    calls[method] = (...args) => invoke(CHANNELS[method], args);
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
      return (await invoke(CHANNELS.openDroppedPath, [path])) as ApiResult<OpenedCaptureFile>;
    },
    onMenuCommand: (listener) => {
      listen(EVENTS.menuCommand, (_event, payload) => {
        const command: MenuCommand | null = menuCommandFrom(payload);
        if (command !== null) listener(command);
      });
    },
    onCaptureOpened: (listener) => {
      listen(EVENTS.captureOpened, (_event, payload) => {
        const capture = openedCaptureFrom(payload);
        if (capture !== null) listener(capture);
      });
    },
  };
}

contextBridge.exposeInMainWorld(EXPOSED_NAME, buildExposedApi());
