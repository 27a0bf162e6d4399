// The bench log panel: unit, operator and note; add this measurement; the logged units, each with a change
// form to amend its labels or withdraw it (kept in the log as a correction with its reason); export a report.

import { button, card, field, h, replaceChildren, select, textInput } from '../dom';
import { showValue } from '../show';
import { hertz } from '../../core/report/resultRows';
import type { BenchState } from '../benchState';
import type { BenchRecord } from '../../core/report/benchRecord';
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
  const change = createChangeForm(actions);
  body.append(
    h('div', { class: 'grid-2' }, field('Unit under test', unit), field('Operator', operator)),
    field('Note', note),
    h('div', { class: 'actions' }, add, formatSelect, exportButton),
    message,
    list,
    change.root,
  );

  function render(state: BenchState): void {
    add.disabled = !state.summary;
    message.className = state.logError ? 'error-text' : 'muted small';
    message.textContent = state.logError ?? state.logMessage ?? '';
    const log = state.log;
    exportButton.disabled = !log || log.records.length === 0;
    change.render(log?.records ?? []);
    if (!log) return replaceChildren(list);
    const records = [...log.records].reverse().slice(0, SHOWN);
    const amended = new Set(log.amended ?? []);
    const withdrawn = log.withdrawn ?? [];
    replaceChildren(
      list,
      h('p', { class: 'fineprint', id: 'log-path', title: log.path }, `${log.records.length} measurement${log.records.length === 1 ? '' : 's'} in ${log.path.split(/[\\/]/).pop()}`),
      ...log.notes.map((n) => h('p', { class: 'warning-text small' }, n)),
      records.length
        ? h(
            'table',
            { class: 'log-table' },
            h('thead', {}, h('tr', {}, h('th', {}, 'Unit'), h('th', {}, 'Capture'), h('th', {}, 'f₀'), h('th', {}, 'Q'), h('th', {}, 'Design'), h('th', {}))),
            h(
              'tbody',
              {},
              ...records.map((r) =>
                h(
                  'tr',
                  { data: { record: r.id }, title: `${r.time}${r.operator ? ` by ${r.operator}` : ''}${r.note ? ` — ${r.note}` : ''}` },
                  h('td', {}, r.unit, amended.has(r.id) ? h('span', { class: 'log-tag', title: 'labels amended; the change and its reason are kept in the log' }, 'amended') : null),
                  h('td', { class: 'clip' }, r.capture.path.split(/[\\/]/).pop() ?? r.capture.path),
                  h('td', { class: 'number' }, showValue(hertz(r.fit.omega0).value, 'Hz')),
                  h('td', { class: 'number' }, showValue(r.fit.Q.value, '', 3)),
                  h('td', { class: r.verdict ? (r.verdict.pass ? 'pass' : 'fail') : 'muted' }, r.verdict ? (r.verdict.pass ? 'in' : 'out') : '—'),
                  h('td', {}, button('Change…', () => change.open(r), { id: `log-change-${r.id}`, class: 'small', title: 'amend the unit, operator or note, or withdraw this measurement' })),
                ),
              ),
            ),
          )
        : h('p', { class: 'muted' }, 'Nothing logged yet.'),
      withdrawn.length
        ? h(
            'ul',
            { id: 'log-withdrawn', class: 'log-withdrawn small' },
            ...withdrawn.map((w) =>
              h('li', { data: { record: w.record.id }, title: `withdrawn ${w.time}` }, h('s', {}, `${w.record.unit}, ${w.record.time.slice(0, 16).replace('T', ' ')}`), ` withdrawn: ${w.reason}`),
            ),
          )
        : null,
    );
  }

  return { root, render };
}

/** The form that amends or withdraws one logged measurement; hidden until a row's Change button opens it. */
function createChangeForm(actions: BenchActions) {
  let editing: BenchRecord | null = null;
  const title = h('h3', { id: 'log-change-title' });
  const unit = textInput('', { id: 'log-change-unit' });
  const operator = textInput('', { id: 'log-change-operator' });
  const note = textInput('', { id: 'log-change-note' });
  const reason = textInput('', { id: 'log-change-reason', attrs: { placeholder: 'why: kept in the log with the change' } });
  const submit = async (action: 'amend' | 'withdraw') => {
    if (!editing) return;
    amend.disabled = withdraw.disabled = true;
    const done = await actions.correctLogEntry(editing, { unit: unit.value, operator: operator.value, note: note.value, reason: reason.value }, action);
    amend.disabled = withdraw.disabled = false;
    if (done) close();
  };
  const amend = button('Save amendment', () => void submit('amend'), { id: 'log-amend', class: 'primary' });
  const withdraw = button('Withdraw measurement', () => void submit('withdraw'), { id: 'log-withdraw', class: 'danger', title: 'it stays in the log, marked withdrawn, and leaves the yield and the reports' });
  const cancel = button('Cancel', () => close(), { id: 'log-change-cancel' });
  const root = h(
    'div',
    { id: 'log-change', class: 'log-change', attrs: { hidden: '' } },
    title,
    h('div', { class: 'grid-2' }, field('Unit under test', unit), field('Operator', operator)),
    field('Note', note),
    field('Reason', reason),
    h('div', { class: 'actions' }, amend, withdraw, cancel),
  );

  function open(record: BenchRecord): void {
    editing = record;
    title.textContent = `Change the measurement of ${record.unit} (${record.time.slice(0, 16).replace('T', ' ')}, record ${record.id})`;
    unit.value = record.unit;
    operator.value = record.operator ?? '';
    note.value = record.note ?? '';
    reason.value = '';
    root.hidden = false;
    reason.focus();
  }

  function close(): void {
    editing = null;
    root.hidden = true;
  }

  /** Closes the form when its measurement is no longer standing (withdrawn, or another log shown). */
  function render(records: readonly BenchRecord[]): void {
    if (editing && !records.some((r) => r.id === editing!.id)) close();
  }

  return { root, open, render };
}
