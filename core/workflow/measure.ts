// Measuring one capture: the response fit, R, L and C from a known part, the design verdict and the
// cautions from the samples. Every face (command line, bench log, batch, the window's worker) calls this.

import type { Channel } from '../capture/types';
import type { Design } from '../circuit/design';
import { probeUnit } from '../circuit/predict';
import { summarizeTransitions } from '../circuit/transitionSummary';
import { checkDesign, type Verdict } from '../circuit/verdict';
import { fitResponse, type ResponseFit } from '../fit/fitResponse';
import { UsageError } from '../inputError';
import { summarizeFit, type FitSummary } from '../report/fitSummary';
import { cautionInputsFromCapture, type CautionComponents } from '../safety/cautionInputs';
import { evaluateCautions, type CautionResult } from '../safety/evaluateCautions';
import { deriveComponents, type KnownPartRequest } from './measuredComponents';

/** A fit window, s; an edge left out is found from the data. */
export interface FitWindow {
  start?: number;
  end?: number;
}

export interface MeasureRequest {
  /** The capture's name as people see it (a file name without its folder). */
  file: string;
  channel: Channel;
  /** Warnings of the import (dropped rows, clipping...), shown before the fit's own. */
  captureWarnings?: readonly string[];
  window?: FitWindow;
  /** Derive R, L and C from a known part; not with a design, which states all three. */
  knownPart?: KnownPartRequest;
  design?: Design;
  /** The event time to place the design's prediction at when the window was set by hand, s. Default: the fit's t0. */
  eventTime?: number;
}

export interface MeasureResult {
  fit: ResponseFit;
  summary: FitSummary;
  verdict: Verdict | null;
  cautions: CautionResult;
}

/** Fit the channel and summarize the fit with its transition metrics; a window with too few samples is a FitInputError. */
export function fitChannel(file: string, channel: Channel, window: FitWindow = {}, captureWarnings: readonly string[] = []): { fit: ResponseFit; summary: FitSummary } {
  const fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name }, { window });
  const summary = summarizeFit(file, channel.name, fit, undefined, [...captureWarnings]);
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

/** The verdict of a measured channel against a design; a design probing another unit than the channel is a UsageError. */
export function checkAgainstDesign(design: Design, fit: ResponseFit | FitSummary, channel: Channel, file: string, eventTime?: number): Verdict {
  const expected = probeUnit(design);
  if (channel.unit !== '' && channel.unit !== expected) {
    throw new UsageError(`the design probes ${design.probe} (${expected}) but channel '${channel.name}' of ${file} is in ${channel.unit}`);
  }
  const t0 = eventTime === undefined ? fit.t0 : { ...fit.t0, value: eventTime };
  return checkDesign(design, { ...fit, t0 }, { time: channel.time, values: channel.values });
}

/** One capture measured: fit, components, verdict and cautions. */
export function measureCapture(request: MeasureRequest): MeasureResult {
  if (request.design && request.knownPart) {
    throw new UsageError('a design gives the topology and components: leave out the topology and the known part');
  }
  const { fit, summary } = fitChannel(request.file, request.channel, request.window, request.captureWarnings);
  if (request.knownPart) summary.components = deriveComponents(fit, request.knownPart);
  const verdict =
    request.design && summary.status !== 'failed' ? checkAgainstDesign(request.design, summary, request.channel, request.file, request.eventTime) : null;
  const cautions = weighCautions(request.channel, { design: request.design, components: summary.components });
  return { fit, summary, verdict, cautions };
}
