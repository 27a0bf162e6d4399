// A real batch worker process (started from source through tsx): it measures a capture exactly as this thread
// does, and one ended by a signal is reported by the signal's name.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureBatchFile, type BatchSettings } from '../../main/app/batchFile';
import type { BatchReply } from '../../main/app/batchProtocol';
import { startBatchWorker } from '../../main/app/batchWorkerStart';

const BATCH: BatchSettings = { settings: {}, cwd: '/', design: null, logging: null };
const CAPTURE = join(__dirname, '..', '..', 'sample-captures', 'switch-node-before.csv');

describe('batch worker process', () => {
  it.each([false, true])('measures a capture as this thread does (every core taken: %s)', async (allCores) => {
    const worker = startBatchWorker(BATCH, allCores);
    const reply = await new Promise<BatchReply>((resolve, reject) => {
      worker.on('message', resolve);
      worker.on('error', reject);
      worker.postMessage({ index: 4, path: CAPTURE, file: 'switch-node-before.csv' });
    });
    worker.terminate();
    expect(reply.index).toBe(4);
    expect(reply.outcome).toEqual(measureBatchFile(CAPTURE, 'switch-node-before.csv', BATCH));
  });

  it('reports a worker ended by a signal by its name', async () => {
    const worker = startBatchWorker(BATCH, false);
    const ended = new Promise((resolve) => worker.on('exit', resolve));
    worker.terminate();
    expect(await ended).toBe('SIGTERM');
  });
});
