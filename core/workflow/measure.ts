// Measuring one capture: the response fit, R, L and C from a known part, the design verdict and the
// cautions from the samples. Every face (command line, bench log, batch, the window's worker) calls this.

import type { ImportSummary } from '../capture/importSummary';
import type { Channel } from '../capture/types';
import type { Design } from '../circuit/design';
import { implausibility } from '../circuit/plausibility';
import { probeUnit } from '../circuit/predict';
import { hertz } from '../report/resultRows';
import { summarizeTransitions } from '../circuit/transitionSummary';
import { checkDesign, singleDecayRefusal, undecidedByCapture, type Verdict } from '../circuit/verdict';
import { fitResponse, type ResponseFit, type ResponseFitOptions } from '../fit/fitResponse';
import { isThinSamplingWarning } from '../fit/fitWarnings';
import { InputError, UsageError } from '../inputError';
import { eventTimeOf, fitSucceeded, summarizeFit, type FitSummary } from '../report/fitSummary';
import { cautionInputsFromCapture, type CautionComponents } from '../safety/cautionInputs';
import { evaluateCautions, type CautionResult } from '../safety/evaluateCautions';
import { deriveComponents, ratesOfMode, type KnownPartRequest } from './measuredComponents';
import { fitEvents } from './events';
import { varyingChannelsNote } from './flatChannel';
import { withoutSpikes } from './spikeFree';
import { runSetupChecks, setupRefusal, type SetupCheck, type SetupOptions } from './setupChecks';

/** A fit window, s; an edge left out is found from the data. */
export interface FitWindow {
  start?: number;
  end?: number;
}

export interface MeasureRequest {
  /** The capture preamble's key/value pairs (a stated bandwidth, an acquisition mode), for the setup checks. */
  metadata?: Readonly<Record<string, string>>;
  /** What the person states about the scope and probe, for the setup checks. */
  setup?: SetupOptions;
  /** The capture's name as people see it (a file name without its folder). */
  file: string;
  channel: Channel;
  /** The capture's other channels: a flat channel's message names those that vary. */
  otherChannels?: readonly Pick<Channel, 'name' | 'values' | 'unreadUnit'>[];
  /** Warnings of the import (dropped rows, clipping...), shown before the fit's own. */
  captureWarnings?: readonly string[];
  /** What the importer inferred from the capture, carried on the summary as its `import` field. */
  importSummary?: ImportSummary;
  window?: FitWindow;
  /** Derive R, L and C from a known part; not with a design, which states all three. */
  knownPart?: KnownPartRequest;
  design?: Design;
  /** The event time to place the design's prediction at when the window was set by hand, s. Default: the fit's t0. */
  eventTime?: number;
  /** Which event of a record holding several to measure, 1-based (see fitEvents). Default: the first complete one. */
  event?: number;
  /** Whether the measured quantity may jump at the event (see ResponseFitOptions). Default: found from the data. */
  continuity?: ResponseFitOptions['continuity'];
  /** How many ringing modes to fit (see ResponseFitOptions). Default: chosen from the data. */
  modes?: number;
  /** The ringing mode R, L and C are derived for and a design is checked against, 1-based. Default: the dominant one (1). */
  mode?: number;
}

export interface MeasureResult {
  fit: ResponseFit;
  summary: FitSummary;
  verdict: Verdict | null;
  cautions: CautionResult;
  /**
   * Why the verdict or the components could not be given for this capture (a design probing another
   * unit, a known part the fit cannot use): the fit and the cautions stand. The command line refuses the
   * input with them; the window shows each beside the fit.
   */
  problems: { verdict: InputError | null; components: InputError | null };
  /** Can this capture support the answer (setupChecks.ts): a refusal makes the command line exit 1. */
  setupChecks: SetupCheck[];
}

/** Fit the channel and summarize the fit with its transition metrics; a window with too few samples is a FitInputError. */
export function fitChannel(file: string, raw: Channel, window: FitWindow = {}, captureWarnings: readonly string[] = []): { fit: ResponseFit; summary: FitSummary } {
  const { channel, warning } = withoutSpikes(raw);
  const fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name }, { window });
  const summary = summarizeFit(file, channel.name, fit, undefined, warning ? [...captureWarnings, warning] : [...captureWarnings]);
  summary.transitions = summarizeTransitions(channel, fit);
  return { fit, summary };
}

/**
 * The cautions for the samples of a channel: its peak |V| or |I|, with the design's parts when there
 * is a design (what the board is built to), else the parts derived from the fit.
 */
export function weighCautions(channel: Pick<Channel, 'values' | 'unit'>, parts: { design?: Design | null; components?: CautionComponents | null }): CautionResult {
  const { design, components } = parts;
  const stored = design ? { C: design.components.C.value, L: design.components.L.value } : { C: components?.C, L: components?.L };
  return evaluateCautions(cautionInputsFromCapture(channel.values, channel.unit, stored));
}

/**
 * Why a fit gets no verdict against a design, or null when it gets one: a failed fit is no measurement
 * (fitSucceeded), a capture a setup check refuses cannot support the numbers the verdict would judge (an
 * aliased frequency, a damping that is not measured), a single decay does not compare with a design that
 * rings (singleDecayRefusal), and a limit the design states may be one this capture does not decide
 * (undecidedByCapture). Not bad input: the command line says it in place of the verdict and exits 1.
 */
export function verdictRefusal(
  design: Design,
  fit: Pick<FitSummary, 'status' | 'tau' | 'alpha' | 'omega0' | 'transitions'>,
  setupChecks: readonly SetupCheck[],
): string | null {
  if (!fitSucceeded(fit)) return `the fit failed (${fit.status}), so nothing was checked against '${design.name}'`;
  const refused = setupRefusal(setupChecks);
  if (refused) return `a setup check refused the capture (${refused.message}), so nothing was checked against '${design.name}'`;
  return singleDecayRefusal(design, fit) ?? undecidedByCapture(design, fit);
}

