// The bridge of the Electron window: the preload's window.ringbench, its results unwrapped.

import { unwrap } from './benchError';
import type { Bridge, OpenedCaptureFile, OpenedFile, PreloadApi } from './bridgeTypes';

export function createDesktopBridge(api: PreloadApi): Bridge {
  return {
    face: 'window',
    listSamples: async () => unwrap(await api.listSamples()),
    readSample: async (id) => unwrap(await api.readSample(id)),
    listDesigns: async () => unwrap(await api.listDesigns()),
    readDesign: async (id) => unwrap(await api.readDesign(id)),
    readBenchLog: async () => unwrap(await api.readBenchLog()),
    appendBenchLog: async (request) => unwrap(await api.appendBenchLog(request)),
    correctBenchLog: async (request) => unwrap(await api.correctBenchLog(request)),
    renderReport: async (format) => unwrap(await api.renderReport(format)),
    pickCapture: async () => {
      const opened = unwrap(await api.openCaptureDialog());
      return opened && asOpenedFile(opened);
    },
    openDropped: async (file) => asOpenedFile(unwrap(await api.openDroppedFile(file))),
    pickDesign: async () => unwrap(await api.openDesignDialog()),
    saveFile: async (request) => unwrap(await api.saveFileDialog(request)),
    onMenuCommand: (listener) => api.onMenuCommand(listener),
    onCaptureOpened: (listener) => api.onCaptureOpened((opened) => listener(asOpenedFile(opened))),
  };
}

/** The bytes main read, as the worker takes them (an ArrayBuffer of just the file, transferable). */
function asOpenedFile(opened: OpenedCaptureFile): OpenedFile {
  const { bytes } = opened;
  return { name: opened.name, path: opened.path, sampleId: null, bytes: bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer };
}
