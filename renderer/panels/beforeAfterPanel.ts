// Before / after: two captures of one circuit (a sample or a file each), compared in the worker by compareCaptures,
// and drawn over each other at their fitted event times.

import { button, card, field, h, replaceChildren, select, textInput } from '../dom';
import { showCompact, showValue } from '../show';
import type { Comparison, QuantityChange } from '../../core/report/comparisonText';
import type { BenchState } from '../benchState';
import type { BenchActions } from '../actions';
import { contentOf, type CaptureFile, type OverlayTrace } from '../workerProtocol';

const SYMBOLS: Record<string, string> = { alpha: 'α', omega0: 'ω₀', f0: 'f₀', zeta: 'ζ', Q: 'Q', R: 'R', L: 'L', C: 'C' };
const VERDICT_WORDS = { changed: 'Changed', 'no significant change': 'No significant change', undetermined: 'Cannot tell' } as const;

/** Draws the two compared captures over each other with their fits (renderer/plot/comparePlots.ts). */
export type OverlayDrawer = (root: HTMLElement, comparison: Comparison, overlay: { before: OverlayTrace; after: OverlayTrace }) => Promise<void>;

export function createBeforeAfterPanel(actions: BenchActions, drawOverlay: OverlayDrawer) {
  const { root, body } = card('Before / after', 'before-after-panel');
  const overlayPlot = h('div', { class: 'small-plot', id: 'compare-overlay', attrs: { 'aria-label': 'The before and after captures overlaid at their fitted event times, with their fits' } });
  // What the plot shows, and in which theme: drawn again when either changes.
  let drawn: Comparison | null = null;
  let drawnTheme = '';
  const chosen: Record<'before' | 'after', CaptureFile | null> = { before: null, after: null };
  let samplesShown = '';
  const sides = (['before', 'after'] as const).map((side) => {
    const name = h('span', { class: 'row-name', id: `${side}-name` }, 'no capture chosen');
    const sample = h('select', { id: `${side}-sample`, attrs: { 'aria-label': `${side} sample` } });
    const take = (opened: CaptureFile | null) => {
      if (!opened) return;
      chosen[side] = { name: opened.name, ...contentOf(opened) };
      name.textContent = opened.name;
    };
    sample.addEventListener('change', async () => sample.value && take(await actions.readSampleText(sample.value)));
    const file = button('File…', async () => take(await actions.pickCaptureFile()), { id: `${side}-file` });
    return { sample, row: h('div', { class: 'compare-side' }, h('span', { class: 'side-label' }, side === 'before' ? 'Before' : 'After'), sample, file, name) };
  });
  const channel = textInput('', { id: 'compare-channel', attrs: { placeholder: 'first', 'aria-label': 'Channel in both captures' } });
  let topology = 'series';
  const topologySelect = select(
    [
      { value: 'series', label: 'series R-L-C' },
      { value: 'parallel', label: 'parallel R ∥ L ∥ C' },
    ],
    topology,
    (value) => (topology = value),
    { id: 'compare-topology', attrs: { 'aria-label': 'Topology' } },
  );
  const known = textInput('', { id: 'compare-known', attrs: { placeholder: 'e.g. C=390p', 'aria-label': 'Known part, the same in both' } });
  const results = h('div', { id: 'compare-results' });
  const run = () => void actions.runComparison(chosen.before, chosen.after, { channelText: channel.value, topologyText: topology, knownText: known.value });
  body.append(
    h(
      'div',
      { class: 'desk-inputs' },
      h('p', { class: 'field-hint' }, 'Two captures of the same node, before and after a change: which quantities moved by more than their noise explains.'),
      ...sides.map((s) => s.row),
      h('div', { class: 'grid-3' }, field('Channel', channel, 'name or index'), field('Topology', topologySelect), field('Known part', known, 'optional: R, L, C too')),
      h('div', { class: 'actions' }, button('Compare', run, { id: 'run-compare', class: 'primary' })),
    ),
    h('div', { class: 'desk-outputs' }, overlayPlot, results),
  );

  function render(state: BenchState): void {
    const list = state.samples.map((s) => s.id).join(',');
    if (list !== samplesShown) {
      samplesShown = list;
      for (const { sample } of sides) {
        replaceChildren(sample, h('option', { attrs: { value: '' } }, 'a sample…'), ...state.samples.map((s) => h('option', { attrs: { value: s.id }, title: s.description }, s.file)));
      }
    }
    overlayPlot.hidden = !state.comparisonOverlay;
    const theme = document.documentElement.dataset.theme ?? '';
    if (state.comparison !== drawn || theme !== drawnTheme) {
      drawn = state.comparison;
      drawnTheme = theme;
      if (drawn && state.comparisonOverlay) void drawOverlay(overlayPlot, drawn, state.comparisonOverlay);
    }
    if (state.comparisonError) return replaceChildren(results, h('p', { class: 'error-text', id: 'compare-error' }, state.comparisonError));
    replaceChildren(results, ...(state.comparison ? comparisonView(state.comparison) : []));
  }

  return { root, render };
}

function comparisonView(comparison: Comparison): (HTMLElement | null)[] {
  const tone = comparison.verdict === 'changed' ? 'moved' : comparison.verdict === 'undetermined' ? 'warn' : 'ok';
  return [
    h('p', { class: `change-verdict ${tone}`, id: 'compare-verdict', data: { verdict: comparison.verdict } }, VERDICT_WORDS[comparison.verdict]),
    h('p', { class: 'small', id: 'compare-reason' }, `Why: ${comparison.reason}.`),
    comparison.quantities.length
      ? h(
          'table',
          { class: 'verdict-table', id: 'compare-table' },
          h('thead', {}, h('tr', {}, h('th', {}, 'Quantity'), h('th', {}, 'Before'), h('th', {}, 'After'), h('th', {}, 'Change ± u'), h('th', {}, 'σ'), h('th', {}, 'Significant'))),
          h('tbody', {}, ...comparison.quantities.map(changeRow)),
        )
      : null,
    h('ul', { class: 'notes' }, ...comparison.notes.map((n) => h('li', {}, n))),
  ];
}

function changeRow(q: QuantityChange): HTMLTableRowElement {
  const { difference } = q;
  const change = `${showValue(difference.value, difference.unit)}${difference.stderr === null ? '' : ` ± ${showValue(difference.stderr, difference.unit, 2)}`}`;
  const relative = q.relative === null ? '' : ` (${q.relative >= 0 ? '+' : ''}${(q.relative * 100).toPrecision(2)} %)`;
  return h(
    'tr',
    { data: { quantity: q.name, significant: String(q.significant) }, class: q.significant ? 'out' : '' },
    h('th', { attrs: { scope: 'row' } }, SYMBOLS[q.name] ?? q.name),
    h('td', { class: 'number' }, showCompact(q.before)),
    h('td', { class: 'number' }, showCompact(q.after)),
    h('td', { class: 'number' }, change + relative),
    h('td', { class: 'number' }, q.sigmas === null ? '—' : q.sigmas.toFixed(1)),
    h('td', { class: q.significant === null ? 'muted' : q.significant ? 'fail' : 'pass' }, q.significant === null ? 'unknown' : q.significant ? 'yes' : 'no'),
  );
}
