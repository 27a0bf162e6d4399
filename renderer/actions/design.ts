// The design panel's actions: open, edit, save or remove a design, and check the fit on screen against it (no refit).

import { parseDesign, serializeDesign } from '../../core/circuit/design';
import { ofMode, verdictRefusal } from '../../core/workflow/measure';
import type { LoadedDesign } from '../benchState';
import type { NamedText } from '../bridgeTypes';
import { plainMessage } from '../plainMessage';
import { readFileText } from '../browserFiles';
import { sha256Hex } from '../sha256';
import { reweighCautions } from './cautions';
import { runStep, type ActionContext } from './context';
import { drawPlot } from './plotView';

export async function loadDesignFromSamples(ctx: ActionContext, id: string): Promise<void> {
  const named = await runStep(ctx, 'reading the design', () => ctx.bridge.readDesign(id));
  if (named) await applyDesign(ctx, named, `sample-captures/designs/${named.name}`, 'user');
}

export async function pickDesign(ctx: ActionContext): Promise<void> {
  const named = await runStep(ctx, 'opening a design', () => ctx.bridge.pickDesign());
  if (named) await applyDesign(ctx, named, named.name, 'user');
}

/** A design file dropped on the window (any .json): read here, as the file input reads one. */
export async function openDroppedDesign(ctx: ActionContext, file: File): Promise<void> {
  const named = await runStep(ctx, `opening ${file.name}`, () => readFileText(file));
  if (named) await applyDesign(ctx, named, named.name, 'user');
}

/** A design as edited in the panel's fields (values as typed; parseDesign reads the prefixes). */
export async function useEditedDesign(ctx: ActionContext, fields: Record<string, unknown>): Promise<void> {
  const text = `${JSON.stringify(fields, null, 2)}\n`;
  const name = typeof fields.name === 'string' && fields.name.trim() ? fields.name.trim() : 'design';
  await applyDesign(ctx, { name: `${name.replace(/[^A-Za-z0-9._-]+/g, '-')}.json`, text }, 'edited in the window', 'user');
}

export async function saveDesign(ctx: ActionContext): Promise<void> {
  const loaded = ctx.store.state.design;
  if (!loaded) return;
  const saved = await runStep(ctx, 'saving the design', () =>
    ctx.bridge.saveFile({ suggestedName: loaded.name.endsWith('.json') ? loaded.name : `${loaded.name}.json`, content: serializeDesign(loaded.design), encoding: 'utf8' }, 'application/json'),
  );
  ctx.store.update((s) => {
    if (saved) s.designError = null;
  });
}

export function clearDesign(ctx: ActionContext): void {
  ctx.store.update((s) => {
    s.design = null;
    s.verdict = null;
    s.designError = null;
    reweighCautions(s);
  });
  void drawPlot(ctx);
}

async function applyDesign(ctx: ActionContext, named: NamedText, path: string, origin: LoadedDesign['origin']): Promise<void> {
  await loadDesignText(ctx, named, path, origin);
  await checkDesign(ctx);
  await drawPlot(ctx);
}

/** Read a design's text; a faulty one is shown in the panel and the verdict is cleared. */
export async function loadDesignText(ctx: ActionContext, named: NamedText, path: string, origin: LoadedDesign['origin']): Promise<void> {
  let loaded: LoadedDesign | null = null;
  let problem: string | null = null;
  try {
    const design = parseDesign(named.text);
    const { sha256 } = await sha256Hex(named.text);
    loaded = { design, name: named.name, path, text: named.text, sha256, origin };
  } catch (error) {
    problem = plainMessage(error);
  }
  ctx.store.update((s) => {
    if (loaded) s.design = loaded;
    else s.verdict = null;
    s.designError = problem;
    reweighCautions(s);
  });
}

/**
 * The verdict of the fit on screen against the design, computed in the worker by checkAgainstDesign; never asked
 * for a fit that gets none (verdictRefusal: a failed fit, a capture a setup check refuses, a single decay where the design
 * rings), which the panel says.
 */
async function checkDesign(ctx: ActionContext): Promise<void> {
  const state = ctx.store.state;
  const { capture, summary, design } = state;
  state.verdict = null;
  state.verdictError = null;
  if (!capture || !summary || !design || verdictRefusal(design.design, summary, state.setupChecks)) return ctx.store.update();
  const answer = await runStep(ctx, 'checking against the design', () =>
    ctx.client.request({ type: 'check', captureId: capture.key, channel: capture.channel, design: design.design, fit: ofMode(summary, state.chosenMode ?? undefined), setupChecks: state.setupChecks, eventTime: state.eventTime ?? undefined }),
  );
  ctx.store.update((s) => {
    s.verdict = answer?.verdict ?? null;
    s.verdictError = answer ? answer.verdictError : s.error;
  });
}
