// The fit panel: regime, the fit rows of fitResultRows with uncertainties, the ringing modes, the step metrics, and the fit window.

import { button, card, field, h, replaceChildren, textInput } from '../dom';
import { quantityRow, showValue } from '../show';
import { fitResultRows, hertz } from '../../core/report/resultRows';
import { parseSigned } from '../parseInputs';
import { plainMessage } from '../plainMessage';
import type { BenchState } from '../benchState';
import { fitStanding } from '../fitStanding';
import { eventsView } from './eventsView';
import { modesView } from './modesView';
import { setupChecksView, setupOptionsForm } from './setupChecksView';
import { transitionView } from './transitionView';
import type { BenchActions } from '../actions';
import type { UnitRefusal } from '../workerProtocol';
import { rangeDigits } from '../../core/units/format';

/** Significant digits of the fit window's fields near zero (a window typed there keeps its own). */
const WINDOW_DIGITS = 6;
/** The window's words for each row of fitResultRows (its name and symbol come from there). */
const WORDS: Record<string, [symbol: string, words: string, title?: string]> = {
  // Short enough to show whole in the readout at 1280 px; the title gives the longer name.
  alpha: ['α', 'damping rate', 'damping rate (neper frequency): the envelope falls as e^(−αt)'],
  omega0: ['ω₀', 'natural frequency'],
  omegaD: ['ω_d', 'ring frequency'],
  f0: ['f₀', 'natural frequency'],
  zeta: ['ζ', 'damping ratio'],
  Q: ['Q', 'quality factor'],
  finalValue: ['y∞', 'final value'],
  t0: ['t₀', 'event time'],
  tau: ['τ', 'time constant'],
};

/** t0's words for a fit that saw no samples before its event: where the fit starts, not an event time. */
const NO_EVENT_T0: [string, string, string] = ['t₀', 'fit start', 'no samples before the event: the fit starts at its first sample'];

/** What the capture panel asks for, by what a refused capture was refused for. */
const REFUSED_FOR: Record<UnitRefusal['unit'], string> = { time: 'time unit', value: 'value unit', interval: 'sample interval' };

