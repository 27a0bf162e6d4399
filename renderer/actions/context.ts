// What every action works with (store, bridge, fit worker, plot, page) and the one way a step is run and reported.

import type { Bridge } from '../bridgeTypes';
import { FitCancelled, type FitClient } from '../fitClient';
import type { FitPlot } from '../plot/fitPlot';
import { plainMessage } from '../plainMessage';
import type { Store } from '../store';

/** The page around the panels, owned by renderer/main.ts. */
export interface PageAdapter {
  /** Name the open capture in the window's title. */
  showCaptureName(name: string): void;
}

export interface ActionContext {
  store: Store;
  bridge: Bridge;
  client: FitClient;
  plot: FitPlot;
  page: PageAdapter;
  /** Counters shared by the actions: steps running, the newest fit, captures opened. */
  counters: { running: number; fitGeneration: number; captures: number };
  /** The opens of captures, numbered as they start: the last number given, the newest shown, and those still running. */
  opens: { started: number; shown: number; running: Set<number> };
}

/** Run one step with a progress line; a failure becomes the window's error message and null. */
export async function runStep<T>(ctx: ActionContext, label: string, step: () => Promise<T>): Promise<T | null> {
  ctx.counters.running++;
  showProgress(ctx, label);
  try {
    return await step();
  } catch (error) {
    if (!(error instanceof FitCancelled)) ctx.store.update((s) => (s.error = plainMessage(error)));
    return null;
  } finally {
    ctx.counters.running--;
    if (ctx.counters.running === 0) showProgress(ctx, null);
  }
}

/** The progress line: a stage, or null when the last step is done. */
export function showProgress(ctx: ActionContext, stage: string | null): void {
  ctx.store.update((s) => (s.busy = stage === null && ctx.counters.running > 0 ? s.busy : stage));
}
