// Parasitic extraction by added capacitors: two or more captures with known added C (each at its operating voltage),
// measureParasitics in the worker, the loop's parts with the plot of 1/f0² against the added C, L_p cross-checked on a
// turn-on edge, a snubber starting point to verify on the bench, and the captures' cautions.

import { button, card, field, h, replaceChildren, textInput } from '../dom';
import { quantityRow, showCompact, showValue } from '../show';
import { formatEngineering } from '../../core/units/format';
import type { EdgeCrossCheck, ParasiticsResult } from '../../core/report/parasiticsText';
import { crossCheckLine } from '../../core/circuit/edgeInductance';
import type { Quantity } from '../../core/quantity';
import type { BenchState } from '../benchState';
import type { BenchActions } from '../actions';
import type { ExtractionRow } from '../actions/extraction';
import { cautionView } from './cautionView';
import { contentOf, type CaptureFile } from '../workerProtocol';
import { TOLERANCE_HINT, TOLERANCE_RULE } from './toleranceHint';

interface RowControls extends ExtractionRow {
  element: HTMLElement;
}

/** Draws 1/f0² of each capture against its added C with the extraction's line (renderer/plot/comparePlots.ts). */
export type CapacitanceLineDrawer = (root: HTMLElement, result: ParasiticsResult, probeC: number) => Promise<void>;

