// The list of keys and gestures the `?` key shows, drawn from the one table in shortcuts.ts.

import { h } from './dom';
import { SHORTCUTS, type Shortcut } from './shortcuts';

const GROUPS: { zone: Shortcut['zone']; title: string }[] = [
  { zone: 'pointer', title: 'On the plot' },
  { zone: 'bench', title: 'Keys (outside text fields)' },
  { zone: 'menu', title: 'Commands (⌘ for Ctrl on a Mac)' },
];

/** A dialog listing every shortcut; `toggle` opens it or, when open, closes it (Escape closes it too). */
export function createShortcutList(): { root: HTMLDialogElement; toggle(): void } {
  const close = h('button', { class: 'quiet', id: 'shortcut-list-close', attrs: { type: 'button' } }, 'Close');
  const root = h(
    'dialog',
    { class: 'shortcut-list', id: 'shortcut-list', attrs: { 'aria-labelledby': 'shortcut-list-title' } },
    h('div', { class: 'shortcut-list-head' }, h('h2', { id: 'shortcut-list-title' }, 'Keys and gestures'), close),
    ...GROUPS.map(({ zone, title }) =>
      h(
        'table',
        { class: 'shortcut-table', data: { zone } },
        h('caption', {}, title),
        h('tbody', {}, ...SHORTCUTS.filter((s) => s.zone === zone).map((s) => h('tr', {}, h('th', { attrs: { scope: 'row' } }, h('kbd', {}, s.shown)), h('td', {}, s.does)))),
      ),
    ),
  );
  close.addEventListener('click', () => root.close());
  // A click on the backdrop (outside the dialog's box) closes it.
  root.addEventListener('click', (event) => {
    if (event.target === root) root.close();
  });
  return { root, toggle: () => (root.open ? root.close() : root.showModal()) };
}
