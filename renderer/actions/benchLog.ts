// The bench log panel's actions: read the log, and add the measurement on screen to it.

import { buildLogRequest, type LogForm } from '../logRequest';
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
  ctx.store.update((s) => {
    if (!view) {
      s.logError = s.error;
      s.error = null;
      return;
    }
    s.log = view;
    s.logError = null;
    s.logMessage = `Logged ${request.unit} (${view.records.length} measurement${view.records.length === 1 ? '' : 's'} in the log).`;
  });
  return view !== null;
}
