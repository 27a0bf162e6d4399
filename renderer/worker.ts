// The fit worker: reads captures and runs fits and design checks with core/, off the window's thread.

import { parseCapture } from '../core/capture/parseCapture';
import { selectChannel } from '../core/capture/selectChannel';
import type { Capture, Channel } from '../core/capture/types';
import { fitResponse } from '../core/fit/fitResponse';
import { summarizeFit } from '../core/report/fitSummary';
import { checkDesign } from '../core/circuit/verdict';
import { plainMessage } from './plainMessage';
import type { CaptureInfo, TraceData, WorkerMessage, WorkerReplyValue, WorkerRequest } from './workerProtocol';

/** Captures kept parsed for refits, newest last. */
const captures = new Map<string, { name: string; capture: Capture }>();
const KEEP = 4;

const scope = self as unknown as { onmessage: ((event: MessageEvent<WorkerRequest>) => void) | null; postMessage(message: WorkerMessage, transfer?: Transferable[]): void };

scope.onmessage = (event) => {
  const request = event.data;
  try {
    const [value, transfer] = handle(request);
    scope.postMessage({ id: request.id, kind: 'done', value }, transfer);
  } catch (error) {
    scope.postMessage({ id: request.id, kind: 'error', message: plainMessage(error) });
  }
};

function progress(id: number, stage: string): void {
  scope.postMessage({ id, kind: 'progress', stage });
}

function handle(request: WorkerRequest): [WorkerReplyValue, Transferable[]] {
  switch (request.type) {
    case 'open': {
      progress(request.id, 'reading the capture');
      const capture = parseCapture(request.text, { sampleInterval: request.sampleInterval });
      captures.delete(request.captureId);
      captures.set(request.captureId, { name: request.name, capture });
      while (captures.size > KEEP) captures.delete(captures.keys().next().value as string);
      return [{ type: 'open', info: describeCapture(capture) }, []];
    }
    case 'trace': {
      const { capture } = captureOf(request.captureId);
      const trace = traceData(channelOf(capture, request.channel), capture.sampleInterval);
      return [{ type: 'trace', trace }, [trace.time.buffer, trace.values.buffer, trace.clippedTimes.buffer, trace.gapTimes.buffer]];
    }
    case 'fit': {
      const { name, capture } = captureOf(request.captureId);
      const channel = channelOf(capture, request.channel);
      progress(request.id, `fitting ${channel.values.length.toLocaleString('en')} samples`);
      try {
        const fit = fitResponse(traceOf(channel), { window: request.window });
        const summary = summarizeFit(name, channel.name, fit, undefined, capture.warnings);
        return [{ type: 'fit', result: { fit, summary, fitError: null } }, []];
      } catch (error) {
        // The samples are still shown; the window says why there is no fit.
        return [{ type: 'fit', result: { fit: null, summary: null, fitError: plainMessage(error) } }, []];
      }
    }
    case 'check': {
      const { capture } = captureOf(request.captureId);
      const channel = channelOf(capture, request.channel);
      progress(request.id, 'checking against the design');
      return [{ type: 'check', verdict: checkDesign(request.design, request.fit, { time: channel.time, values: channel.values }) }, []];
    }
    case 'fitText': {
      progress(request.id, `reading ${request.name}`);
      const capture = parseCapture(request.text);
      const channel = selectChannel(capture, request.channel);
      progress(request.id, `fitting ${request.name}`);
      return [{ type: 'fitText', fit: fitResponse(traceOf(channel)), sampleInterval: capture.sampleInterval }, []];
    }
  }
}

function captureOf(id: string): { name: string; capture: Capture } {
  const entry = captures.get(id);
  if (!entry) throw new Error('the capture is no longer open; open it again');
  return entry;
}

function channelOf(capture: Capture, index: number): Channel {
  const channel = capture.channels[index];
  if (!channel) throw new Error(`the capture has no channel ${index + 1}`);
  return channel;
}

function traceOf(channel: Channel) {
  return { time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name };
}

function describeCapture(capture: Capture): CaptureInfo {
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
  };
}

/** Copies of the channel for the window (the worker keeps its own for refits). */
function traceData(channel: Channel, sampleInterval: number | null): TraceData {
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
