// Measures the captures of a batch on worker processes (or, with one job, in this thread) and hands each
// outcome over as it finishes; every capture gets exactly one outcome, even when its worker dies.

import { availableParallelism } from 'node:os';
import { measureBatchFile, type BatchOutcome, type BatchSettings } from './batchFile';
import type { BatchReply } from './batchProtocol';
import { startBatchWorker, type BatchWorker } from './batchWorkerStart';

/** One capture of the batch: its path, and its name as shown (relative to the folder). */
export interface BatchCapture {
  path: string;
  file: string;
}

/**
 * Measure every capture with `jobs` threads at once (1, or a single capture: in this thread, no worker); `onOutcome` is called
 * once per capture, in completion order, with the capture's index in `captures`. A handler that throws ends the batch.
 * `startWorker` starts one worker (default: a process running main/app/batchWorker.ts), told whether the batch's
 * workers take every core of this machine.
 */
export async function measureBatch(
  captures: readonly BatchCapture[],
  batch: BatchSettings,
  jobs: number,
  onOutcome: (index: number, outcome: BatchOutcome) => void,
  startWorker: (batch: BatchSettings, allCores: boolean) => BatchWorker = startBatchWorker,
): Promise<void> {
  // A worker of its own only pays when two captures or more can be fitted at once.
  const threads = Math.min(jobs, captures.length);
  if (threads <= 1) {
    captures.forEach(({ path, file }, index) => onOutcome(index, measureBatchFile(path, file, batch)));
  } else {
    await runOnWorkers(captures, batch, threads, onOutcome, startWorker);
  }
}

function runOnWorkers(
  captures: readonly BatchCapture[],
  batch: BatchSettings,
  threads: number,
  finish: (index: number, outcome: BatchOutcome) => void,
  startWorker: (batch: BatchSettings, allCores: boolean) => BatchWorker,
): Promise<void> {
  return new Promise((resolve, reject) => {
    let next = 0;
    let done = 0;
    let running = 0;
    let failed = false;
    const workers = new Set<BatchWorker>();
    const abort = (error: unknown) => {
      failed = true;
      for (const w of workers) void w.terminate();
      reject(error);
    };
    // A caller's handler that throws ends the batch with its error (nothing else is measured).
    const settle = (index: number, outcome: BatchOutcome): boolean => {
      try {
        finish(index, outcome);
        return true;
      } catch (error) {
        abort(error);
        return false;
      }
    };

    const allCores = threads >= availableParallelism();
    const launch = () => {
      let worker: BatchWorker;
      try {
        worker = startWorker(batch, allCores);
      } catch (error) {
        abort(error);
        return;
      }
      workers.add(worker);
      running += 1;
      let current: number | null = null;
      let stopped = false;
      const feed = () => {
        if (failed || next >= captures.length) {
          current = null;
          void worker.terminate();
          return;
        }
        current = next++;
        worker.postMessage({ index: current, ...captures[current] });
      };
      // A worker that dies (a crash, memory exhausted, killed) fails only the capture it held; a new one takes the rest.
      const stop = (why: string) => {
        if (stopped) return;
        stopped = true;
        running -= 1;
        workers.delete(worker);
        if (current !== null && !failed) {
          const index = current;
          current = null;
          done += 1;
          if (!settle(index, { file: captures[index].file, failure: { input: false, text: `the worker measuring it stopped: ${why}` } })) return;
          if (next < captures.length) launch();
        }
        if (done === captures.length && running === 0) resolve();
      };
      worker.on('message', ({ index, outcome }: BatchReply) => {
        if (index !== current || failed) return;
        done += 1;
        if (settle(index, outcome)) feed();
      });
      worker.on('error', (error) => stop(error.message));
      worker.on('exit', (code) => stop(typeof code === 'number' ? `exit code ${code}` : `ended by ${code}`));
      feed();
    };

    for (let w = 0; w < threads; w += 1) launch();
  });
}
