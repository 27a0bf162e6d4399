// The fit worker's requests answered with core/workflow: no `self`, no DOM, so node tests call it directly.

import { parseCapture, parseCaptureFileBytes } from '../core/capture/parseCapture';
import { selectChannel, withReadUnit } from '../core/capture/selectChannel';
import type { Capture, CaptureOptions, Channel } from '../core/capture/types';
import { parseStatedUnit } from '../core/units/unitText';
import { parseTime } from '../core/workflow/userValues';
import { compareCaptures, type ComparisonSide } from '../core/workflow/compare';
import { checkAgainstDesign, measureCapture, type MeasureResult } from '../core/workflow/measure';
import { measureParasitics, type EdgeRequest } from '../core/workflow/parasitics';
import { applyProbe, type ProbeScaling } from '../core/workflow/probeScaling';
import { reduceMinMax } from '../core/report/decimate';
import { modeContributions } from '../core/fit/modeContributions';
import type { ResponseFit } from '../core/fit/responseFit';
import { plainMessage } from './plainMessage';
import { describeCapture, traceData } from './traceData';
import { unitRefusal } from './unitRefusal';
import { FILE_UNITS, type CaptureContent, type CaptureFile, type ModeCurve, type OverlayTrace, type ParasiticsEdgeAsk, type StatedUnits, type WorkerAsk, type WorkerReplyValue } from './workerProtocol';

export interface HandledReply {
  value: WorkerReplyValue;
  /** Buffers to move to the window rather than copy. */
  transfer: ArrayBuffer[];
}

/** Captures kept parsed for refits, newest last; each channel's probe scaling as the window set it. */
const opened = new Map<string, { name: string; capture: Capture; probes: Map<number, ProbeScaling> }>();
const KEEP = 4;
/** Columns of the before / after overlay: two points each keep every peak of a plot about a thousand pixels wide. */
const OVERLAY_COLUMNS = 1200;

/** Answer one request; invalid input throws (the worker turns it into a message). */
export function handleWorkerRequest(request: WorkerAsk, progress: (stage: string) => void): HandledReply {
  switch (request.type) {
    case 'open': {
      progress('reading the capture');
      let capture: Capture;
      try {
        const interval = request.reading?.sampleInterval ? parseTime(request.reading.sampleInterval, 'the sample interval') : request.sampleInterval;
        capture = readContent(request.content, { sampleInterval: interval, segment: request.reading?.segment, ...statedUnits(request.reading?.units ?? FILE_UNITS) });
      } catch (error) {
        const refusal = unitRefusal(error);
        if (refusal) return { value: { type: 'open', info: null, refusal }, transfer: [] };
        throw error;
      }
      opened.delete(request.captureId);
      opened.set(request.captureId, { name: request.name, capture, probes: new Map() });
      while (opened.size > KEEP) opened.delete(opened.keys().next().value as string);
      return { value: { type: 'open', info: describeCapture(capture), refusal: null }, transfer: [] };
    }
    case 'probe': {
      const entry = openedCapture(request.captureId);
      channelAt(entry.capture, request.channel); // refuses a channel the capture does not have
      entry.probes.set(request.channel, request.probe);
      return { value: { type: 'probe' }, transfer: [] };
    }
    case 'trace': {
      const { capture } = openedCapture(request.captureId);
      const trace = traceData(probedChannel(request.captureId, request.channel), capture.sampleInterval);
      return { value: { type: 'trace', trace }, transfer: [trace.time.buffer, trace.values.buffer, trace.clippedTimes.buffer, trace.gapTimes.buffer] as ArrayBuffer[] };
    }
    case 'measure': {
      const { name, capture } = openedCapture(request.captureId);
      const channel = probedChannel(request.captureId, request.channel);
      progress(`fitting ${channel.values.length.toLocaleString('en')} samples`);
      let measured: MeasureResult;
      try {
        withReadUnit(capture, channel);
        measured = measureCapture({
          file: name,
          channel,
          otherChannels: capture.channels,
          captureWarnings: capture.warnings,
          importSummary: capture.importSummary,
          metadata: capture.metadata,
          setup: request.setup,
          window: request.window,
          knownPart: request.knownPart,
          design: request.design,
          eventTime: request.eventTime,
          event: request.event,
          modes: request.modes,
          mode: request.mode,
        });
      } catch (error) {
        // The samples are still shown; the window says why there is no fit.
        return { value: { type: 'measure', reply: { result: null, fitError: plainMessage(error), verdictError: null, componentsError: null, modeCurves: [] } }, transfer: [] };
      }
      const { problems, ...result } = measured;
      // The verdict and the components each fail on their own, shown beside the fit in their panels.
      const message = (problem: Error | null) => (problem ? plainMessage(problem) : null);
      const modeCurves = curvesOf(result.fit, channel.time);
      const reply = { result, fitError: null, verdictError: message(problems.verdict), componentsError: message(problems.components), modeCurves };
      return { value: { type: 'measure', reply }, transfer: modeCurves.map((c) => c.values.buffer as ArrayBuffer) };
    }
    case 'check': {
      const { name } = openedCapture(request.captureId);
      const channel = probedChannel(request.captureId, request.channel);
      progress('checking against the design');
      const { value: verdict, error: verdictError } = attempt(() => checkAgainstDesign(request.design, request.fit, request.setupChecks, channel, name, request.eventTime));
      return { value: { type: 'check', verdict, verdictError }, transfer: [] };
    }
    case 'parasitics': {
      const captures = request.captures.map((c) => ({ ...readSide(c, undefined, progress), addedC: c.addedC, derating: c.derating }));
      const edge = request.edge ? readEdge(request.edge, progress) : undefined;
      const result = measureParasitics({ ...request, captures, edge }, progress);
      return { value: { type: 'parasitics', result }, transfer: [] };
    }
    case 'compare': {
      const before = readSide(request.before, request.channel, progress);
      const after = readSide(request.after, request.channel, progress);
      progress('fitting both captures');
      const comparison = compareCaptures({ before, after, knownPart: request.knownPart });
      const overlay = { before: overlayTrace(before.channel), after: overlayTrace(after.channel) };
      const transfer = [overlay.before, overlay.after].flatMap((t) => [t.time.buffer, t.values.buffer]) as ArrayBuffer[];
      return { value: { type: 'compare', comparison, overlay }, transfer };
    }
  }
}

