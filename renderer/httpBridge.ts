// The bridge of the browser bench: the bench API over loopback HTTP with the launch token.

import { BenchError, unwrap } from './benchError';
import { chooseFile, downloadFile, readFileBytes, readFileText } from './browserFiles';
import type { ApiResult, Bridge, OpenedFile } from './bridgeTypes';

export function createHttpBridge(token: string, captureInput: HTMLInputElement, designInput: HTMLInputElement): Bridge {
  async function call<T>(method: string, ...args: unknown[]): Promise<T> {
    let response: Response;
    try {
      response = await fetch(`api/${method}`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-Ringbench-Token': token },
        body: JSON.stringify({ args }),
      });
    } catch {
      throw new BenchError('the bench server does not answer; is `ringbench serve` still running?');
    }
    if (response.status === 401) throw new BenchError('the bench server refused this page: open the address it printed, with its token');
    let result: ApiResult<T>;
    try {
      result = (await response.json()) as ApiResult<T>;
    } catch {
      throw new BenchError(`the bench server answered ${response.status} without a result`);
    }
    return unwrap(result);
  }
  const upload = async (file: File): Promise<OpenedFile> => ({ ...(await readFileBytes(file)), path: null, sampleId: null });
  return {
    face: 'browser',
    listSamples: () => call('listSamples'),
    readSample: (id) => call('readSample', id),
    listDesigns: () => call('listDesigns'),
    readDesign: (id) => call('readDesign', id),
    readBenchLog: () => call('readBenchLog'),
    appendBenchLog: (request) => call('appendBenchLog', request),
    correctBenchLog: (request) => call('correctBenchLog', request),
    renderReport: (format) => call('renderReport', format),
    pickCapture: async () => {
      const file = await chooseFile(captureInput);
      return file ? upload(file) : null;
    },
    openDropped: upload,
    pickDesign: async () => {
      const file = await chooseFile(designInput);
      return file ? readFileText(file) : null;
    },
    saveFile: async (request, mime) => {
      downloadFile(request.suggestedName, request.content, request.encoding, mime);
      return null;
    },
    onMenuCommand: () => undefined,
    onCaptureOpened: () => undefined,
  };
}
