// The step's transition metrics in the fit panel: the fitted model's value ± its uncertainty beside the samples' own.

import type { TransitionSummary } from '../../core/circuit/transitionSummary';
import type { Quantity } from '../../core/quantity';
import { h } from '../dom';
import { showQuantity, showValue } from '../show';

type Metric = 'riseTime' | 'overshoot' | 'peakTime' | 'settlingTime2' | 'settlingTime5';

const METRICS: [Metric, string][] = [
  ['riseTime', 'rise time (10–90 %)'],
  ['overshoot', 'overshoot'],
  ['peakTime', 'peak time'],
  ['settlingTime2', 'settling time (2 %)'],
  ['settlingTime5', 'settling time (5 %)'],
];

/** The section's elements; a reason in place of the table when no step was measured. */
export function transitionView(transitions: TransitionSummary): HTMLElement[] {
  const heading = h('h3', {}, 'Step metrics');
  if (transitions.reason !== null || !transitions.model) {
    return [heading, h('p', { class: 'muted small', id: 'transition-reason' }, transitions.reason ?? 'No step metrics for this fit.')];
  }
  const model = transitions.model;
  const measured = transitions.measured;
  return [
    heading,
    h(
      'table',
      { class: 'verdict-table', id: 'transition-metrics' },
      h('thead', {}, h('tr', {}, h('th', {}, ''), h('th', {}, 'Model'), h('th', {}, 'Samples'))),
      h(
        'tbody',
        {},
        ...METRICS.map(([key, words]) =>
          h(
            'tr',
            { data: { metric: key } },
            h('th', { attrs: { scope: 'row' } }, words),
            h('td', { class: 'number' }, key === 'overshoot' ? percent(model.overshoot) : showQuantity(model[key])),
            h('td', { class: 'number' }, key === 'overshoot' ? percent(measured?.overshoot ?? null) : showValue(measured?.[key], 's')),
          ),
        ),
      ),
    ),
    h('p', { class: 'field-hint', id: 'level-method' }, `Levels: ${transitions.levelMethod}; times from the fitted event t₀.`),
    ...(transitions.warnings.length ? [h('ul', { class: 'warnings' }, ...transitions.warnings.map((w) => h('li', {}, w)))] : []),
  ];
}

/** An overshoot in % of the step, with its uncertainty when it has one. */
function percent(q: Quantity | number | null): string {
  if (q === null) return '—';
  const { value, stderr } = typeof q === 'number' ? { value: q, stderr: null } : q;
  return `${value.toFixed(2)} %${stderr === null ? '' : ` ± ${stderr.toPrecision(2)}`}`;
}
