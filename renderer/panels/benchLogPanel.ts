// The bench log panel: unit, operator and note; add this measurement; the logged units; export a report.

import { button, card, field, h, replaceChildren, select, textInput } from '../dom';
import { showValue } from '../show';
import { hertz } from '../../core/report/resultRows';
import type { BenchState } from '../benchState';
import type { BenchActions } from '../actions';
import type { ReportFormat } from '../bridgeTypes';

const SHOWN = 12;

export function createBenchLogPanel(actions: BenchActions) {
  const { root, body } = card('Bench log', 'log-panel');
  const unit = textInput('', { id: 'log-unit', attrs: { placeholder: 'serial number or name' } });
  const operator = textInput('', { id: 'log-operator' });
  const note = h('textarea', { id: 'log-note', attrs: { rows: '2', placeholder: 'what was changed, probe used, …' } });
  const message = h('p', { id: 'log-message', attrs: { role: 'status' } });
  const add = button(
    'Add this measurement',
    async () => {
      add.disabled = true;
      const ok = await actions.logMeasurement({ unit: unit.value, operator: operator.value, note: note.value });
      add.disabled = false;
      if (ok) note.value = '';
    },
    { id: 'log-add', class: 'primary' },
  );
  let format: ReportFormat = 'html';
  const formatSelect = select(
    [
      { value: 'html', label: 'HTML report' },
      { value: 'md', label: 'Markdown report' },
      { value: 'csv', label: 'CSV table' },
    ],
    'html',
    (value) => (format = value as ReportFormat),
    { id: 'report-format', attrs: { 'aria-label': 'Report format' } },
  );
  const exportButton = button('Export report…', () => void actions.exportReport(format), { id: 'export-report', title: 'Save the whole bench log as a report (Ctrl+S)' });
  const list = h('div', { id: 'log-list' });
  body.append(
    h('div', { class: 'grid-2' }, field('Unit under test', unit), field('Operator', operator)),
    field('Note', note),
    h('div', { class: 'actions' }, add, formatSelect, exportButton),
    message,
    list,
  );

  function render(state: BenchState): void {
    add.disabled = !state.summary;
    message.className = state.logError ? 'error-text' : 'muted small';
    message.textContent = state.logError ?? state.logMessage ?? '';
    const log = state.log;
    exportButton.disabled = !log || log.records.length === 0;
    if (!log) return replaceChildren(list);
    const records = [...log.records].reverse().slice(0, SHOWN);
    replaceChildren(
      list,
      h('p', { class: 'fineprint', id: 'log-path', title: log.path }, `${log.records.length} measurement${log.records.length === 1 ? '' : 's'} in ${log.path.split(/[\\/]/).pop()}`),
      ...log.notes.map((n) => h('p', { class: 'warning-text small' }, n)),
      records.length
        ? h(
            'table',
            { class: 'log-table' },
            h('thead', {}, h('tr', {}, h('th', {}, 'Unit'), h('th', {}, 'Capture'), h('th', {}, 'f₀'), h('th', {}, 'Q'), h('th', {}, 'Design'))),
            h(
              'tbody',
              {},
              ...records.map((r) =>
                h(
                  'tr',
                  { data: { record: r.id }, title: `${r.time}${r.operator ? ` by ${r.operator}` : ''}${r.note ? ` — ${r.note}` : ''}` },
                  h('td', {}, r.unit),
                  h('td', { class: 'clip' }, r.capture.path.split(/[\\/]/).pop() ?? r.capture.path),
                  h('td', { class: 'number' }, showValue(hertz(r.fit.omega0).value, 'Hz')),
                  h('td', { class: 'number' }, showValue(r.fit.Q.value, '', 3)),
                  h('td', { class: r.verdict ? (r.verdict.pass ? 'pass' : 'fail') : 'muted' }, r.verdict ? (r.verdict.pass ? 'in' : 'out') : '—'),
                ),
              ),
            ),
          )
        : h('p', { class: 'muted' }, 'Nothing logged yet.'),
    );
  }

  return { root, render };
}
