// Messages between the window and the fit worker: plain data, arrays transferred, never a stack.

import type { ResponseFit } from '../core/fit/fitResponse';
import type { FitSummary } from '../core/report/fitSummary';
import type { Verdict } from '../core/circuit/verdict';
import type { Design } from '../core/circuit/design';

export interface ChannelInfo {
  name: string;
  unit: string;
  samples: number;
  dropped: number;
  clipped: number;
}

export interface CaptureInfo {
  channels: ChannelInfo[];
  sampleInterval: number | null;
  warnings: string[];
  rows: number;
}

/** The chosen channel's samples, for plotting and checks on the window side. */
export interface TraceData {
  name: string;
  unit: string;
  time: Float64Array;
  values: Float64Array;
  /** Times of the clipped samples (at an ADC rail, left out of the fit). */
  clippedTimes: Float64Array;
  /** Where the time axis has a gap of more than 1.5 sample intervals: dropped rows. */
  gapTimes: Float64Array;
  dropped: number;
}

export interface FitWindow {
  start?: number;
  end?: number;
}

export type WorkerRequest =
  | { id: number; type: 'open'; captureId: string; name: string; text: string; sampleInterval?: number }
  | { id: number; type: 'trace'; captureId: string; channel: number }
  | { id: number; type: 'fit'; captureId: string; channel: number; window: FitWindow }
  | { id: number; type: 'check'; captureId: string; channel: number; design: Design; fit: ResponseFit }
  | { id: number; type: 'fitText'; name: string; text: string; channel?: string };

export interface FitReply {
  /** Null when the fit could not be run (too few samples in the window, ...): fitError says why. */
  fit: ResponseFit | null;
  summary: FitSummary | null;
  fitError: string | null;
}

export type WorkerReplyValue =
  | { type: 'open'; info: CaptureInfo }
  | { type: 'trace'; trace: TraceData }
  | { type: 'fit'; result: FitReply }
  | { type: 'check'; verdict: Verdict }
  | { type: 'fitText'; fit: ResponseFit; sampleInterval: number | null };

export type WorkerMessage =
  | { id: number; kind: 'progress'; stage: string }
  | { id: number; kind: 'done'; value: WorkerReplyValue }
  | { id: number; kind: 'error'; message: string };