export function createParasiticPanel(actions: BenchActions, drawLine: CapacitanceLineDrawer) {
  const { root, body } = card('Parasitic extraction', 'parasitic-panel');
  const linePlot = h('div', { class: 'small-plot', id: 'extraction-line-plot', attrs: { 'aria-label': '1/(2π f0)² of each capture against its added capacitance, with the fitted line' } });
  // What the plot shows, and in which theme: drawn again when either changes.
  let drawn: ParasiticsResult | null = null;
  let drawnTheme = '';
  const rows: RowControls[] = [];
  const list = h('div', { class: 'extraction-rows', id: 'extraction-rows' });
  const input = (id: string, label: string, placeholder = '') => textInput('', { id, title: label, attrs: { placeholder, 'aria-label': label } });
  const addedTol = input('added-c-tol', 'Added capacitance tolerance in percent', '%');
  const probe = input('probe-c', 'Probe capacitance', 'none');
  const probeTol = input('probe-c-tol', 'Probe capacitance tolerance in percent', '%');
  const bandwidth = input('scope-bandwidth', 'Scope or probe bandwidth', 'e.g. 200M');
  const voltage = input('snubber-voltage', 'Voltage swing', 'e.g. 48');
  const switching = input('snubber-fsw', 'Switching frequency', 'e.g. 500k');
  const dcBias = input('dc-bias-factor', 'DC-bias factor of the added ceramic capacitors', 'e.g. 0.55');
  const deratingTol = input('derating-tol', 'Tolerance of the derating factors in percent', '%');
  const switchC = input('switch-coss', 'Switch output capacitance at the operating voltage, with its tolerance in percent after a comma', 'e.g. 180p,20');
  const edgeCurrent = input('edge-current-channel', 'Current channel of the turn-on edge capture', 'first');
  const edgeVoltage = input('edge-voltage-channel', 'Switch voltage channel of the turn-on edge capture', 'e.g. CH1');
  const plateau = input('plateau-voltage', 'Voltage across the loop inductance while the current rises, with its tolerance in percent after a comma', 'e.g. 9.5,10');
  for (const tol of [addedTol, probeTol, deratingTol]) tol.title = TOLERANCE_RULE;
  let edgeFile: CaptureFile | null = null;
  const edgeName = h('span', { class: 'row-name', id: 'edge-file' }, 'no edge capture chosen');
  const chooseEdge = button('Choose…', async () => {
    const opened = await actions.pickCaptureFile();
    if (opened) {
      edgeFile = { name: opened.name, ...contentOf(opened) };
      edgeName.textContent = opened.name;
    }
  }, { id: 'choose-edge', title: 'A turn-on edge with the loop current (and the switch voltage) to cross-check L_p on' });
  const clearEdge = button('×', () => {
    edgeFile = null;
    edgeName.textContent = 'no edge capture chosen';
  }, { class: 'icon', title: 'No edge cross-check', attrs: { 'aria-label': 'No edge cross-check' } });
  const results = h('div', { id: 'extraction-results' });
  let state: BenchState | null = null;

  function addRow(row: ExtractionRow): void {
    const name = h('span', { class: 'row-name' }, row.name || 'no capture chosen');
    const added = textInput(row.addedText, { class: 'added-c', attrs: { placeholder: 'e.g. 470p', 'aria-label': 'Added capacitance' } });
    const derating = textInput(row.deratingText, { class: 'derating', attrs: { placeholder: 'none', 'aria-label': 'Its value at the operating voltage over the nominal one' } });
    const controls: RowControls = { ...row, element: h('div') };
    added.addEventListener('input', () => (controls.addedText = added.value));
    derating.addEventListener('input', () => (controls.deratingText = derating.value));
    const choose = button('Choose…', async () => {
      const opened = await actions.pickCaptureFile();
      if (opened) {
        controls.name = opened.name;
        controls.content = contentOf(opened);
        name.textContent = opened.name;
      }
    });
    const remove = button('×', () => {
      rows.splice(rows.indexOf(controls), 1);
      controls.element.remove();
      markBareLoop();
    }, { class: 'icon', title: 'Remove this capture', attrs: { 'aria-label': 'Remove this capture' } });
    controls.element = h(
      'div',
      { class: 'extraction-row' },
      h('div', { class: 'row-head' }, name, choose, remove),
      h('div', { class: 'row-values' }, field('added C (F)', added), field('derating', derating), h('span', { class: 'bare-loop field-hint' }, 'the bare loop: nothing added')),
    );
    rows.push(controls);
    list.append(controls.element);
    markBareLoop();
  }

  /** The first capture is the bare loop: its added-C field is not asked for. */
  function markBareLoop(): void {
    rows.forEach((row, i) => row.element.classList.toggle('bare', i === 0));
  }

  const useSet = button('Use the sample set', () => void loadSampleSet(), { id: 'use-sample-set', title: 'The bundled switch-node captures with 0, 470 pF and 1 nF added' });
  const useCurrent = button('Add the open capture', () => {
    if (!state?.capture) return;
    addRow({ name: state.capture.opened.name, content: contentOf(state.capture.opened), addedText: '', deratingText: '' });
  }, { id: 'add-current' });
  const addEmpty = button('Add a capture', () => addRow({ name: '', content: null, addedText: '', deratingText: '' }), { id: 'add-extraction-row' });

  async function loadSampleSet(): Promise<void> {
    const set = (state?.samples ?? []).filter((s) => s.addedCapacitor !== null).sort((a, b) => (a.addedCapacitor?.added ?? 0) - (b.addedCapacitor?.added ?? 0));
    rows.splice(0).forEach((r) => r.element.remove());
    for (const sample of set) {
      const opened = await actions.readSampleText(sample.id);
      if (!opened) return;
      const added = sample.addedCapacitor?.added ?? 0;
      addRow({ name: sample.file, content: contentOf(opened), addedText: added === 0 ? '' : formatEngineering(added, 'F').replace(/\s+/g, ''), deratingText: '' });
    }
  }

  const settings = () => ({
    addedToleranceText: addedTol.value,
    probeText: probe.value,
    probeToleranceText: probeTol.value,
    bandwidthText: bandwidth.value,
    voltageText: voltage.value,
    switchingText: switching.value,
    dcBiasText: dcBias.value,
    deratingToleranceText: deratingTol.value,
    switchCText: switchC.value,
    edge: { file: edgeFile, currentChannelText: edgeCurrent.value, voltageChannelText: edgeVoltage.value, plateauText: plateau.value },
  });

  body.append(
    h(
      'div',
      { class: 'desk-inputs' },
      h('p', { class: 'field-hint' }, 'Ring the same node bare (first) and with known capacitors added; the shift of the natural frequency gives the loop’s own L and C.'),
      h('div', { class: 'actions' }, useSet, useCurrent, addEmpty),
      list,
      h('div', { class: 'grid-2' }, field('Added C tolerance', addedTol, `needed; ${TOLERANCE_HINT} (0: parts taken as exact)`), field('Bandwidth (Hz)', bandwidth, 'scope or probe; optional')),
      h('div', { class: 'grid-2' }, field('Probe C (F)', probe, 'in parallel in every capture'), field('Probe C tolerance', probeTol, `needed with a probe C; ${TOLERANCE_HINT}`)),
      h('div', { class: 'grid-2' }, field('DC-bias factor', dcBias, 'class-II ceramics: C at the operating voltage / nominal, for every part without its own derating'), field('Derating tolerance', deratingTol, 'of the factors; needed with any below 1')),
      field('Switch Coss at the operating voltage (F)', switchC, 'small-signal value and its tolerance in %, split off C_p; not Co(tr) or Co(er)'),
      h('p', { class: 'field-hint' }, 'Cross-check L_p on a turn-on edge (optional): L = V_L / (di/dt) over the current’s 10–90 % rise.'),
      h('div', { class: 'row-head' }, edgeName, chooseEdge, clearEdge),
      h('div', { class: 'grid-3' }, field('Current channel', edgeCurrent), field('Switch voltage channel', edgeVoltage), field('or plateau V_L (V)', plateau)),
      h('div', { class: 'grid-2' }, field('Snubber voltage swing (V)', voltage, 'optional, for the dissipation'), field('Switching frequency (Hz)', switching)),
      h('div', { class: 'actions' }, button('Extract', () => void actions.runExtraction(rows, settings()), { id: 'run-extraction', class: 'primary' })),
    ),
    h('div', { class: 'desk-outputs' }, linePlot, results),
  );

  function render(next: BenchState): void {
    state = next;
    useSet.disabled = !next.samples.some((s) => s.addedCapacitor !== null);
    useCurrent.disabled = !next.capture;
    linePlot.hidden = !next.extraction;
    const theme = document.documentElement.dataset.theme ?? '';
    if (next.extraction !== drawn || theme !== drawnTheme) {
      drawn = next.extraction;
      drawnTheme = theme;
      if (drawn) void drawLine(linePlot, atOperatingVoltage(drawn), next.extractionProbeC);
    }
    if (next.extractionError) return replaceChildren(results, h('p', { class: 'error-text', id: 'extraction-error' }, next.extractionError));
    if (!next.extraction) return replaceChildren(results);
    replaceChildren(results, ...extractionView(next.extraction));
  }

  return { root, render };
}

