// Draws the open channel, its fit, the design's prediction, the fit window and the step's metrics on the plot.

import { eventTimeOf } from '../../core/report/fitSummary';
import type { ActionContext } from './context';

export async function drawPlot(ctx: ActionContext): Promise<void> {
  const state = ctx.store.state;
  const { capture, trace, fit, summary, design } = state;
  const events = summary?.events;
  ctx.store.update();
  if (!capture || !trace) return;
  await ctx.plot.show({
    key: `${capture.key}:${capture.channel}`,
    trace,
    // Where an unfinished search stopped is drawn (the badge says it is no measurement); a failed or empty one is not.
    params: fit && (fit.status === 'converged' || fit.status === 'max-iterations') ? fit.params : null,
    window: fit ? fit.window : null,
    design: design?.design ?? null,
    eventTime: state.eventTime ?? (fit ? eventTimeOf(fit) : null),
    events: events ? events.list.map((e) => ({ index: e.index, onset: e.onset, end: e.end, fitted: e.index === events.chosen })) : [],
    transitions: summary?.transitions ?? null,
    modeCurves: fit ? state.modeCurves : [],
  });
}
