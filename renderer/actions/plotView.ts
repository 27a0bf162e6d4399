// Draws the open channel, its fit, the design's prediction and the fit window on the plot.

import type { ActionContext } from './context';

export async function drawPlot(ctx: ActionContext): Promise<void> {
  const state = ctx.store.state;
  const { capture, trace, fit, design } = state;
  ctx.store.update();
  if (!capture || !trace) return;
  await ctx.plot.show({
    key: `${capture.key}:${capture.channel}`,
    trace,
    params: fit && fit.status !== 'failed' ? fit.params : null,
    window: fit ? fit.window : null,
    design: design?.design ?? null,
    eventTime: state.eventTime ?? fit?.t0.value ?? 0,
  });
}
