// The messages between `ringbench batch` and its worker processes: the batch's settings, a capture to measure,
// and its outcome (or the fault that ends a worker).

import type { BatchOutcome, BatchSettings } from './batchFile';

/** Measure the capture at `path` (shown as `file`), the `index`-th of the batch. */
export interface BatchRequest {
  index: number;
  path: string;
  file: string;
}

export interface BatchReply {
  index: number;
  outcome: BatchOutcome;
}

/** To a worker: the settings every capture shares (sent first, once), then one capture at a time. */
export type PoolMessage = { kind: 'settings'; batch: BatchSettings } | { kind: 'capture'; request: BatchRequest };

/** From a worker: a capture's outcome, or the error that is about to end it. */
export type WorkerMessage = { kind: 'reply'; reply: BatchReply } | { kind: 'fault'; text: string };
