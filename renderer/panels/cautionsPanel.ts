// The cautions: shown whenever a rule fires, with the standing advice and the pointer to local codes; folded to the
// quantities, thresholds and sources alone when the user wants the room (the deferral stays).

import { button, card, h, replaceChildren } from '../dom';
import type { BenchState } from '../benchState';
import { cautionView } from './cautionView';

export function createCautionsPanel() {
  const fold = button('Fold', () => setFolded(!root.classList.contains('folded')), {
    id: 'cautions-fold',
    class: 'quiet fold',
    attrs: { 'aria-expanded': 'true', 'aria-controls': 'cautions-panel' },
    title: 'Show only the quantities, their thresholds and sources',
  });
  const { root, body } = card('Cautions', 'cautions-panel', fold);
  root.classList.add('cautions');

  function setFolded(folded: boolean): void {
    root.classList.toggle('folded', folded);
    fold.textContent = folded ? 'Unfold' : 'Fold';
    fold.setAttribute('aria-expanded', String(!folded));
  }

  function render(state: BenchState): void {
    const result = state.cautions;
    const firing = (result?.fired.length ?? 0) > 0;
    root.classList.toggle('firing', firing);
    fold.hidden = !firing;
    if (!result) return replaceChildren(body, h('p', { class: 'muted' }, 'Cautions are checked once a capture is open.'));
    replaceChildren(body, ...cautionView(result, 'cautions'));
  }

  return { root, render };
}