/**
 * Why the design cannot be checked against this channel whatever the fit: it probes another unit (a design of the
 * inductor current against a voltage channel). Asked before verdictRefusal: the wrong file or design is bad input
 * (exit 2), not a capture that gets no verdict. Null when the units agree or the channel states none.
 */
export function probeMismatch(design: Design, channel: Channel, file: string): string | null {
  const expected = probeUnit(design);
  if (channel.unit === '' || channel.unit === expected) return null;
  return `the design probes ${design.probe} (${expected}) but channel '${channel.name}' of ${file} is in ${channel.unit}`;
}

/**
 * The verdict of a measured channel against a design. A design probing another unit than the channel (probeMismatch),
 * or a fit that gets no verdict (verdictRefusal: measureCapture asks only when it gets one), is a UsageError.
 */
export function checkAgainstDesign(
  design: Design,
  fit: ResponseFit | FitSummary,
  setupChecks: readonly SetupCheck[],
  channel: Channel,
  file: string,
  eventTime?: number,
): Verdict {
  const mismatch = probeMismatch(design, channel, file);
  if (mismatch) throw new UsageError(mismatch);
  const refusal = verdictRefusal(design, fit, setupChecks);
  if (refusal) throw new UsageError(refusal);
  // An event's fit starts inside its ring (no level before it): the design's levels and event time need a whole event.
  if ('events' in fit && fit.events) {
    throw new UsageError(`${file} holds ${fit.events.list.length} events: a design is checked against one; set the fit window (--from, --to) around it`);
  }
  const t0 = eventTime === undefined ? fit.t0 : { ...fit.t0, value: eventTime };
  return checkDesign(design, { ...fit, t0, eventTimeUnknown: eventTime === undefined && eventTimeOf(fit) === null }, { time: channel.time, values: channel.values });
}

/** An implausible result (a misread unit, the wrong known part) says so as the first warning. */
function warnIfImplausible(summary: FitSummary, channel: Channel): void {
  if (summary.status === 'failed') return;
  const n = channel.time.length;
  const doubt = implausibility({ f0: hertz(summary.omega0).value, recordSpan: n > 1 ? channel.time[n - 1] - channel.time[0] : 0, components: summary.components });
  if (doubt) summary.warnings.unshift(doubt);
}

/**
 * One capture measured: fit, components, verdict and cautions. A design gives the verdict and the parts
 * the cautions weigh; a known part gives R, L and C from the fit (shown beside a design too). Only a
 * fit that cannot run throws; a bad design or known part for this capture is a problem in the result.
 */
export function measureCapture(request: MeasureRequest): MeasureResult {
  // The fit and what is judged from it read the channel without its isolated spikes; the cautions read every sample.
  const { channel, warning } = withoutSpikes(request.channel);
  const { fit, summary } = fitEvents(warning ? { ...request, channel, captureWarnings: [...(request.captureWarnings ?? []), warning] } : request);
  if (request.importSummary) summary.import = request.importSummary;
  const elsewhere = summary.status === 'no-response' ? varyingChannelsNote(request.channel, request.otherChannels ?? []) : null;
  if (elsewhere) summary.message += elsewhere;
  const { knownPart, design } = request;
  const components = knownPart ? attempt(() => deriveComponents(fit, knownPart, request.mode)) : NOT_ASKED;
  if (components.value) summary.components = components.value;
  warnIfImplausible(summary, channel);
  const setupChecks = runSetupChecks({ fit, summary, channel, metadata: request.metadata, options: request.setup, knownPart });
  // A design of another unit is bad input before anything else; a capture that gets no verdict is not asked for one.
  const mismatch = design ? probeMismatch(design, request.channel, request.file) : null;
  const verdict =
    design && (mismatch !== null || verdictRefusal(design, summary, setupChecks) === null)
      ? attempt(() => checkAgainstDesign(design, ofMode(summary, request.mode), setupChecks, channel, request.file, request.eventTime))
      : NOT_ASKED;
  const cautions = weighCautions(request.channel, { design, components: summary.components });
  // The setup check says it with its level (warning or refusal): the fit's own line would repeat it.
  if (setupChecks.some((check) => check.id === 'samples-per-period')) summary.warnings = summary.warnings.filter((w) => !isThinSamplingWarning(w));
  return { fit, summary, verdict: verdict.value, cautions, problems: { verdict: verdict.error, components: components.error }, setupChecks };
}

/**
 * The summary with the rates of ringing mode `mode` (1-based) at its top level, for a design to check (the dominant
 * mode's are there already); a mode beyond those fitted is a UsageError.
 */
export function ofMode(summary: FitSummary, mode = 1): FitSummary {
  if (mode === 1) return summary;
  ratesOfMode(summary, mode); // refuses a mode beyond those fitted
  const { alpha, omega0, omegaD, zeta, Q } = summary.modes![mode - 1];
  return { ...summary, alpha, omega0, ...(omegaD ? { omegaD } : { omegaD: undefined }), zeta, Q };
}

interface Attempt<T> {
  value: T | null;
  error: InputError | null;
}

const NOT_ASKED: Attempt<never> = { value: null, error: null };

/** Bad input to one part becomes that part's problem; anything else is a fault and goes on up. */
function attempt<T>(run: () => T): Attempt<T> {
  try {
    return { value: run(), error: null };
  } catch (error) {
    if (error instanceof InputError) return { value: null, error };
    throw error;
  }
}
