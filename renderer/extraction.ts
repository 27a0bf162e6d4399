// The added-capacitor extraction as the window runs it: each capture fitted in the worker, then the
// loop's L, C, R from core and a snubber starting point.

import { extractParasitics, type AddedCapacitorMeasurement } from '../core/circuit/addedCapacitor';
import { suggestSnubber } from '../core/circuit/snubber';
import { quantity } from '../core/quantity';
import { BenchError } from './benchError';
import type { ExtractionState } from './benchState';
import type { FitClient } from './fitClient';
import { parsePositive } from './parseInputs';
import { parseTolerance } from '../core/workflow/userValues';
import { plainMessage } from './plainMessage';

export interface ExtractionRow {
  name: string;
  text: string;
  addedText: string;
  toleranceText: string;
}

export interface ExtractionSettings {
  probeText: string;
  probeToleranceText: string;
  voltageText: string;
  switchingText: string;
}

export async function extractFromCaptures(
  client: FitClient,
  rows: readonly ExtractionRow[],
  settings: ExtractionSettings,
  progress: (stage: string) => void,
): Promise<ExtractionState> {
  if (rows.length < 2) throw new BenchError('the added-capacitor method needs at least two captures: the bare loop and one with a capacitor added');
  const probeC = parseCapacitance(settings.probeText, 'probe capacitance');
  const probeCTolerance = parseTolerance(settings.probeToleranceText, 'probe capacitance');
  const measurements: AddedCapacitorMeasurement[] = [];
  const frequencies: ExtractionState['frequencies'] = [];
  for (const [i, row] of rows.entries()) {
    const where = `capture ${i + 1}`;
    if (!row.text) throw new BenchError(`${where}: choose a capture file`);
    const addedC = parseCapacitance(row.addedText, `${where}: added capacitance`);
    const addedCTolerance = parseTolerance(row.toleranceText, where);
    progress(`fitting capture ${i + 1} of ${rows.length}`);
    const reply = await client.request({ type: 'fitText', name: row.name, text: row.text }, progress);
    if (reply.type !== 'fitText') throw new BenchError('the fit worker gave an unexpected answer');
    const { fit } = reply;
    if (fit.status === 'failed') throw new BenchError(`${where} (${row.name}): the fit failed: ${fit.message}`);
    // The method needs the undamped natural frequency f0 = omega0 / 2 pi, not the ring frequency.
    const f0 = quantity(fit.omega0.value / (2 * Math.PI), fit.omega0.stderr === null ? null : fit.omega0.stderr / (2 * Math.PI), 'Hz');
    measurements.push({ addedC, addedCTolerance, frequency: f0, alpha: fit.alpha, ...(reply.sampleInterval ? { sampleInterval: reply.sampleInterval } : {}) });
    frequencies.push({ name: row.name, f0, addedC });
  }
  const extraction = extractParasitics(measurements, { probeC, probeCTolerance });
  try {
    const voltage = settings.voltageText.trim() === '' ? undefined : parsePositive(settings.voltageText, 'V', 'snubber voltage swing');
    const switchingFrequency = settings.switchingText.trim() === '' ? undefined : parsePositive(settings.switchingText, 'Hz', 'switching frequency');
    const snubber = suggestSnubber({ L: extraction.L, C: extraction.C, R: extraction.R, characteristicImpedance: extraction.characteristicImpedance }, { voltage, switchingFrequency });
    return { extraction, snubber, snubberError: null, frequencies };
  } catch (error) {
    return { extraction, snubber: null, snubberError: plainMessage(error), frequencies };
  }
}

/** An added or probe capacitance: empty or zero for none, else a positive value with SI prefixes. */
function parseCapacitance(text: string, what: string): number {
  if (/^\s*(0+(\.0*)?\s*[pnuµm]?F?)?\s*$/.test(text)) return 0;
  return parsePositive(text, 'F', what);
}
