// Entry of a batch worker process: takes the batch's settings, then measures each capture it is sent with the
// batch's use case and sends the outcome back.

import { describeFailure } from '../../core/inputError';
import { measureBatchFile, type BatchSettings } from './batchFile';
import type { PoolMessage, WorkerMessage } from './batchProtocol';

const toPool = process.send?.bind(process);
if (!toPool) throw new Error('batchWorker runs as a worker process of `ringbench batch`');
const send = (message: WorkerMessage, sent?: () => void) => toPool(message, undefined, undefined, sent);

let batch: BatchSettings | null = null;
process.on('message', (message: PoolMessage) => {
  if (message.kind === 'settings') {
    batch = message.batch;
    return;
  }
  const { index, path, file } = message.request;
  if (!batch) throw new Error('a capture came before the batch settings');
  const outcome = measureBatchFile(path, file, batch);
  try {
    send({ kind: 'reply', reply: { index, outcome } });
  } catch (error) {
    // An outcome that cannot be copied to the pool is still this capture's line, not a lost one.
    send({ kind: 'reply', reply: { index, outcome: { file, failure: { input: false, text: `its result could not be sent back: ${describeFailure(error).text}` } } } });
  }
});
// A fault is told to the pool (which fails only the capture this worker held) before the worker ends.
process.on('uncaughtException', (error) => send({ kind: 'fault', text: error.message }, () => process.exit(1)));
// The pool is gone (it ended, or was killed): nothing is left to measure for.
process.on('disconnect', () => process.exit());