export function createFitPanel(actions: BenchActions) {
  const { root, body } = card('Fit', 'fit-panel');
  const status = h('div', { class: 'fit-status', id: 'fit-status', attrs: { role: 'status' } });
  const table = h('table', { class: 'results', id: 'fit-results' });
  const startInput = textInput('', { id: 'window-start', attrs: { 'aria-label': 'Fit window start' } });
  const endInput = textInput('', { id: 'window-end', attrs: { 'aria-label': 'Fit window end' } });
  const windowNote = h('p', { class: 'field-note' });
  const apply = () => {
    try {
      const start = parseSigned(startInput.value, 's', 'window start');
      const end = parseSigned(endInput.value, 's', 'window end');
      if (!(end > start)) throw new Error('the window must end after it starts');
      windowNote.textContent = '';
      void actions.setWindow({ start, end });
    } catch (error) {
      windowNote.textContent = plainMessage(error);
    }
  };
  const windowRow = h(
    'div',
    { class: 'window-row' },
    field('Window from', startInput),
    field('to', endInput),
    button('Refit', apply, { id: 'apply-window' }),
    button('Automatic', () => void actions.setWindow({}), { id: 'auto-window', title: 'Let the fit find the window from the data' }),
  );
  for (const input of [startInput, endInput]) input.addEventListener('keydown', (e) => e.key === 'Enter' && apply());
  const copyNote = h('span', { class: 'field-note', id: 'copy-note', attrs: { role: 'status' } });
  const copyRow = h(
    'div',
    { class: 'copy-row', id: 'copy-row' },
    button('Copy as text', () => void actions.copyResults('text'), { id: 'copy-text', class: 'quiet', title: 'The results as the command line prints them' }),
    button('Copy CSV row', () => void actions.copyResults('csv'), { id: 'copy-csv', class: 'quiet', title: 'A header and one row, SI base units, for a spreadsheet' }),
    button('Copy plot', () => void actions.copyPlot(), { id: 'copy-plot', class: 'quiet', title: 'The plot as an image, captioned with the file, channel and fit' }),
    copyNote,
  );
  const extra = h('div', { class: 'details' });
  const steps = h('div', { id: 'transitions' });
  const eventList = h('div', { id: 'events' });
  const modeList = h('div', { id: 'modes-section' });
  const setupList = h('div', { id: 'setup-checks' });
  const modeChoices = { setModes: (modes: number | null) => void actions.setModes(modes), chooseMode: (mode: number) => void actions.chooseMode(mode) };
  body.append(status, setupList, table, copyRow, modeList, eventList, steps, h('h3', {}, 'Fit window'), h('p', { class: 'field-hint' }, 'Drag the edges of the shaded region on the plot, or type the times.'), windowRow, windowNote, setupOptionsForm((setup) => void actions.setSetup(setup)), extra);

  /** The window in the fields, unless one is being typed in; without ends, the fields are emptied. */
  function showWindow(start: number | undefined, end: number | undefined): void {
    if (document.activeElement === startInput || document.activeElement === endInput) return;
    if (start === undefined || end === undefined) {
      startInput.value = '';
      endInput.value = '';
      return;
    }
    // Digits enough to tell the ends apart on an axis far from zero, where 6 read both as '1.2345ks'.
    const digits = rangeDigits(start, end, WINDOW_DIGITS);
    startInput.value = showValue(start, 's', digits).replace(/\s/g, '');
    endInput.value = showValue(end, 's', digits).replace(/\s/g, '');
  }

  function render(state: BenchState): void {
    const { fit, summary, fitError } = state;
    root.dataset.fitCount = String(state.fitCount);
    copyRow.hidden = !summary;
    copyNote.textContent = state.copied ?? '';
    if (!fit || !summary) {
      const idle = state.refused ? `${state.refused.opened.name} was not read: state its ${REFUSED_FOR[state.refused.refusal.unit]} in the capture panel.` : 'Open a capture to fit it.';
      replaceChildren(status, fitError ? h('p', { class: 'error-text' }, fitError) : h('p', { class: 'muted' }, state.capture ? 'Fitting…' : idle));
      table.replaceChildren();
      eventList.replaceChildren();
      modeList.replaceChildren();
      setupList.replaceChildren();
      steps.replaceChildren();
      extra.replaceChildren();
      // Without a fit, the window typed for this capture, if any; never the last capture's.
      showWindow(state.userWindow.start, state.userWindow.end);
      return;
    }
    const standing = fitStanding(summary, state.capture?.info.warnings ?? [], state.setupChecks);
    const [firstDoubt, ...otherDoubts] = standing.doubts;
    replaceChildren(
      status,
      h(
        'div',
        { class: 'fit-standing' },
        h('span', { class: `badge ${standing.tone}`, id: 'fit-state', data: { status: fit.status, tone: standing.tone } }, standing.label),
        standing.showRegime ? h('span', { class: 'regime', id: 'fit-regime', data: { regime: fit.regime } }, fit.regime) : null,
      ),
      // The solver's message explains a failed fit; beside a setup check's refusal (a converged fit) it would only confuse.
      standing.tone === 'bad' && fit.status !== 'converged' && summary.message !== standing.label ? h('p', { class: 'error-text', id: 'fit-message' }, summary.message) : null,
      firstDoubt ? h('p', { class: `first-warning ${standing.tone}`, id: 'fit-first-warning' }, firstDoubt, otherDoubts.length ? h('span', { class: 'muted' }, ` (${otherDoubts.length} more below)`) : null) : null,
      standing.showRegime ? h('p', { class: 'muted small' }, fit.regimeEvidence) : null,
    );
    // R, L and C are shown in the components panel.
    const rows = fitResultRows(summary).filter((row) => WORDS[row.name]);
    const ringHz = summary.omegaD ? quantityRow('fd', 'f_d', 'ring frequency', hertz(summary.omegaD)) : null;
    table.classList.toggle('untrusted', standing.tone === 'bad');
    replaceChildren(
      table,
      standing.tone === 'bad' ? h('caption', {}, 'Where the fit stopped: not a measurement') : null,
      h(
        'tbody',
        {},
        ...rows.flatMap((row) => {
          // The label says what t0 is then; the value alone keeps the readout's words column readable.
          const fitStart = row.name === 't0' && summary.startsInResponse === true;
          const [symbol, words, title] = fitStart ? NO_EVENT_T0 : WORDS[row.name];
          const tr = quantityRow(row.name, symbol, words, row.quantity, title, fitStart ? row.brief : row.text);
          return row.name === 'omegaD' ? [tr, ringHz] : [tr];
        }),
      ),
    );
    replaceChildren(setupList, ...setupChecksView(state.setupChecks));
    replaceChildren(modeList, ...modesView(summary, state.modesAsked, state.chosenMode, modeChoices));
    replaceChildren(eventList, ...(summary.events ? eventsView(summary.events, (event) => void actions.chooseEvent(event)) : []));
    replaceChildren(steps, ...(summary.transitions ? transitionView(summary.transitions) : []));
    showWindow(fit.window.start, fit.window.end);
    replaceChildren(
      extra,
      h(
        'dl',
        { class: 'facts' },
        h('dt', {}, 'Residual (rms)'),
        h('dd', {}, `${showValue(fit.rmsResidual, state.trace?.unit ?? '')} against noise ${showValue(fit.noiseRms, state.trace?.unit ?? '')}`),
        h('dt', {}, 'Iterations'),
        h('dd', {}, String(fit.iterations)),
        fit.decimation ? h('dt', {}, 'Decimation') : null,
        fit.decimation ? h('dd', {}, fit.decimation.note) : null,
      ),
      otherDoubts.length ? h('ul', { class: 'warnings', id: 'fit-warnings' }, ...otherDoubts.map((w) => h('li', {}, w))) : null,
    );
  }

  return { root, render };
}
