// The bench log panel's actions: read the log, add the measurement on screen to it, amend or withdraw a logged one.

import { buildCorrectionRequest, buildLogRequest, type CorrectionForm, type LogForm } from '../logRequest';
import type { BenchRecord } from '../../core/report/benchRecord';
import type { CorrectionAction } from '../../core/report/logCorrection';
import { plainMessage } from '../plainMessage';
import { runStep, type ActionContext } from './context';

export async function refreshLog(ctx: ActionContext): Promise<void> {
  try {
    const log = await ctx.bridge.readBenchLog();
    ctx.store.update((s) => {
      s.log = log;
      s.logError = null;
    });
  } catch (error) {
    ctx.store.update((s) => (s.logError = plainMessage(error)));
  }
}

/** True when the measurement was logged. */
export async function logMeasurement(ctx: ActionContext, form: LogForm): Promise<boolean> {
  const state = ctx.store.state;
  state.logMessage = null;
  let request;
  try {
    request = buildLogRequest(state, form);
  } catch (error) {
    ctx.store.update((s) => (s.logError = plainMessage(error)));
    return false;
  }
  const view = await runStep(ctx, 'adding to the bench log', () => ctx.bridge.appendBenchLog(request));
  return showLogAfter(ctx, view, (v) => `Logged ${request.unit} (${v.records.length} measurement${v.records.length === 1 ? '' : 's'} in the log).`);
}

/** Amend the labels of a logged measurement or withdraw it (a correction appended by main); true when it was logged. */
export async function correctLogEntry(ctx: ActionContext, record: BenchRecord, form: CorrectionForm, action: CorrectionAction): Promise<boolean> {
  ctx.store.state.logMessage = null;
  let request;
  try {
    request = buildCorrectionRequest(record, form, action);
  } catch (error) {
    ctx.store.update((s) => (s.logError = plainMessage(error)));
    return false;
  }
  const view = await runStep(ctx, action === 'amend' ? 'amending the bench log' : 'withdrawing from the bench log', () => ctx.bridge.correctBenchLog(request));
  return showLogAfter(ctx, view, () =>
    action === 'amend' ? `Amended the measurement of ${record.unit}; the change and its reason are kept in the log.` : `Withdrew the measurement of ${record.unit}; it stays in the log, marked withdrawn.`,
  );
}

/** The log as main returned it after a write, with its message; a failed step's error moves to the log panel. True when written. */
function showLogAfter<V extends NonNullable<ActionContext['store']['state']['log']>>(ctx: ActionContext, view: V | null, message: (view: V) => string): boolean {
  ctx.store.update((s) => {
    if (!view) {
      s.logError = s.error;
      s.error = null;
      return;
    }
    s.log = view;
    s.logError = null;
    s.logMessage = message(view);
  });
  return view !== null;
}
