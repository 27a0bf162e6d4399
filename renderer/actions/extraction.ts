// The extraction panel's action: the typed values read with the command line's parsers, measureParasitics run in the worker.

import { parsePositiveValue, parseTolerance } from '../../core/workflow/userValues';
import { BenchError } from '../benchError';
import { FitCancelled } from '../fitClient';
import { plainMessage } from '../plainMessage';
import type { CaptureContent, ParasiticsAsk } from '../workerProtocol';
import { showProgress, type ActionContext } from './context';

/** One capture of the set as the panel holds it; the first is the bare loop. */
export interface ExtractionRow {
  name: string;
  /** The capture file's content; null until one is chosen. */
  content: CaptureContent | null;
  addedText: string;
}

/** The panel's fields as typed. */
export interface ExtractionSettings {
  addedToleranceText: string;
  probeText: string;
  probeToleranceText: string;
  bandwidthText: string;
  voltageText: string;
  switchingText: string;
}

/** The request for the worker; bad text throws in plain words naming the field. */
export function parasiticsAsk(rows: readonly ExtractionRow[], settings: ExtractionSettings): ParasiticsAsk {
  const optional = (text: string, what: string, unit: string) => parsePositiveValue(text.trim() === '' ? undefined : text, what, unit);
  const captures = rows.map((row, i) => {
    const where = `capture ${i + 1}`;
    if (!row.content) throw new BenchError(`${where}: choose a capture file`);
    const addedC = i === 0 ? 0 : parsePositiveValue(row.addedText, `${where}: added C`, 'F');
    return { name: row.name, ...row.content, addedC: addedC ?? 0 };
  });
  return {
    captures,
    addedTolerance: parseTolerance(settings.addedToleranceText, 'added C tolerance'),
    probeC: optional(settings.probeText, 'probe C', 'F'),
    probeCTolerance: parseTolerance(settings.probeToleranceText, 'probe C tolerance'),
    bandwidth: optional(settings.bandwidthText, 'bandwidth', 'Hz'),
    voltage: optional(settings.voltageText, 'voltage swing', 'V'),
    switchingFrequency: optional(settings.switchingText, 'switching frequency', 'Hz'),
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
