// Parasitic extraction by added capacitors: two or more captures with known added C, then a snubber
// starting point that is to be verified on the bench.

import { button, card, field, h, replaceChildren, textInput } from '../dom';
import { quantityRow, showCompact, showValue } from '../show';
import { formatEngineering } from '../../core/units/format';
import type { BenchState } from '../benchState';
import type { BenchController, ExtractionRow } from '../benchController';

interface RowControls extends ExtractionRow {
  element: HTMLElement;
}

export function createParasiticPanel(controller: BenchController) {
  const { root, body } = card('Parasitic extraction', 'parasitic-panel');
  const rows: RowControls[] = [];
  const list = h('div', { class: 'extraction-rows', id: 'extraction-rows' });
  const probe = textInput('0', { id: 'probe-c', attrs: { 'aria-label': 'Probe capacitance' } });
  const probeTol = textInput('', { id: 'probe-c-tol', attrs: { 'aria-label': 'Probe capacitance tolerance' } });
  const voltage = textInput('', { id: 'snubber-voltage', attrs: { placeholder: 'e.g. 48', 'aria-label': 'Voltage swing' } });
  const switching = textInput('', { id: 'snubber-fsw', attrs: { placeholder: 'e.g. 500k', 'aria-label': 'Switching frequency' } });
  const results = h('div', { id: 'extraction-results' });
  let state: BenchState | null = null;

  function addRow(row: ExtractionRow): void {
    const name = h('span', { class: 'row-name' }, row.name || 'no capture chosen');
    const added = textInput(row.addedText, { class: 'added-c', attrs: { placeholder: '0', 'aria-label': 'Added capacitance' } });
    const tol = textInput(row.toleranceText, { class: 'added-tol', attrs: { placeholder: '%', 'aria-label': 'Added capacitance tolerance' } });
    const controls: RowControls = { ...row, element: h('div') };
    added.addEventListener('input', () => (controls.addedText = added.value));
    tol.addEventListener('input', () => (controls.toleranceText = tol.value));
    const choose = button('Choose…', async () => {
      const opened = await controller.pickForExtraction();
      if (opened) {
        controls.name = opened.name;
        controls.text = opened.text;
        name.textContent = opened.name;
      }
    });
    const remove = button('×', () => {
      rows.splice(rows.indexOf(controls), 1);
      controls.element.remove();
    }, { class: 'icon', title: 'Remove this capture', attrs: { 'aria-label': 'Remove this capture' } });
    controls.element = h(
      'div',
      { class: 'extraction-row' },
      h('div', { class: 'row-head' }, name, choose, remove),
      h('div', { class: 'row-values' }, field('added C (F)', added), field('± %', tol)),
    );
    rows.push(controls);
    list.append(controls.element);
  }

  const useSet = button('Use the sample set', () => void loadSampleSet(), { id: 'use-sample-set', title: 'The bundled switch-node captures with 0, 470 pF and 1 nF added' });
  const useCurrent = button('Add the open capture', () => {
    if (!state?.capture) return;
    addRow({ name: state.capture.opened.name, text: state.capture.opened.text, addedText: '', toleranceText: '' });
  }, { id: 'add-current' });
  const addEmpty = button('Add a capture', () => addRow({ name: '', text: '', addedText: '', toleranceText: '' }), { id: 'add-extraction-row' });

  async function loadSampleSet(): Promise<void> {
    const set = (state?.samples ?? []).filter((s) => s.addedCapacitor !== null).sort((a, b) => (a.addedCapacitor?.added ?? 0) - (b.addedCapacitor?.added ?? 0));
    rows.splice(0).forEach((r) => r.element.remove());
    for (const sample of set) {
      const opened = await controller.readSampleText(sample.id);
      if (!opened) return;
      const added = sample.addedCapacitor?.added ?? 0;
      addRow({ name: sample.file, text: opened.text, addedText: added === 0 ? '0' : formatEngineering(added, 'F').replace(/\s+/g, ''), toleranceText: '' });
    }
  }

  body.append(
    h('p', { class: 'field-hint' }, 'Ring the same node bare and with known capacitors added; the shift of the natural frequency gives the loop’s own L and C.'),
    h('div', { class: 'actions' }, useSet, useCurrent, addEmpty),
    list,
    h('div', { class: 'grid-2' }, field('Probe C (F)', probe, 'in parallel in every capture'), field('± %', probeTol)),
    h('div', { class: 'grid-2' }, field('Snubber voltage swing (V)', voltage, 'optional, for the dissipation'), field('Switching frequency (Hz)', switching)),
    h(
      'div',
      { class: 'actions' },
      button('Extract', () => void controller.runExtraction(rows, { probeText: probe.value, probeToleranceText: probeTol.value, voltageText: voltage.value, switchingText: switching.value }), {
        id: 'run-extraction',
        class: 'primary',
      }),
    ),
    results,
  );

  function render(next: BenchState): void {
    state = next;
    useSet.disabled = !next.samples.some((s) => s.addedCapacitor !== null);
    useCurrent.disabled = !next.capture;
    if (next.extractionError) return replaceChildren(results, h('p', { class: 'error-text', id: 'extraction-error' }, next.extractionError));
    const done = next.extraction;
    if (!done) return replaceChildren(results);
    const { extraction, snubber, snubberError, frequencies } = done;
    replaceChildren(
      results,
      h(
        'table',
        { class: 'mini' },
        h('thead', {}, h('tr', {}, h('th', {}, 'Capture'), h('th', { class: 'number' }, 'added'), h('th', { class: 'number' }, 'f₀'))),
        h('tbody', {}, ...frequencies.map((f) => h('tr', {}, h('td', { class: 'clip', title: f.name }, f.name), h('td', { class: 'number' }, showValue(f.addedC, 'F')), h('td', { class: 'number' }, showCompact(f.f0))))),
      ),
      h(
        'table',
        { class: 'results', id: 'parasitic-results' },
        h(
          'tbody',
          {},
          quantityRow('Lp', 'L_p', 'loop inductance', extraction.L),
          quantityRow('Cp', 'C_p', 'node capacitance', extraction.C),
          quantityRow('Rp', 'R_p', 'loop resistance', extraction.R),
          quantityRow('Z0', 'Z₀', 'characteristic impedance', extraction.characteristicImpedance),
        ),
      ),
      extraction.warnings.length ? h('ul', { class: 'warnings' }, ...extraction.warnings.map((w) => h('li', {}, w))) : null,
      h('ul', { class: 'notes' }, ...extraction.notes.map((n) => h('li', {}, n))),
      h('h3', {}, 'RC snubber: a starting point to verify on the bench'),
      snubberError ? h('p', { class: 'error-text' }, snubberError) : null,
      snubber
        ? h(
            'div',
            { id: 'snubber' },
            h('table', { class: 'results' }, h('tbody', {}, quantityRow('Rs', 'R_s', 'snubber resistor', snubber.R), quantityRow('Cs', 'C_s', 'snubber capacitor', snubber.C))),
            h(
              'p',
              { class: 'small' },
              `C_s usually ${showValue(snubber.capacitanceRange.min, 'F')} to ${showValue(snubber.capacitanceRange.max, 'F')}. ` +
                (snubber.powerAt ? `Resistor dissipation about ${showValue(snubber.powerAt.power, 'W')} at ${showValue(snubber.powerAt.voltage, 'V')}, ${showValue(snubber.powerAt.frequency, 'Hz')}. ` : '') +
                `Predicted: ζ from ${snubber.before.zeta.toFixed(3)} to ${snubber.predicted.zeta.toFixed(3)}, Q from ${snubber.before.Q.toFixed(1)} to ${snubber.predicted.Q.toFixed(1)}.`,
            ),
            h('ul', { class: 'notes' }, ...snubber.notes.map((n) => h('li', {}, n))),
            h('p', { class: 'deferral' }, 'A starting point, not a design: fit the parts, measure the ring again and check the resistor’s temperature at full load.'),
          )
        : null,
    );
  }

  return { root, render };
}
