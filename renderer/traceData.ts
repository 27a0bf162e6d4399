// What the worker tells the window about an opened capture: its channels, and one channel's samples to draw.

import type { Capture, Channel } from '../core/capture/types';
import type { CaptureInfo, TraceData } from './workerProtocol';

export function describeCapture(capture: Capture): CaptureInfo {
  return {
    channels: capture.channels.map((c) => ({
      name: c.name,
      unit: c.unit,
      samples: c.values.length,
      dropped: c.dropped,
      clipped: c.clipped.reduce((sum, flag) => sum + flag, 0),
    })),
    sampleInterval: capture.sampleInterval,
    warnings: capture.warnings,
    rows: capture.layout.rows,
    import: capture.importSummary,
  };
}

/** Copies of the channel for the window (the worker keeps its own for refits). */
export function traceData(channel: Channel, sampleInterval: number | null): TraceData {
  const { time, clipped } = channel;
  const clippedTimes: number[] = [];
  for (let i = 0; i < clipped.length; i++) if (clipped[i]) clippedTimes.push(time[i]);
  const gapTimes: number[] = [];
  if (time.length > 2) {
    const dt = sampleInterval ?? typicalInterval(time);
    for (let i = 1; i < time.length && gapTimes.length < 2000; i++) {
      if (time[i] - time[i - 1] > 1.5 * dt) gapTimes.push((time[i] + time[i - 1]) / 2);
    }
  }
  return {
    name: channel.name,
    unit: channel.unit,
    time: Float64Array.from(time),
    values: Float64Array.from(channel.values),
    clippedTimes: Float64Array.from(clippedTimes),
    gapTimes: Float64Array.from(gapTimes),
    dropped: channel.dropped,
  };
}

/** Median of the first intervals: a gap later on does not move it. */
function typicalInterval(time: Float64Array): number {
  const n = Math.min(time.length - 1, 1001);
  const steps = Array.from({ length: n }, (_, i) => time[i + 1] - time[i]).sort((a, b) => a - b);
  return steps[n >> 1];
}

/** The segment of a file of repeated acquisitions that the capture holds, 1-based (1 for a file of one). */
export function segmentRead(info: CaptureInfo): number {
  return info.import.segments.findIndex((segment) => segment.read) + 1 || 1;
}
