// Several events in one record, in the fit panel: which one the fit is of, a choice of another, each event, and their combination.

import type { EventTrainSummary, SpreadTest } from '../../core/report/eventTrainSummary';
import { hertz } from '../../core/report/resultRows';
import { h, select } from '../dom';
import { showCompact, showValue } from '../show';

/** The section's elements; `choose` fits another event. */
export function eventsView(events: EventTrainSummary, choose: (event: number) => void): HTMLElement[] {
  const how = events.chosenBy === 'request' ? 'as chosen' : 'the first complete one';
  const choice = select(
    events.list.map((e) => ({ value: String(e.index), label: `event ${e.index} at ${showValue(e.onset, 's')}` })),
    String(events.chosen),
    (value) => choose(Number(value)),
    { id: 'event-select', attrs: { 'aria-label': 'Event to fit' } },
  );
  return [
    h('h3', {}, 'Events'),
    h('p', { class: 'small', id: 'events-summary' }, `${events.list.length} in the record; the fit above is of event ${events.chosen} (${how}). `, h('label', { class: 'unit-choice' }, h('span', {}, 'Fit'), choice)),
    h(
      'table',
      { class: 'verdict-table', id: 'events-table' },
      h('thead', {}, h('tr', {}, h('th', {}, '#'), h('th', {}, 'From'), h('th', { class: 'text' }, 'Seen'), h('th', {}, 'f₀'), h('th', {}, 'ζ'))),
      h(
        'tbody',
        {},
        ...events.list.map((e) =>
          h(
            'tr',
            { class: e.index === events.chosen ? 'chosen' : '', data: { event: String(e.index), status: e.status } },
            h('th', { attrs: { scope: 'row' } }, String(e.index)),
            h('td', { class: 'number' }, showValue(e.onset, 's')),
            h('td', {}, e.complete ? 'complete' : e.hasOnset ? 'incomplete' : 'under way at the start'),
            ...(e.status === 'converged' && e.omega0 && e.zeta
              ? [h('td', { class: 'number' }, showCompact(hertz(e.omega0))), h('td', { class: 'number' }, showCompact(e.zeta))]
              : [h('td', { class: 'attention', attrs: { colspan: '2' }, title: e.message }, e.status)]),
          ),
        ),
      ),
    ),
    combinedView(events),
  ];
}

/** The inverse-variance combination of the complete events and the test of their spread, or why there is none. */
function combinedView(events: EventTrainSummary): HTMLElement {
  const c = events.combined;
  if (!c) return h('p', { class: 'muted small', id: 'events-combined' }, `Combined: ${events.combinedNote}`);
  const spread = (name: string, s: SpreadTest) => `${name} χ² ${s.chiSquare.toFixed(2)} over ${s.dof} (p ${s.pValue.toPrecision(2)})`;
  const consistent = c.status === 'converged';
  return h(
    'p',
    { class: `small ${consistent ? '' : 'error-text'}`, id: 'events-combined', data: { status: c.status } },
    `Combined over events ${c.events.join(', ')}: `,
    consistent ? `f₀ ${showCompact(hertz(c.omega0))}, ζ ${showCompact(c.zeta)}, Q ${showCompact(c.Q)}. ` : `${c.message}. `,
    h('span', { class: 'muted' }, `Spread: ${spread('α', c.consistency.alpha)}, ${spread('ω₀', c.consistency.omega0)}.`),
  );
}