/** The line is fitted to each added C at the operating voltage: the plot puts the points there too. */
function atOperatingVoltage(result: ParasiticsResult): ParasiticsResult {
  return { ...result, captures: result.captures.map((c) => ({ ...c, addedC: c.effectiveC.value })) };
}

/** A symbol wider than the column's minimum keeps a space before its words. */
const SYMBOL_GAP = '\u00a0';

/** A capture's residual from the line in its own standard uncertainties, or '—' without frequency uncertainties. */
function residualText(sigmas: number | null): string {
  if (sigmas === null) return '—';
  const shown = Math.abs(sigmas).toFixed(1);
  return `${sigmas < 0 && Number(shown) !== 0 ? '−' : '+'}${shown} σ`;
}

function extractionView(result: ParasiticsResult): (HTMLElement | null)[] {
  const { snubber } = result;
  const derated = result.captures.some((c) => c.factorSource !== 'none');
  return [
    h(
      'table',
      { class: 'mini', id: 'extraction-captures' },
      h(
        'thead',
        {},
        h('tr', {}, h('th', {}, 'Capture'), h('th', { class: 'number' }, 'added'), derated ? h('th', { class: 'number' }, 'at V_op') : null, h('th', { class: 'number' }, 'f₀'), h('th', { class: 'number', title: 'from the fitted line' }, 'residual')),
      ),
      h(
        'tbody',
        {},
        ...result.captures.map((c) =>
          h(
            'tr',
            {},
            h('td', { class: 'clip', title: c.file }, c.file),
            h('td', { class: 'number' }, showValue(c.addedC, 'F')),
            derated ? h('td', { class: 'number effective-c', title: c.factorSource === 'none' ? 'nominal' : `× ${c.factor} (${c.factorSource === 'dc-bias' ? 'DC-bias factor' : 'its derating'})` }, showCompact(c.effectiveC)) : null,
            h('td', { class: 'number' }, showCompact(c.frequency)),
            h('td', { class: 'number' }, residualText(c.residualSigmas)),
          ),
        ),
      ),
    ),
    h(
      'table',
      { class: 'results', id: 'parasitic-results' },
      h(
        'tbody',
        {},
        quantityRow('Lp', 'L_p', 'loop inductance', result.L),
        quantityRow('Cp', 'C_p', 'node capacitance', result.C),
        quantityRow('Rp', 'R_p', 'loop resistance', result.R),
        quantityRow('Z0', 'Z₀', 'characteristic impedance', result.characteristicImpedance),
        ...(result.switchSplit
          ? [
              quantityRow('Csw', `C_sw${SYMBOL_GAP}`, 'switch Coss as entered', result.switchSplit.switchC),
              quantityRow('Crest', `C_p − C_sw${SYMBOL_GAP}`, 'rest of the node', result.switchSplit.rest),
            ]
          : []),
      ),
    ),
    result.edgeCheck ? edgeCheckView(result.edgeCheck, result.L) : null,
    result.warnings.length ? h('ul', { class: 'warnings', id: 'extraction-warnings' }, ...result.warnings.map((w) => h('li', {}, w))) : null,
    h('ul', { class: 'notes' }, ...result.notes.map((n) => h('li', {}, n))),
    h('h3', {}, 'Cautions from these captures'),
    h('div', { class: 'extraction-cautions', id: 'extraction-cautions', data: { fired: String(result.cautions.fired.length) } }, ...cautionView(result.cautions, 'extraction-cautions')),
    h('h3', {}, 'RC snubber: a starting point to verify on the bench'),
    h(
      'div',
      { id: 'snubber' },
      h('table', { class: 'results' }, h('tbody', {}, quantityRow('Rs', 'R_s', 'snubber resistor', snubber.R), quantityRow('Cs', 'C_s', 'snubber capacitor', snubber.C))),
      h(
        'p',
        { class: 'small' },
        `C_s usually ${showValue(snubber.capacitanceRange.min, 'F')} to ${showValue(snubber.capacitanceRange.max, 'F')}. ` +
          (snubber.powerAt ? `Resistor dissipation about ${showValue(snubber.powerAt.power, 'W')} at ${showValue(snubber.powerAt.voltage, 'V')}, ${showValue(snubber.powerAt.frequency, 'Hz')}. ` : '') +
          `Predicted: ζ from ${snubber.before.zeta.toFixed(3)} to ${snubber.predicted.zeta.toFixed(3)}, Q from ${snubber.before.Q.toFixed(1)} to ${snubber.predicted.Q.toFixed(1)}; ` +
          `the node's step overshoot from ${(snubber.before.step.overshoot * 100).toFixed(1)} % to ${(snubber.predicted.step.overshoot * 100).toFixed(1)} % (the whole snubbed loop).`,
      ),
      h('ul', { class: 'notes' }, ...snubber.notes.map((n) => h('li', {}, n))),
      h('p', { class: 'deferral' }, 'A starting point, not a design: fit the parts, measure the ring again and check the resistor’s temperature at full load.'),
    ),
  ];
}

/** The L_p cross-check on the turn-on edge: di/dt, V_L and L, and the verdict line. */
function edgeCheckView(check: EdgeCrossCheck, ringL: Quantity): HTMLElement {
  const tone = check.verdict === 'agree' ? 'ok' : 'warn';
  return h(
    'div',
    { id: 'edge-check', data: { verdict: check.verdict } },
    h('h3', {}, `L_p on the turn-on edge ${check.file}`),
    h(
      'table',
      { class: 'results' },
      h(
        'tbody',
        {},
        quantityRow('didt', `di/dt${SYMBOL_GAP}`, check.plateauSource === 'given' ? 'line through the 10–90 % rise' : 'mean over the 10–90 % rise', check.didt),
        quantityRow('VL', 'V_L', check.plateauSource === 'given' ? 'plateau given' : 'mean drop of the switch voltage', check.plateau),
        quantityRow('Ledge', 'L', 'V_L / (di/dt)', check.L),
      ),
    ),
    h('p', { class: `change-verdict ${tone}`, id: 'edge-verdict' }, crossCheckLine(check.L, check, ringL)),
  );
}
