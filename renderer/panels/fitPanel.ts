// The fit panel: regime, alpha, omega0, omega_d, zeta, Q, final value with uncertainties, and the fit window.

import { button, card, field, h, replaceChildren, textInput } from '../dom';
import { hertzOf, quantityRow, showValue } from '../show';
import { parseSigned } from '../parseInputs';
import { plainMessage } from '../plainMessage';
import type { BenchState } from '../benchState';
import type { BenchController } from '../benchController';

export function createFitPanel(controller: BenchController) {
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
      void controller.setWindow({ start, end });
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
    button('Automatic', () => void controller.setWindow({}), { id: 'auto-window', title: 'Let the fit find the window from the data' }),
  );
  for (const input of [startInput, endInput]) input.addEventListener('keydown', (e) => e.key === 'Enter' && apply());
  const extra = h('div', { class: 'details' });
  body.append(status, table, h('h3', {}, 'Fit window'), h('p', { class: 'field-hint' }, 'Drag the edges of the shaded region on the plot, or type the times.'), windowRow, windowNote, extra);

  function render(state: BenchState): void {
    const { fit, fitError } = state;
    root.dataset.fitCount = String(state.fitCount);
    if (!fit) {
      replaceChildren(status, fitError ? h('p', { class: 'error-text' }, fitError) : h('p', { class: 'muted' }, state.capture ? 'Fitting…' : 'Open a capture to fit it.'));
      table.replaceChildren();
      extra.replaceChildren();
      return;
    }
    const badge = fit.status === 'converged' ? 'ok' : fit.status === 'failed' ? 'bad' : 'warn';
    replaceChildren(
      status,
      h('span', { class: `badge ${badge}`, id: 'fit-state', data: { status: fit.status } }, fit.status === 'converged' ? 'converged' : fit.status === 'failed' ? 'fit failed' : 'stopped at the iteration limit'),
      h('span', { class: 'regime', id: 'fit-regime', data: { regime: fit.regime } }, fit.regime),
      h('p', { class: 'muted small' }, fit.regimeEvidence),
      fit.status !== 'converged' ? h('p', { class: 'error-text' }, fit.message) : null,
    );
    replaceChildren(
      table,
      h(
        'tbody',
        {},
        quantityRow('alpha', 'α', 'damping (neper frequency)', fit.alpha),
        quantityRow('omega0', 'ω₀', 'natural frequency', fit.omega0),
        quantityRow('f0', 'f₀', 'natural frequency', hertzOf(fit.omega0)),
        fit.omegaD ? quantityRow('omegaD', 'ω_d', 'ring frequency', fit.omegaD) : null,
        fit.omegaD ? quantityRow('fd', 'f_d', 'ring frequency', hertzOf(fit.omegaD)) : null,
        quantityRow('zeta', 'ζ', 'damping ratio', fit.zeta),
        quantityRow('Q', 'Q', 'quality factor', fit.Q),
        quantityRow('finalValue', 'y∞', 'final value', fit.finalValue),
        quantityRow('t0', 't₀', 'event time', fit.t0),
      ),
    );
    if (document.activeElement !== startInput && document.activeElement !== endInput) {
      startInput.value = showValue(fit.window.start, 's', 6).replace(/\s/g, '');
      endInput.value = showValue(fit.window.end, 's', 6).replace(/\s/g, '');
    }
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
      fit.warnings.length ? h('ul', { class: 'warnings', id: 'fit-warnings' }, ...fit.warnings.map((w) => h('li', {}, w))) : null,
    );
  }

  return { root, render };
}
