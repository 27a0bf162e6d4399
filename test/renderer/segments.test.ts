// A file of repeated acquisitions: the worker reads the segment asked for, and says which one it holds.

import { describe, expect, it } from 'vitest';
import { segmentRead } from '../../renderer/traceData';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import { FILE_UNITS, type WorkerReplyValue } from '../../renderer/workerProtocol';
import { twoSegmentCapture } from '../e2e/generatedCaptures';

function openSegment(segment?: number) {
  const reply = handleWorkerRequest({ type: 'open', captureId: 'segments', name: 'two.csv', content: { text: twoSegmentCapture() }, reading: { units: FILE_UNITS, segment } }, () => undefined)
    .value as Extract<WorkerReplyValue, { type: 'open' }>;
  if (!reply.info) throw new Error(reply.refusal.message);
  return reply.info;
}

function firstValues(): Float64Array {
  const reply = handleWorkerRequest({ type: 'trace', captureId: 'segments', channel: 0 }, () => undefined).value as Extract<WorkerReplyValue, { type: 'trace' }>;
  return reply.trace.values;
}

describe('segments in the window', () => {
  it('reads the first segment by default and another when asked, naming the one read', () => {
    const first = openSegment();
    expect(first.import.segments).toHaveLength(2);
    expect(segmentRead(first)).toBe(1);
    const one = firstValues();
    const second = openSegment(2);
    expect(segmentRead(second)).toBe(2);
    const two = firstValues();
    // The second acquisition is the first at half the amplitude (to the 6 decimals it was written with).
    expect(two.length).toBe(one.length);
    for (let i = 0; i < one.length; i += 97) expect(two[i]).toBeCloseTo(one[i] / 2, 5);
  });
});
