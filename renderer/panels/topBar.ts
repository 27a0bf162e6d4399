// The bar across the top: the capture's name, what is running (for how long, with a stop button), the cautions' count,
// the plot exports and the theme switch.

import { button, h, replaceChildren } from '../dom';
import type { BenchState } from '../benchState';
import type { BenchActions } from '../actions';

export function createTopBar(actions: BenchActions, toggleTheme: () => void) {
  const title = h('span', { class: 'capture-title', id: 'capture-title' });
  const progress = h('div', { class: 'progress', id: 'progress', attrs: { role: 'status', 'aria-live': 'polite' } });
  const stop = button('Stop', () => actions.stopWork(), { id: 'stop-work', class: 'stop', title: 'Stop the fit that is running (the capture stays open)' });
  const elapsed = h('span', { class: 'elapsed', id: 'progress-elapsed' });
  const cautionsChip = h('a', { class: 'cautions-chip', id: 'cautions-chip', attrs: { href: '#cautions-panel' } });
  let busySince: number | null = null;
  let ticker: number | undefined;
  const showElapsed = () => {
    const seconds = busySince === null ? 0 : Math.floor((performance.now() - busySince) / 1000);
    // A quick step shows no clock; one running a second or more shows the time spent so far.
    elapsed.textContent = seconds >= ELAPSED_SHOWN_FROM_S ? `${seconds} s` : '';
  };
  const themeButton = button('Dark theme', toggleTheme, { id: 'theme-toggle', class: 'quiet', title: 'Switch between the light and the dark theme (Ctrl+Shift+L)' });
  const root = h(
    'header',
    { class: 'topbar' },
    h('div', { class: 'brand' }, h('span', { class: 'mark', attrs: { 'aria-hidden': 'true' } }), h('span', { class: 'name' }, 'Ringbench')),
    title,
    // The step's name alone in #progress (what tests and screen readers read); its running time and the stop button beside it.
    h('div', { class: 'activity' }, progress, elapsed, stop),
    cautionsChip,
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
    if (state.busy !== null && busySince === null) {
      busySince = performance.now();
      ticker = window.setInterval(showElapsed, 1000);
    } else if (state.busy === null && busySince !== null) {
      busySince = null;
      window.clearInterval(ticker);
    }
    showElapsed();
    stop.hidden = state.busy === null;
    const fired = state.cautions?.fired.length ?? 0;
    cautionsChip.hidden = fired === 0;
    cautionsChip.textContent = `${fired} caution${fired === 1 ? '' : 's'}`;
    cautionsChip.title = 'High voltage or stored energy: see the cautions panel';
    themeButton.textContent = document.documentElement.dataset.theme === 'dark' ? 'Light theme' : 'Dark theme';
    banner.hidden = state.error === null;
    replaceChildren(banner, state.error ? h('span', { id: 'error-text' }, state.error) : null, state.error ? button('Dismiss', () => actions.dismissError(), { class: 'quiet' }) : null);
  }

  return { root, banner, render };
}

/** A step shorter than this shows only its name; a longer one shows its running time too. */
const ELAPSED_SHOWN_FROM_S = 1;
