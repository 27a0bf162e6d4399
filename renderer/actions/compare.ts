// The before / after panel's action: two captures of one circuit compared by compareCaptures in the worker.

import { parseChannel, parseKnown, parseTopology } from '../../core/workflow/userValues';
import { BenchError } from '../benchError';
import { FitCancelled } from '../fitClient';
import { plainMessage } from '../plainMessage';
import type { CaptureFile, WorkerAsk } from '../workerProtocol';
import { showProgress, type ActionContext } from './context';

/** The panel's choices as typed: the channel (empty for the first) and an optional known part with its topology. */
export interface CompareSettings {
  channelText: string;
  topologyText: string;
  knownText: string;
}

/** The request for the worker; a missing capture or bad text throws in plain words. */
export function compareAsk(before: CaptureFile | null, after: CaptureFile | null, settings: CompareSettings): Extract<WorkerAsk, { type: 'compare' }> {
  if (!before || !after) throw new BenchError(`choose the ${before ? 'after' : 'before'} capture first`);
  const channel = settings.channelText.trim() === '' ? undefined : parseChannel(settings.channelText);
  const knownPart = settings.knownText.trim() === '' ? undefined : { topology: parseTopology(settings.topologyText), known: parseKnown(settings.knownText) };
  return { type: 'compare', before, after, channel, knownPart };
}

export async function runComparison(ctx: ActionContext, before: CaptureFile | null, after: CaptureFile | null, settings: CompareSettings): Promise<void> {
  ctx.store.update((s) => {
    s.comparison = null;
    s.comparisonOverlay = null;
    s.comparisonError = null;
  });
  try {
    const answer = await ctx.client.request(compareAsk(before, after, settings), (stage) => showProgress(ctx, stage));
    ctx.store.update((s) => {
      s.comparison = answer.comparison;
      s.comparisonOverlay = answer.overlay;
    });
  } catch (error) {
    ctx.store.update((s) => (s.comparisonError = error instanceof FitCancelled ? 'stopped before it finished: compare again' : plainMessage(error)));
  } finally {
    showProgress(ctx, null);
  }
}
