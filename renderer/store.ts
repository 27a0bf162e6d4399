// The window's one state and its one render subscription: actions change it through `update`, panels draw it.

import type { BenchState } from './benchState';

export interface Store {
  readonly state: BenchState;
  /** Apply a change (if any) and draw every subscriber on the next frame, once however many updates came. */
  update(change?: (state: BenchState) => void): void;
  subscribe(draw: (state: BenchState) => void): void;
}

export function createStore(state: BenchState, nextFrame: (run: () => void) => void): Store {
  const subscribers: ((state: BenchState) => void)[] = [];
  let queued = false;
  return {
    state,
    update(change) {
      change?.(state);
      if (queued) return;
      queued = true;
      nextFrame(() => {
        queued = false;
        for (const draw of subscribers) draw(state);
      });
    },
    subscribe(draw) {
      subscribers.push(draw);
    },
  };
}
