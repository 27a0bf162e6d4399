// How a capture is read and fitted, as a person gives it (command-line options, a sample's manifest
// entry, a bench record's settings), read once into the values the measuring use case takes.

import { UsageError } from '../inputError';
import { parseStatedUnit, type StatedUnit } from '../units/unitText';
import type { FitWindow } from './measure';
import type { KnownPartRequest } from './measuredComponents';
import { parseProbeCapacitance, probeSetup } from './capacitorValues';
import { parseProbeRatio, type ProbeScaling } from './probeScaling';
import type { SetupOptions } from './setupChecks';
import { parseLength, parsePositiveValue } from './userValues';
import { parseChannel, parseKnown, parseModeCount, parseModeNumber, parseSignedTime, parseTime, parseTopology } from './userValues';

/** The settings as typed; every field optional. */
export interface MeasureSettings {
  /** 'series' or 'parallel'; goes with `known`. */
  topology?: string;
  /** One known part, 'C=470n' or 'L=2.2u,10' (tolerance in %). */
  known?: string;
  /** Channel name, or else 0-based index (a channel named '1' wins over index 1). Default: the first channel. */
  column?: string;
  /** Sample interval for a file without a time column, e.g. '2n'. */
  sampleInterval?: string;
  /** Fit window edges, e.g. '-30n', '600u'. Default: found from the data. */
  from?: string;
  to?: string;
  /** Sort out-of-order time stamps instead of refusing them. Default false. */
  sortTime?: boolean;
  /** Unit of the time column or of the file's stated interval, e.g. 'us'. Default: the file's, else seconds. */
  timeUnit?: string;
  /** Unit of the chosen channel's values, e.g. 'mV'. Default: the file's, else as written. */
  valueUnit?: string;
  /** Which segment of a file of repeated acquisitions to read, 1-based, e.g. '2'. Default: the first. */
  segment?: string;
  /** Which event to measure in a record holding several, 1-based, e.g. '2'. Default: the first complete one. */
  event?: string;
  /** The measured quantity jumps at the event (a capacitor's current, an inductor's voltage). Default: found from the data. */
  jumpStart?: boolean;
  /** Probe attenuation the scope did not apply, e.g. '10' or '10:1': the channel's values are multiplied by it. Default 1. */
  probeRatio?: string;
  /** The probe was connected reversed: the channel's values change sign. Default false. */
  invert?: boolean;
  /** The scope's (or probe's) bandwidth, e.g. '200M'. Default: the capture preamble's, else none. */
  scopeBandwidth?: string;
  /** The voltage probe's input capacitance, e.g. '10p'. Default: no correction (10 pF assumed for the ground-lead check). */
  probeCapacitance?: string;
  /** The probe's ground-lead length, e.g. '6in' or '15cm'. Default 6 inches. */
  groundLead?: string;
  /** How many ringing modes to fit, '1' to '3'. Default: chosen from the data. */
  modes?: string;
  /** Which ringing mode R, L and C are derived for (and a design checks), 1-based, e.g. '2'. Default: the dominant one (1). */
  mode?: string;
}

export interface ParsedMeasureSettings {
  channel?: string | number;
  sampleInterval?: number;
  sortTime: boolean;
  timeUnit?: StatedUnit;
  valueUnit?: StatedUnit;
  /** As typed; the importer refuses a number naming no segment, giving the count. */
  segment?: number;
  window: FitWindow;
  knownPart?: KnownPartRequest;
  event?: number;
  /** 'free' when the start is stated to jump; absent to let the fit find out. */
  continuity?: 'free';
  /** Applied to the chosen channel (applyProbe) before the fit; absent when neither was given. */
  probe?: ProbeScaling;
  /** What was stated about the scope and probe, for the setup checks (setupChecks.ts). */
  setup: SetupOptions;
  /** Forced number of ringing modes; absent to choose it from the data. */
  modes?: number;
  /** The mode whose R, L and C are derived, 1-based; absent for the dominant one. */
  mode?: number;
}

