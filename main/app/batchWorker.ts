// Entry of a batch worker thread: measures each capture it is sent with the batch's use case and sends the outcome back.

import { parentPort, workerData } from 'node:worker_threads';
import { describeFailure } from '../../core/inputError';
import { measureBatchFile, type BatchSettings } from './batchFile';
import type { BatchReply, BatchRequest } from './batchProtocol';

const port = parentPort;
if (!port) throw new Error('batchWorker.ts runs as a worker thread of `ringbench batch`');
const batch = workerData as BatchSettings;

port.on('message', ({ index, path, file }: BatchRequest) => {
  const outcome = measureBatchFile(path, file, batch);
  try {
    port.postMessage({ index, outcome } satisfies BatchReply);
  } catch (error) {
    // An outcome that cannot be copied to the main thread is still this capture's line, not a lost one.
    port.postMessage({ index, outcome: { file, failure: { input: false, text: `its result could not be sent back: ${describeFailure(error).text}` } } } satisfies BatchReply);
  }
});
