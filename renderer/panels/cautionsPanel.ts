// The cautions: shown whenever a rule fires, with the standing advice and the pointer to local codes.

import { card, h, replaceChildren } from '../dom';
import type { BenchState } from '../benchState';
import { cautionView } from './cautionView';

export function createCautionsPanel() {
  const { root, body } = card('Cautions', 'cautions-panel');
  root.classList.add('cautions');

  function render(state: BenchState): void {
    const result = state.cautions;
    root.classList.toggle('firing', (result?.fired.length ?? 0) > 0);
    if (!result) return replaceChildren(body, h('p', { class: 'muted' }, 'Cautions are checked once a capture is open.'));
    replaceChildren(body, ...cautionView(result, 'cautions'));
  }

  return { root, render };
}
