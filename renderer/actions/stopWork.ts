// The stop button: a long fit (or extraction, or comparison) is ended by replacing the fit worker; the capture shown stays
// open in the fresh worker, so a new window or the automatic one refits it.

import type { ActionContext } from './context';

/** What the fit panel says after a stop, where the fit would be. */
export const STOPPED_FIT = 'Fit stopped. Drag the window edges on the plot, type a window, or press Automatic to fit again.';

export function stopWork(ctx: ActionContext): void {
  if (!ctx.client.busy) return;
  const fitting = ctx.store.state.capture !== null && ctx.store.state.fit === null;
  ctx.client.cancelAll(true);
  ctx.store.update((s) => {
    if (fitting) s.fitError = STOPPED_FIT;
    s.busy = null;
  });
}
