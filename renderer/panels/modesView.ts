// The ringing modes in the fit panel: how many and why, a choice of the number, each mode's table row, and the mode R, L and C are for.

import type { FitSummary } from '../../core/report/fitSummary';
import { hertz, modelOrderText } from '../../core/report/resultRows';
import { MAX_RINGING_MODES } from '../../core/workflow/userValues';
import { h, select } from '../dom';
import { relativeUncertainty, type Quantity } from '../../core/quantity';
import { showQuantity, showValue } from '../show';

/** What the section does when a choice changes: refit with this many modes (null: from the data), or derive R, L, C for another mode. */
export interface ModeChoices {
  setModes(modes: number | null): void;
  chooseMode(mode: number): void;
}

/** Value of the order choice that lets the data decide. */
const FROM_DATA = 'auto';

/** The section's elements; none for a fit without a ring (a single decay, a failure). */
export function modesView(summary: FitSummary, asked: number | null, chosenMode: number | null, choices: ModeChoices): HTMLElement[] {
  const modes = summary.modes ?? [];
  if (modes.length === 0 && asked === null) return [];
  const orderChoice = select(
    [{ value: FROM_DATA, label: 'from the data' }, ...Array.from({ length: MAX_RINGING_MODES }, (_, i) => ({ value: String(i + 1), label: `${i + 1}` }))],
    asked === null ? FROM_DATA : String(asked),
    (value) => choices.setModes(value === FROM_DATA ? null : Number(value)),
    { id: 'modes-select', attrs: { 'aria-label': 'Number of ringing modes to fit' } },
  );
  const order = modelOrderText(summary);
  const elements: HTMLElement[] = [
    h('h3', {}, 'Ringing modes'),
    h(
      'p',
      { class: 'small', id: 'modes-order', data: { modes: String(modes.length) } },
      order ? `${order}. ` : '',
      h('label', { class: 'unit-choice' }, h('span', {}, 'Modes'), orderChoice),
    ),
  ];
  if (modes.length > 1) elements.push(modesTable(summary, chosenMode ?? 1, choices));
  if (summary.slowTerm) {
    elements.push(
      h('p', { class: 'small', id: 'modes-slow-term' }, `On a slow term: τ ${showQuantity(summary.slowTerm.tau)}, amplitude ${showQuantity(summary.slowTerm.amplitude)} at t₀.`),
    );
  }
  return elements;
}

/** A value over its relative standard error, so that the table fits the panel; the full 'value ± stderr' in its title. */
function cell(q: Quantity): HTMLElement {
  const share = q.stderr === null ? null : relativeUncertainty(q);
  const relative = q.stderr === null ? 'no error estimate' : share === null ? `± ${showValue(q.stderr, q.unit, 2)}` : `± ${(100 * share).toPrecision(2)} %`;
  return h('td', { class: 'number', title: showQuantity(q) }, showValue(q.value, q.unit), h('span', { class: 'mode-error' }, relative));
}

/** One row per mode, dominant first, its colour as on the plot; the mode R, L and C are for is marked and can be changed. */
function modesTable(summary: FitSummary, chosen: number, choices: ModeChoices): HTMLElement {
  const modes = summary.modes ?? [];
  const partsChoice = select(
    modes.map((m, i) => ({ value: String(i + 1), label: `mode ${i + 1} (${showValue(hertz(m.omega0).value, 'Hz')})` })),
    String(chosen),
    (value) => choices.chooseMode(Number(value)),
    { id: 'mode-select', attrs: { 'aria-label': 'Ringing mode R, L and C are derived for' } },
  );
  const head = ['#', 'f₀', 'ζ', 'Q', 'amplitude', 'energy'];
  return h(
    'div',
    { id: 'modes' },
    h(
      'table',
      { class: 'verdict-table', id: 'modes-table' },
      h('thead', {}, h('tr', {}, ...head.map((text) => h('th', {}, text)))),
      h(
        'tbody',
        {},
        ...modes.map((m, i) =>
          h(
            'tr',
            { class: i + 1 === chosen ? 'chosen' : '', data: { mode: String(i + 1), f0: String(hertz(m.omega0).value), energy: String(m.energyShare) } },
            h('th', { attrs: { scope: 'row' } }, h('span', { class: `mode-swatch mode-${i + 1}`, attrs: { 'aria-hidden': 'true' } }), String(i + 1)),
            cell(hertz(m.omega0)),
            cell(m.zeta),
            cell(m.Q),
            cell(m.amplitude),
            h('td', { class: 'number' }, `${+(m.energyShare * 100).toPrecision(3)} %`),
          ),
        ),
      ),
    ),
    h('p', { class: 'small' }, h('label', { class: 'unit-choice' }, h('span', {}, 'R, L, C for'), partsChoice)),
  );
}