/** Each mode's contribution at every sample, for the plot to draw under the fit: only when one ring is not the whole fit. */
function curvesOf(fit: ResponseFit, time: Float64Array): ModeCurve[] {
  return fit.modes.length > 1 || fit.slowTerm ? modeContributions(fit, time) : [];
}

/** A use case's answer, or why it gave none in plain words. */
interface Attempt<T> {
  value: T | null;
  error: string | null;
}

function attempt<T>(run: () => T): Attempt<T> {
  try {
    return { value: run(), error: null };
  } catch (error) {
    return { value: null, error: plainMessage(error) };
  }
}

/** A capture read from its bytes as written (any encoding the importer knows), or from text main decoded. */
function readContent(content: CaptureContent, options: CaptureOptions = {}): Capture {
  return content.bytes ? parseCaptureFileBytes(new Uint8Array(content.bytes), options) : parseCapture(content.text, options);
}

/** The turn-on edge's current and, unless the plateau is given, its switch voltage: two channels of one file. */
function readEdge(edge: ParasiticsEdgeAsk, progress: (stage: string) => void): EdgeRequest {
  progress(`reading ${edge.file.name}`);
  const capture = readContent(edge.file);
  const voltage = edge.voltageChannel === undefined ? undefined : selectChannel(capture, edge.voltageChannel);
  return { file: edge.file.name, current: selectChannel(capture, edge.currentChannel), voltage, plateau: edge.plateau };
}

/** A capture file read for a one-off use case, as the command line reads a file. */
function readSide(side: CaptureFile, channel: string | number | undefined, progress: (stage: string) => void): ComparisonSide {
  progress(`reading ${side.name}`);
  const capture = readContent(side);
  return { file: side.name, channel: selectChannel(capture, channel), otherChannels: capture.channels, captureWarnings: capture.warnings };
}

/** A compared channel reduced to its extremes per column, for the overlay. */
function overlayTrace(channel: Channel): OverlayTrace {
  const { time, values } = channel;
  const reduced = reduceMinMax(time, values, time[0], time[time.length - 1], OVERLAY_COLUMNS);
  return { time: Float64Array.from(reduced.x), values: Float64Array.from(reduced.y), unit: channel.unit };
}

/** The importer's options for the units the user stated (the window offers only units that read). */
function statedUnits(units: StatedUnits): Pick<CaptureOptions, 'timeUnit' | 'valueUnit'> {
  return {
    ...(units.timeUnit ? { timeUnit: parseStatedUnit(units.timeUnit, true, 'the time unit') } : {}),
    ...(units.valueUnit ? { valueUnit: parseStatedUnit(units.valueUnit, false, 'the value unit') } : {}),
  };
}

/** A channel of an open capture as the node saw it: the probe's ratio and sign the window set for it applied. */
function probedChannel(id: string, index: number): Channel {
  const { capture, probes } = openedCapture(id);
  return applyProbe(channelAt(capture, index), probes.get(index));
}

function openedCapture(id: string): { name: string; capture: Capture; probes: Map<number, ProbeScaling> } {
  const entry = opened.get(id);
  if (!entry) throw new Error('the capture is no longer open; open it again');
  return entry;
}

function channelAt(capture: Capture, index: number): Channel {
  const channel = capture.channels[index];
  if (!channel) throw new Error(`the capture has no channel ${index + 1}`);
  return channel;
}
