// The session kept across reloads: the window, known part and design put back on the capture they were set for (never
// on another), and a recent capture opened again from the list.

import type { BenchState } from '../benchState';
import { saveSession, type SessionMemory } from '../benchMemory';
import { recallContent, recentCaptures } from '../captureMemory';
import { openCapture, opening, openSample } from './capture';
import type { ActionContext } from './context';
import { loadDesignText } from './design';
import { measure } from './fitWindow';

/** Open a capture from the recent list: a sample by its id, a file from the content the browser kept. */
export async function openRecent(ctx: ActionContext, id: string): Promise<void> {
  const entry = recentCaptures().find((e) => e.id === id);
  if (!entry) return;
  if (entry.sampleId) return openSample(ctx, entry.sampleId);
  await opening(ctx, async (ticket) => {
    const content = await recallContent(id);
    if (!content) {
      ctx.store.update((s) => (s.error = `${entry.name} is no longer kept by the browser: open the file again`));
      return;
    }
    await openCapture(ctx, { name: entry.name, path: entry.path, sampleId: null, ...content }, { ticket });
  });
}

/**
 * After the first capture opened: the window, known part and design the session left on this same capture and
 * channel, fitted once. A different capture (or channel) gets none of them.
 */
export async function restoreSession(ctx: ActionContext, saved: SessionMemory | null): Promise<void> {
  const capture = ctx.store.state.capture;
  if (!saved || !capture || capture.sha256 !== saved.capture.sha256 || capture.channel !== saved.capture.channel) return;
  const windowSet = saved.window.start !== undefined || saved.window.end !== undefined;
  if (!saved.design && !saved.known && !windowSet) return;
  if (saved.design) await loadDesignText(ctx, { name: saved.design.name, text: saved.design.text }, saved.design.path, 'user');
  ctx.store.update((s) => {
    if (saved.known) {
      s.componentsInput = saved.known;
      s.knownPartFrom = 'typed';
    }
    s.userWindow = saved.window;
  });
  await measure(ctx);
}

/** A store subscriber keeping the session as it stands once a fit is shown (the captures are remembered as they open). */
export function sessionKeeper(): (state: BenchState) => void {
  return (state) => {
    const capture = state.capture;
    if (!capture || !state.fit || state.busy !== null) return;
    const { componentsInput, knownPartFrom, design, userWindow } = state;
    saveSession({
      capture: { sha256: capture.sha256, channel: capture.channel, name: capture.opened.name },
      window: userWindow,
      known: knownPartFrom === 'typed' && componentsInput.knownText.trim() !== '' ? componentsInput : null,
      design: design?.origin === 'user' ? { name: design.name, path: design.path, text: design.text } : null,
    });
  };
}
