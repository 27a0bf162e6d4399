// The fit worker: binds workerHandlers.ts to the worker's messages, off the window's thread.

import { plainMessage } from './plainMessage';
import { handleWorkerRequest } from './workerHandlers';
import type { WorkerMessage, WorkerRequest } from './workerProtocol';

const scope = self as unknown as { onmessage: ((event: MessageEvent<WorkerRequest>) => void) | null; postMessage(message: WorkerMessage, transfer?: Transferable[]): void };

scope.onmessage = (event) => {
  const request = event.data;
  const progress = (stage: string) => scope.postMessage({ id: request.id, kind: 'progress', stage });
  try {
    const { value, transfer } = handleWorkerRequest(request, progress);
    scope.postMessage({ id: request.id, kind: 'done', value }, transfer);
  } catch (error) {
    scope.postMessage({ id: request.id, kind: 'error', message: plainMessage(error) });
  }
};
