// Messages between the window and the fit worker: plain data, arrays transferred, never a stack.

import type { ImportSummary } from '../core/capture/importSummary';
import type { CapacitorDerating } from '../core/circuit/addedCapacitor';
import type { Quantity } from '../core/quantity';
import type { Design } from '../core/circuit/design';
import type { Verdict } from '../core/circuit/verdict';
import type { FitSummary } from '../core/report/fitSummary';
import type { ParasiticsResult } from '../core/report/parasiticsText';
import type { Comparison } from '../core/report/comparisonText';
import type { FitWindow, MeasureResult } from '../core/workflow/measure';
import type { KnownPartRequest } from '../core/workflow/measuredComponents';
import type { ProbeScaling } from '../core/workflow/probeScaling';
import type { SetupCheck, SetupOptions } from '../core/circuit/setupTypes';

export type { FitWindow } from '../core/workflow/measure';

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
  /** What the importer inferred, shown in the capture panel. */
  import: ImportSummary;
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

/** One side of a before / after comparison, reduced for the overlay plot (the samples as read, the fit's t0 in the comparison). */
export interface OverlayTrace {
  time: Float64Array;
  values: Float64Array;
  unit: string;
}

/** Units the user states for a capture whose file does not state them, or states them wrongly: as typed ('us', 'mV'); '' keeps the file's. */
export interface StatedUnits {
  timeUnit: string;
  valueUnit: string;
}

/** The file's own units: nothing stated. */
export const FILE_UNITS: StatedUnits = { timeUnit: '', valueUnit: '' };

/**
 * How the user asks a capture file to be read: the units stated, which segment of repeated acquisitions (1-based),
 * and the sample interval stated (as typed, '2n'; it builds the time axis as --sample-interval does).
 */
export interface CaptureReading {
  units: StatedUnits;
  /** Default: the first. */
  segment?: number;
  /** Default: the file's own time axis. */
  sampleInterval?: string;
}

/** Why a capture could not be read as written, when stating its time or value unit can fix it. */
export interface UnitRefusal {
  /** The choice that fixes it: the time or value unit, or the sample interval. */
  unit: 'time' | 'value' | 'interval';
  /** One line naming the column or line and the unit as written. */
  message: string;
}

/** A capture file's content: its bytes as written (the importer finds the encoding), or text main has already decoded. */
export type CaptureContent = { text: string; bytes?: undefined } | { bytes: ArrayBuffer; text?: undefined };

/** Just the content of a file (or of anything that carries one), to send to the worker without its other fields. */
export function contentOf(file: CaptureContent): CaptureContent {
  return file.bytes ? { bytes: file.bytes } : { text: file.text };
}

/** A capture file as the user chose it (a sample or a file), not kept open in the worker. */
export type CaptureFile = { name: string } & CaptureContent;

/** The added-capacitor run as the window asks for it: typed values already read (SI units, relative tolerances). */
export interface ParasiticsAsk {
  captures: (CaptureFile & { addedC: number; derating?: CapacitorDerating })[];
  addedTolerance: number;
  dcBias?: CapacitorDerating;
  switchC?: { value: number; tolerance?: number };
  /** A turn-on edge to cross-check L_p on: the file, its current channel, and the switch voltage channel or the plateau. */
  edge?: ParasiticsEdgeAsk;
  probeC?: number;
  probeCTolerance?: number;
  bandwidth?: number;
  voltage?: number;
  switchingFrequency?: number;
}

export interface ParasiticsEdgeAsk {
  file: CaptureFile;
  /** Default: the first channel. */
  currentChannel?: string | number;
  voltageChannel?: string | number;
  plateau?: Quantity;
}

export type WorkerRequest =
  | { id: number; type: 'open'; captureId: string; name: string; content: CaptureContent; sampleInterval?: number; reading?: CaptureReading }
  | { id: number; type: 'trace'; captureId: string; channel: number }
  /** The probe's ratio and sign for one channel of an open capture: its trace, fits and checks use the scaled values from then on. */
  | { id: number; type: 'probe'; captureId: string; channel: number; probe: ProbeScaling }
  | {
      id: number;
      type: 'measure';
      captureId: string;
      channel: number;
      window: FitWindow;
      knownPart?: KnownPartRequest;
      design?: Design;
      /** What was stated about the scope and probe, for the setup checks. Default: nothing stated. */
      setup?: SetupOptions;
      /** Where the design's prediction starts when the window was set by hand, s. */
      eventTime?: number;
      /** Which event of a record holding several to fit, 1-based. Default: the first complete one. */
      event?: number;
      /** How many ringing modes to fit. Default: chosen from the data. */
      modes?: number;
      /** The ringing mode R, L and C are derived for (and the design checks), 1-based. Default: the dominant one. */
      mode?: number;
    }
  | { id: number; type: 'check'; captureId: string; channel: number; design: Design; fit: FitSummary; setupChecks: SetupCheck[]; eventTime?: number }
  | ({ id: number; type: 'parasitics' } & ParasiticsAsk)
  | { id: number; type: 'compare'; before: CaptureFile; after: CaptureFile; channel?: string | number; knownPart?: KnownPartRequest };

/** A request before the client numbers it (Omit distributed over the variants, so each keeps its fields). */
export type WorkerAsk = WithoutId<WorkerRequest>;
type WithoutId<T> = T extends unknown ? Omit<T, 'id'> : never;

/** Beside a fit: why the design gave no verdict (it probes another unit, ...) and why the known part gave no components. */
interface SideErrors {
  verdictError: string | null;
  componentsError: string | null;
}

/**
 * Each ringing mode's (and the slow term's) contribution at every sample of the channel, zero before t0
 * (modeContributions): given when the fit has several modes or a slow term, empty otherwise.
 */
export interface ModeCurve {
  label: string;
  values: Float64Array;
}

/** A measurement with what failed beside its fit, or why the capture could not be fitted (too few samples in the window, ...). */
/** A measurement as the window receives it: its problems arrive as words in the side errors. */
export type MeasuredInWindow = Omit<MeasureResult, 'problems'>;
export type MeasureReply = ({ result: MeasuredInWindow; fitError: null } | { result: null; fitError: string }) & SideErrors & { modeCurves: ModeCurve[] };

export type WorkerReplyValue =
  | { type: 'open'; info: CaptureInfo; refusal: null }
  | { type: 'open'; info: null; refusal: UnitRefusal }
  | { type: 'trace'; trace: TraceData }
  | { type: 'probe' }
  | { type: 'measure'; reply: MeasureReply }
  | { type: 'check'; verdict: Verdict | null; verdictError: string | null }
  | { type: 'parasitics'; result: ParasiticsResult }
  | { type: 'compare'; comparison: Comparison; overlay: { before: OverlayTrace; after: OverlayTrace } };

export type WorkerMessage =
  | { id: number; kind: 'progress'; stage: string }
  | { id: number; kind: 'done'; value: WorkerReplyValue }
  | { id: number; kind: 'error'; message: string };
