// Measuring the open channel in the worker (fit, then verdict and parts beside it, then cautions); a new fit window measures again.

import type { SetupOptions } from '../../core/circuit/setupTypes';
import { eventTimeOf } from '../../core/report/fitSummary';
import type { FitWindow } from '../workerProtocol';
import { reweighCautions } from './cautions';
import { knownPartForFit } from './components';
import { runStep, showProgress, type ActionContext } from './context';
import { drawPlot } from './plotView';

/** A new fit window (from the plot or the fields); an empty one goes back to the automatic window. Events are found in it anew. */
export async function setWindow(ctx: ActionContext, window: FitWindow): Promise<void> {
  ctx.store.state.userWindow = window;
  ctx.store.state.chosenEvent = null;
  await measure(ctx);
}

/** Fit another event of a record holding several (from the plot's labels or the fit panel). */
export async function chooseEvent(ctx: ActionContext, event: number): Promise<void> {
  ctx.store.state.chosenEvent = event;
  await measure(ctx);
}

/** Fit this many ringing modes (null: as many as the data support); R, L and C go back to the dominant mode. */
export async function setModes(ctx: ActionContext, modes: number | null): Promise<void> {
  ctx.store.state.modesAsked = modes;
  ctx.store.state.chosenMode = null;
  await measure(ctx);
}

/** Derive R, L and C (and check the design) for another ringing mode of the fit shown, 1-based. */
export async function chooseMode(ctx: ActionContext, mode: number): Promise<void> {
  ctx.store.state.chosenMode = mode;
  await measure(ctx);
}

/** What was stated about the scope and probe: the setup checks weigh the capture against it from the next fit on. */
export async function setSetup(ctx: ActionContext, setup: SetupOptions): Promise<void> {
  ctx.store.state.setupOptions = setup;
  await measure(ctx);
}

export async function measure(ctx: ActionContext): Promise<void> {
  const state = ctx.store.state;
  // A new capture or channel (its measurement forgotten) starts from the data's own order and the dominant mode.
  if (!state.fit) {
    state.modesAsked = null;
    state.chosenMode = null;
  }
  const { capture, trace, userWindow, design, chosenEvent, modesAsked, chosenMode } = state;
  if (!capture || !trace) return;
  const generation = ++ctx.counters.fitGeneration;
  const knownPart = knownPartForFit(state);
  // A window set by hand moves the fit's t0; the design's prediction stays at the event the automatic fit found.
  const eventTime = userWindow.start === undefined ? undefined : (state.eventTime ?? undefined);
  const answer = await runStep(ctx, 'fitting', () =>
    ctx.client.request(
      {
        type: 'measure',
        captureId: capture.key,
        channel: capture.channel,
        window: userWindow,
        knownPart,
        setup: state.setupOptions,
        design: design?.design,
        eventTime,
        event: chosenEvent ?? undefined,
        modes: modesAsked ?? undefined,
        mode: chosenMode ?? undefined,
      },
      (stage) => showProgress(ctx, stage),
    ),
  );
  if (generation !== ctx.counters.fitGeneration || !answer) return ctx.store.update();
  const { result, fitError, verdictError, componentsError, modeCurves } = answer.reply;
  ctx.store.update((s) => {
    if (result && s.userWindow.start === undefined && result.fit.status !== 'failed') s.eventTime = eventTimeOf(result.fit);
    s.fit = result?.fit ?? null;
    s.summary = result?.summary ?? null;
    s.modeCurves = modeCurves;
    s.fitError = fitError;
    s.fitCount++;
    s.components = result?.summary.components ?? null;
    // A known part that could not be read was already explained when the request was made.
    s.componentsError ??= componentsError;
    s.verdict = result?.verdict ?? null;
    s.verdictError = verdictError;
    s.setupChecks = result?.setupChecks ?? [];
    if (result) s.cautions = result.cautions;
    else reweighCautions(s);
  });
  await drawPlot(ctx);
}
