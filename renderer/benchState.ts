// What the window shows at any moment: one plain object, re-rendered by every panel after each change.

import type { SetupCheck, SetupOptions } from '../core/circuit/setupTypes';
import type { ResponseFit } from '../core/fit/fitResponse';
import type { FitSummary } from '../core/report/fitSummary';
import type { Design } from '../core/circuit/design';
import type { Verdict } from '../core/circuit/verdict';
import type { CautionResult } from '../core/safety/evaluateCautions';
import type { Topology } from '../core/circuit/components';
import type { ParasiticsResult } from '../core/report/parasiticsText';
import type { Comparison } from '../core/report/comparisonText';
import type { BenchLogView, DesignEntry, OpenedFile, SampleEntry } from './bridgeTypes';
import { FILE_UNITS, type OverlayTrace, type CaptureInfo, type CaptureReading, type FitWindow, type ModeCurve, type TraceData, type UnitRefusal } from './workerProtocol';

export interface OpenCaptureState {
  /** Worker cache key. */
  key: string;
  opened: OpenedFile;
  info: CaptureInfo;
  channel: number;
  sample: SampleEntry | null;
  sha256: string;
  bytes: number;
  /** The probe's ratio (as typed) and sign per channel index, set in the capture panel; a channel without one is read as the file gives it. */
  probes?: Record<number, { ratioText: string; invert: boolean }>;
}

/** A capture the importer refused for a unit: shown with its one-line reason beside the unit choices that fix it. */
export interface RefusedCapture {
  opened: OpenedFile;
  refusal: UnitRefusal;
  sample: SampleEntry | null;
}

export interface ComponentsInput {
  topology: Topology;
  knownName: 'R' | 'L' | 'C';
  knownText: string;
  toleranceText: string;
}

/** R, L and C derived from the fit and the known part (deriveComponents); `known` as describeKnownPart writes it. */
export type ComponentsState = NonNullable<FitSummary['components']>;

export interface LoadedDesign {
  design: Design;
  /** Where it came from: a sample design id, a file name, or 'edited'. */
  name: string;
  path: string;
  text: string;
  sha256: string;
  /** A sample's own design goes with its sample; one the user opened or edited stays across captures. */
  origin: 'sample' | 'user';
}

export interface BenchState {
  face: 'window' | 'browser';
  samples: SampleEntry[];
  designs: DesignEntry[];
  capture: OpenCaptureState | null;
  /** The capture last chosen, when it could not be read for a unit (then `capture` is null). */
  refused: RefusedCapture | null;
  /** How the capture shown (or refused) was asked to be read: the units stated (the file's own by default) and the segment. */
  reading: CaptureReading;
  trace: TraceData | null;
  fit: ResponseFit | null;
  summary: FitSummary | null;
  /** Fits completed since the window opened (lets a watcher see that a refit has landed). */
  fitCount: number;
  /** Why there is no fit for the capture shown, in plain words. */
  fitError: string | null;
  /** Event time found by the automatic fit: where the design's prediction is placed (a typed window moves t0). */
  eventTime: number | null;
  /** The window the user set by dragging or typing; empty for the automatic one. */
  userWindow: FitWindow;
  /** The event the user chose to fit in a record holding several (1-based); null for the default one. */
  chosenEvent: number | null;
  /** How many ringing modes the user asked the fit for; null to let the data choose. Forgotten with the capture. */
  modesAsked: number | null;
  /** The ringing mode R, L and C are derived for (1-based); null for the dominant one. Forgotten with the capture. */
  chosenMode: number | null;
  /** Each mode's contribution at every sample of the fit shown, from the worker; empty when one ring is the whole fit. */
  modeCurves: ModeCurve[];
  componentsInput: ComponentsInput;
  /** Where the known part came from: the sample list's entry for the capture, typed by the user, or none stated. */
  knownPartFrom: 'sample' | 'typed' | null;
  components: ComponentsState | null;
  componentsError: string | null;
  design: LoadedDesign | null;
  designError: string | null;
  verdict: Verdict | null;
  verdictError: string | null;
  cautions: CautionResult | null;
  /** Can this capture support the answer (setupChecks.ts), from the last measurement; empty without one. */
  setupChecks: SetupCheck[];
  /** What was stated about the scope and probe in the fit panel; every measurement carries it to the setup checks. */
  setupOptions: SetupOptions;
  extraction: ParasiticsResult | null;
  extractionError: string | null;
  /** The probe capacitance the extraction was run with, F: its line of 1/f0² against the added C is offset by it. */
  extractionProbeC: number;
  comparison: Comparison | null;
  /** The two compared channels as read, for the overlay plot; null without a comparison. */
  comparisonOverlay: { before: OverlayTrace; after: OverlayTrace } | null;
  comparisonError: string | null;
  log: BenchLogView | null;
  logError: string | null;
  logMessage: string | null;
  /** What the last copy put on the clipboard, said beside the copy buttons. */
  copied: string | null;
  /** What is running, for the progress line; null when idle. */
  busy: string | null;
  /** A failure to show in plain words (dismissable). */
  error: string | null;
}

export function initialState(face: 'window' | 'browser'): BenchState {
  return {
    face,
    samples: [],
    designs: [],
    capture: null,
    refused: null,
    reading: { units: FILE_UNITS },
    trace: null,
    fit: null,
    summary: null,
    fitCount: 0,
    fitError: null,
    eventTime: null,
    userWindow: {},
    chosenEvent: null,
    modesAsked: null,
    chosenMode: null,
    modeCurves: [],
    componentsInput: { topology: 'series', knownName: 'C', knownText: '', toleranceText: '' },
    knownPartFrom: null,
    components: null,
    componentsError: null,
    design: null,
    designError: null,
    verdict: null,
    verdictError: null,
    cautions: null,
    setupChecks: [],
    setupOptions: {},
    extraction: null,
    extractionError: null,
    extractionProbeC: 0,
    comparison: null,
    comparisonOverlay: null,
    comparisonError: null,
    log: null,
    logError: null,
    logMessage: null,
    copied: null,
    busy: null,
    error: null,
  };
}