export function parseMeasureSettings(settings: MeasureSettings): ParsedMeasureSettings {
  if ((settings.topology === undefined) !== (settings.known === undefined)) {
    throw new UsageError('--topology and --known go together: give both to derive R, L and C');
  }
  const parsed: ParsedMeasureSettings = {
    sortTime: settings.sortTime ?? false,
    setup: parseSetupOptions(settings),
    window: {
      ...(settings.from === undefined ? {} : { start: parseSignedTime(settings.from, '--from') }),
      ...(settings.to === undefined ? {} : { end: parseSignedTime(settings.to, '--to') }),
    },
  };
  if (settings.column !== undefined) parsed.channel = parseChannel(settings.column);
  if (settings.sampleInterval !== undefined) parsed.sampleInterval = parseTime(settings.sampleInterval, '--sample-interval');
  if (settings.timeUnit !== undefined) parsed.timeUnit = parseStatedUnit(settings.timeUnit, true, '--time-unit');
  if (settings.valueUnit !== undefined) parsed.valueUnit = parseStatedUnit(settings.valueUnit, false, '--value-unit');
  if (settings.segment !== undefined) parsed.segment = parseSegmentNumber(settings.segment);
  if (settings.event !== undefined) parsed.event = parseEventNumber(settings.event);
  if (settings.jumpStart) parsed.continuity = 'free';
  if (settings.probeRatio !== undefined || settings.invert) {
    parsed.probe = { ratio: settings.probeRatio === undefined ? 1 : parseProbeRatio(settings.probeRatio, '--probe-ratio'), invert: settings.invert ?? false };
  }
  if (settings.modes !== undefined) parsed.modes = parseModeCount(settings.modes);
  if (settings.mode !== undefined) parsed.mode = parseModeNumber(settings.mode);
  if (parsed.modes !== undefined && parsed.mode !== undefined && parsed.mode > parsed.modes) {
    throw new UsageError(`--mode ${parsed.mode}: --modes ${parsed.modes} fits ${parsed.modes} ringing mode${parsed.modes === 1 ? '' : 's'}`);
  }
  if (settings.topology !== undefined && settings.known !== undefined) {
    parsed.knownPart = { topology: parseTopology(settings.topology), known: parseKnown(settings.known) };
  }
  return parsed;
}

/** --event: a whole number from 1 (the events are counted from 1 in time order). */
function parseEventNumber(text: string): number {
  const n = /^\s*\d+\s*$/.test(text) ? Number(text) : NaN;
  if (!Number.isSafeInteger(n) || n < 1) throw new UsageError(`--event: '${text}' is not an event number (1, 2, ...)`);
  return n;
}

/** --segment: a number (the importer, which knows how many segments the file holds, refuses one naming none). */
function parseSegmentNumber(text: string): number {
  const n = /^\s*[-+]?\d+(?:\.\d*)?\s*$/.test(text) ? Number(text) : NaN;
  if (!Number.isFinite(n)) throw new UsageError(`--segment: '${text}' is not a segment number (1, 2, ...)`);
  return n;
}

/** --scope-bandwidth, --probe-capacitance, --ground-lead: each left out when not given. */
function parseSetupOptions(settings: MeasureSettings): SetupOptions {
  const setup: SetupOptions = {};
  const bandwidth = parsePositiveValue(settings.scopeBandwidth, '--scope-bandwidth', 'Hz');
  const probe = parseProbeCapacitance(settings.probeCapacitance, '--probe-capacitance');
  if (bandwidth !== undefined) setup.scopeBandwidth = bandwidth;
  if (probe !== undefined) Object.assign(setup, probeSetup(probe));
  if (settings.groundLead !== undefined) setup.groundLead = parseLength(settings.groundLead, '--ground-lead');
  return setup;
}
