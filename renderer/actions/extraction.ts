// The extraction panel's action: the typed values read with the command line's parsers, measureParasitics run in the worker.

import { parseChannel, parsePositiveValue } from '../../core/workflow/userValues';
import { addedPartsTolerance, deratingsWithTolerance, parseFactor, parseProbeCapacitance, parseValueWithTolerance, probeCapacitanceTolerance } from '../../core/workflow/capacitorValues';
import { toleranceToRelativeUncertainty } from '../../core/circuit/tolerance';
import { quantity } from '../../core/quantity';
import { BenchError } from '../benchError';
import { FitCancelled } from '../fitClient';
import { plainMessage } from '../plainMessage';
import type { CaptureContent, CaptureFile, ParasiticsAsk, ParasiticsEdgeAsk } from '../workerProtocol';
import { showProgress, type ActionContext } from './context';

/** One capture of the set as the panel holds it; the first is the bare loop. */
export interface ExtractionRow {
  name: string;
  /** The capture file's content; null until one is chosen. */
  content: CaptureContent | null;
  addedText: string;
  /** The part's value at the operating voltage over its nominal value, as typed ('' for none). */
  deratingText: string;
}

/** The panel's fields as typed. */
export interface ExtractionSettings {
  addedToleranceText: string;
  probeText: string;
  probeToleranceText: string;
  bandwidthText: string;
  voltageText: string;
  switchingText: string;
  dcBiasText: string;
  deratingToleranceText: string;
  switchCText: string;
  edge: EdgeSettings;
}

/** The turn-on edge for the L_p cross-check: its file (null for none) and the channels or plateau as typed. */
export interface EdgeSettings {
  file: CaptureFile | null;
  currentChannelText: string;
  voltageChannelText: string;
  plateauText: string;
}

/** The request for the worker; bad text throws in plain words naming the field. */
export function parasiticsAsk(rows: readonly ExtractionRow[], settings: ExtractionSettings): ParasiticsAsk {
  const optional = (text: string, what: string, unit: string) => parsePositiveValue(text.trim() === '' ? undefined : text, what, unit);
  const given = (text: string) => (text.trim() === '' ? undefined : text);
  const factors = rows.map((row, i) => (i === 0 || given(row.deratingText) === undefined ? undefined : parseFactor(row.deratingText, `capture ${i + 1}: derating`)));
  const dcBiasFactor = given(settings.dcBiasText) === undefined ? undefined : parseFactor(settings.dcBiasText, 'DC-bias factor');
  const { deratings, dcBias } = deratingsWithTolerance(factors, dcBiasFactor, given(settings.deratingToleranceText), 'derating tolerance');
  const captures = rows.map((row, i) => {
    const where = `capture ${i + 1}`;
    if (!row.content) throw new BenchError(`${where}: choose a capture file`);
    const addedC = i === 0 ? 0 : parsePositiveValue(row.addedText, `${where}: added C`, 'F');
    return { name: row.name, ...row.content, addedC: addedC ?? 0, derating: deratings[i] };
  });
  const probe = parseProbeCapacitance(given(settings.probeText), 'probe C');
  return {
    captures,
    dcBias,
    switchC: given(settings.switchCText) === undefined ? undefined : parseValueWithTolerance(settings.switchCText, 'switch Coss', 'F'),
    edge: edgeAsk(settings.edge),
    addedTolerance: addedPartsTolerance(settings.addedToleranceText, 'added C tolerance'),
    probeC: probe?.value,
    probeCTolerance: probeCapacitanceTolerance(probe, settings.probeToleranceText, 'probe C tolerance'),
    bandwidth: optional(settings.bandwidthText, 'bandwidth', 'Hz'),
    voltage: optional(settings.voltageText, 'voltage swing', 'V'),
    switchingFrequency: optional(settings.switchingText, 'switching frequency', 'Hz'),
  };
}

/** The cross-check's request, or undefined when no edge capture is chosen; channels or a plateau without one are refused. */
function edgeAsk(edge: EdgeSettings): ParasiticsEdgeAsk | undefined {
  const typed = (text: string) => (text.trim() === '' ? undefined : text.trim());
  const voltageChannel = typed(edge.voltageChannelText);
  const plateauText = typed(edge.plateauText);
  if (!edge.file) {
    if (typed(edge.currentChannelText) ?? voltageChannel ?? plateauText) throw new BenchError('turn-on edge: choose the current capture file for the L_p cross-check');
    return undefined;
  }
  if ((voltageChannel === undefined) === (plateauText === undefined)) {
    throw new BenchError('turn-on edge: give the switch voltage channel or the plateau voltage (one of them)');
  }
  const currentText = typed(edge.currentChannelText);
  const plateau = plateauText === undefined ? undefined : parseValueWithTolerance(plateauText, 'plateau voltage', 'V');
  return {
    file: edge.file,
    currentChannel: currentText === undefined ? undefined : parseChannel(currentText),
    voltageChannel: voltageChannel === undefined ? undefined : parseChannel(voltageChannel),
    plateau: plateau && quantity(plateau.value, plateau.value * toleranceToRelativeUncertainty(plateau.tolerance), 'V'),
  };
}

export async function runExtraction(ctx: ActionContext, rows: readonly ExtractionRow[], settings: ExtractionSettings): Promise<void> {
  ctx.store.update((s) => {
    s.extraction = null;
    s.extractionError = null;
  });
  try {
    const ask = parasiticsAsk(rows, settings);
    const answer = await ctx.client.request({ type: 'parasitics', ...ask }, (stage) => showProgress(ctx, stage));
    ctx.store.update((s) => {
      s.extraction = answer.result;
      s.extractionProbeC = ask.probeC ?? 0;
    });
  } catch (error) {
    ctx.store.update((s) => (s.extractionError = error instanceof FitCancelled ? 'stopped before it finished: extract again' : plainMessage(error)));
  } finally {
    showProgress(ctx, null);
  }
}
