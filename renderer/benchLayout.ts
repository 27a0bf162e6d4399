// Where each panel sits: the plot with the verdict under it and the fit's readout beside it, so both show without
// scrolling on a laptop screen; the work over several captures (extraction, before / after) and the log get the full width below.

import { h } from './dom';

/** The panels' root elements, by their place on the bench. */
export interface BenchParts {
  topBar: HTMLElement;
  banner: HTMLElement;
  plot: HTMLElement;
  design: HTMLElement;
  capture: HTMLElement;
  components: HTMLElement;
  fit: HTMLElement;
  cautions: HTMLElement;
  extraction: HTMLElement;
  beforeAfter: HTMLElement;
  log: HTMLElement;
}

export function arrangeBench(app: HTMLElement, parts: BenchParts): void {
  app.replaceChildren(
    parts.topBar,
    parts.banner,
    h(
      'main',
      { class: 'bench' },
      h(
        'div',
        { class: 'bench-grid' },
        h('div', { class: 'primary-column' }, parts.plot, parts.design, h('div', { class: 'pair' }, parts.capture, parts.components)),
        h('div', { class: 'readout-column' }, parts.fit, parts.cautions),
      ),
      h('div', { class: 'desk', attrs: { 'aria-label': 'Work over several captures, and the bench log' } }, parts.extraction, parts.beforeAfter, parts.log),
    ),
  );
}
