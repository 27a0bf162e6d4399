// The bar across the top: the capture's name, what is running, the plot exports and the theme switch.

import { button, h, replaceChildren } from '../dom';
import type { BenchState } from '../benchState';
import type { BenchActions } from '../actions';

export function createTopBar(actions: BenchActions, toggleTheme: () => void) {
  const title = h('span', { class: 'capture-title', id: 'capture-title' });
  const progress = h('div', { class: 'progress', id: 'progress', attrs: { role: 'status', 'aria-live': 'polite' } });
  const themeButton = button('Dark theme', toggleTheme, { id: 'theme-toggle', class: 'quiet', title: 'Switch between the light and the dark theme (Ctrl+Shift+L)' });
  const root = h(
    'header',
    { class: 'topbar' },
    h('div', { class: 'brand' }, h('span', { class: 'mark', attrs: { 'aria-hidden': 'true' } }), h('span', { class: 'name' }, 'Ringbench')),
    title,
    progress,
    h(
      'div',
      { class: 'topbar-actions' },
      button('Open capture…', () => void actions.pickCapture(), { id: 'open-capture-top', class: 'quiet', title: 'Ctrl+O' }),
      button('Export PNG', () => void actions.exportPlot('png'), { id: 'export-png', class: 'quiet', title: 'Save the plot as an image (Ctrl+E)' }),
      button('Export SVG', () => void actions.exportPlot('svg'), { id: 'export-svg', class: 'quiet', title: 'Save the plot as a vector drawing (Ctrl+Shift+E)' }),
      themeButton,
    ),
  );
  const banner = h('div', { class: 'error-banner', id: 'error-banner', attrs: { role: 'alert' } });

  function render(state: BenchState): void {
    title.textContent = state.capture ? state.capture.opened.name : '';
    root.classList.toggle('busy', state.busy !== null);
    replaceChildren(progress, state.busy ? h('span', { class: 'spinner', attrs: { 'aria-hidden': 'true' } }) : null, state.busy ? `${state.busy}…` : '');
    themeButton.textContent = document.documentElement.dataset.theme === 'dark' ? 'Light theme' : 'Dark theme';
    banner.hidden = state.error === null;
    replaceChildren(banner, state.error ? h('span', { id: 'error-text' }, state.error) : null, state.error ? button('Dismiss', () => actions.dismissError(), { class: 'quiet' }) : null);
  }

  return { root, banner, render };
}
