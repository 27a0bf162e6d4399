// The capture panel's probe settings: the channel's values multiplied by the probe's ratio and turned over when it is
// connected reversed, in the worker before the trace is drawn and the fit is made (as --probe-ratio and --invert do).

import { parseProbeRatio } from '../../core/workflow/probeScaling';
import { reweighCautions } from './cautions';
import { runStep, type ActionContext } from './context';
import { measure } from './fitWindow';
import { drawPlot } from './plotView';

/** The field's name in messages, as the panel labels it. */
const RATIO_FIELD = 'probe ratio';

/** Scale and sign of the channel shown; an empty ratio is 1. Bad text is the window's message and nothing changes. */
export async function setProbe(ctx: ActionContext, ratioText: string, invert: boolean): Promise<void> {
  const capture = ctx.store.state.capture;
  if (!capture) return;
  const channel = capture.channel;
  const done = await runStep(ctx, 'scaling the channel', async () => {
    const ratio = ratioText.trim() === '' ? 1 : parseProbeRatio(ratioText, RATIO_FIELD);
    await ctx.client.request({ type: 'probe', captureId: capture.key, channel, probe: { ratio, invert } });
    return ctx.client.request({ type: 'trace', captureId: capture.key, channel });
  });
  if (!done || capture !== ctx.store.state.capture || channel !== capture.channel) return;
  ctx.store.update((s) => {
    capture.probes = { ...capture.probes, [channel]: { ratioText: ratioText.trim(), invert } };
    s.trace = done.trace;
    s.fit = null;
    s.summary = null;
    reweighCautions(s);
  });
  await drawPlot(ctx);
  await measure(ctx);
}
