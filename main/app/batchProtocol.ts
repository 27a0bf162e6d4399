// The messages between `ringbench batch` and its worker threads: a capture to measure, and its outcome.

import type { BatchOutcome } from './batchFile';

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
