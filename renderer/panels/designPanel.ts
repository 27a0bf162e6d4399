// The design check panel: load or edit the design of the board, and the verdict per quantity.

import { button, card, field, h, replaceChildren, select, textInput } from '../dom';
import { showCompact, showValue } from '../show';
import { formatEngineering } from '../../core/units/format';
import { marginText } from '../../core/report/resultRows';
import { verdictRefusal } from '../../core/workflow/measure';
import { decisionText, isCounted, limitsText, quantityZoneOf, ruleText, verdictDecisionOf, zoneText } from '../../core/report/verdictText';
import { percentText } from '../parseInputs';
import type { Design } from '../../core/circuit/design';
import type { BenchState } from '../benchState';
import type { BenchActions } from '../actions';

const NAMES: Record<string, string> = {
  alpha: 'α damping',
  omega0: 'ω₀ natural frequency',
  f0: 'f₀ natural frequency',
  zeta: 'ζ damping ratio',
  Q: 'Q quality factor',
  R: 'R resistance',
  L: 'L inductance',
  C: 'C capacitance',
  overshoot: 'overshoot',
  settlingTime2: 'settling (2 %)',
  settlingTime5: 'settling (5 %)',
};

/** Why the design check's ± is wider than the components panel's for the same R, L or C. */
const COMBINED_UNCERTAINTY =
  'Design ±: its tolerance as a standard uncertainty (tol/√3). Measured ±: the fit\'s 1σ; R, L and C here take one part at its design value, so theirs combines the fit with that part\'s tolerance (the components panel shows the measurement alone).';

export function createDesignPanel(actions: BenchActions) {
  const { root, body } = card('Design check', 'design-panel');
  const designSelect = h('select', { id: 'design-select', attrs: { 'aria-label': 'Sample designs' } });
  designSelect.addEventListener('change', () => designSelect.value && void actions.loadDesignFromSamples(designSelect.value));
  const inputs = {
    name: textInput('', { id: 'design-name' }),
    topology: select([{ value: 'series', label: 'series' }, { value: 'parallel', label: 'parallel' }], 'series', () => undefined, { id: 'design-topology' }),
    R: textInput('', { id: 'design-R' }),
    RTol: textInput('', { id: 'design-R-tol' }),
    L: textInput('', { id: 'design-L' }),
    LTol: textInput('', { id: 'design-L-tol' }),
    C: textInput('', { id: 'design-C' }),
    CTol: textInput('', { id: 'design-C-tol' }),
    kind: select([{ value: 'step', label: 'step of the source' }, { value: 'natural', label: 'natural (charged part released)' }], 'step', () => updateSourceLabels(), { id: 'design-source' }),
    first: textInput('', { id: 'design-source-1' }),
    second: textInput('', { id: 'design-source-2' }),
    probe: select(
      [
        { value: 'capacitor-voltage', label: 'voltage across C' },
        { value: 'inductor-current', label: 'current in L' },
        { value: 'resistor-voltage', label: 'voltage across R' },
      ],
      'capacitor-voltage',
      () => undefined,
      { id: 'design-probe' },
    ),
  };
  const firstLabel = h('span', { class: 'field-label' });
  const secondLabel = h('span', { class: 'field-label' });
  function updateSourceLabels(): void {
    const step = inputs.kind.value === 'step';
    firstLabel.textContent = step ? 'Step size' : 'C voltage at the event';
    secondLabel.textContent = step ? 'Level before the step' : 'L current at the event';
  }
  updateSourceLabels();
  const part = (name: 'R' | 'L' | 'C', unit: string) =>
    h('div', { class: 'part-row' }, field(`${name} (${unit})`, inputs[name]), field('± %', inputs[`${name}Tol`]));
  const form = h(
    'details',
    { class: 'design-form', id: 'design-form' },
    h('summary', {}, 'Design values'),
    h('div', { class: 'grid-2' }, field('Name', inputs.name), field('Topology', inputs.topology)),
    part('R', 'Ω'),
    part('L', 'H'),
    part('C', 'F'),
    h('div', { class: 'grid-2' }, field('Source', inputs.kind), field('Probed', inputs.probe)),
    h('div', { class: 'grid-2' }, h('label', { class: 'field' }, firstLabel, inputs.first), h('label', { class: 'field' }, secondLabel, inputs.second)),
    h(
      'div',
      { class: 'actions' },
      button('Check with these values', () => void actions.useEditedDesign(fieldsOf()), { id: 'check-design', class: 'primary' }),
      button('Save design…', () => void actions.saveDesign(), { id: 'save-design' }),
    ),
  );
  const top = h(
    'div',
    { class: 'actions' },
    field('Design', designSelect),
    button('Open design…', () => void actions.pickDesign(), { id: 'open-design' }),
    button('Remove', () => actions.clearDesign(), { id: 'clear-design', title: 'Fit without a design' }),
  );
  const message = h('div', { id: 'design-message' });
  const verdictBox = h('div', { id: 'verdict' });
  body.append(top, form, message, verdictBox);
  let shownSha = '';
  let designsShown = '';
  // The form edits parts, source and probe; the loaded design's limits and decision rule go with the edited values.
  let carried: Pick<Design, 'limits' | 'decisionRule'> = {};

  function fieldsOf(): Record<string, unknown> {
    const tol = (text: string) => {
      const n = Number(text.trim().replace(/\s*%$/, '') || '0');
      return Number.isFinite(n) ? n / 100 : text;
    };
    const step = inputs.kind.value === 'step';
    return {
      format: 'ringbench-design',
      version: 1,
      name: inputs.name.value.trim(),
      topology: inputs.topology.value,
      components: {
        R: { value: inputs.R.value.trim(), tolerance: tol(inputs.RTol.value) },
        L: { value: inputs.L.value.trim(), tolerance: tol(inputs.LTol.value) },
        C: { value: inputs.C.value.trim(), tolerance: tol(inputs.CTol.value) },
      },
      source: step
        ? { kind: 'step', amplitude: inputs.first.value.trim(), initialLevel: inputs.second.value.trim() || '0' }
        : { kind: 'natural', capacitorVoltage: inputs.first.value.trim() || '0', inductorCurrent: inputs.second.value.trim() || '0' },
      probe: inputs.probe.value,
      ...carried,
    };
  }

  function fill(design: Design): void {
    carried = { ...(design.limits ? { limits: design.limits } : {}), ...(design.decisionRule ? { decisionRule: design.decisionRule } : {}) };
    inputs.name.value = design.name;
    inputs.topology.value = design.topology;
    for (const name of ['R', 'L', 'C'] as const) {
      inputs[name].value = compact(design.components[name].value);
      inputs[`${name}Tol`].value = percentText(design.components[name].tolerance);
    }
    inputs.kind.value = design.source.kind;
    if (design.source.kind === 'step') {
      inputs.first.value = compact(design.source.amplitude);
      inputs.second.value = compact(design.source.initialLevel);
    } else {
      inputs.first.value = compact(design.source.capacitorVoltage);
      inputs.second.value = compact(design.source.inductorCurrent);
    }
    inputs.probe.value = design.probe;
    updateSourceLabels();
  }

  function render(state: BenchState): void {
    const list = state.designs.map((d) => d.id).join(',');
    if (list !== designsShown) {
      designsShown = list;
      replaceChildren(designSelect, h('option', { attrs: { value: '' } }, 'choose a design…'), ...state.designs.map((d) => h('option', { attrs: { value: d.id } }, d.name)));
    }
    const loaded = state.design;
    designSelect.value = loaded ? (state.designs.find((d) => `${d.id}.json` === loaded.name)?.id ?? '') : '';
    if (loaded && loaded.sha256 !== shownSha) {
      shownSha = loaded.sha256;
      fill(loaded.design);
    }
    replaceChildren(
      message,
      state.designError ? h('p', { class: 'error-text', id: 'design-error' }, state.designError) : null,
      loaded ? h('p', { class: 'muted small' }, `${loaded.design.name} — ${loaded.design.topology}, from ${loaded.path}`) : h('p', { class: 'muted' }, 'No design loaded: choose one, open a design file, or enter the values.'),
    );
    // A fit that gets no verdict (failed, refused by a setup check, or a single decay where the design rings) says why, in place of the verdict.
    const refusal = loaded && state.summary ? verdictRefusal(loaded.design, state.summary, state.setupChecks) : null;
    if (refusal) {
      replaceChildren(verdictBox, h('p', { class: 'verdict-line none', id: 'verdict-none' }, 'No verdict'), h('p', { class: 'small', id: 'verdict-refusal' }, `${refusal[0].toUpperCase()}${refusal.slice(1)}.`));
      return;
    }
    const verdict = state.verdict;
    if (!verdict) {
      replaceChildren(verdictBox, state.verdictError ? h('p', { class: 'error-text' }, state.verdictError) : null);
      return;
    }
    replaceChildren(
      verdictBox,
      h(
        'p',
        { class: `verdict-line ${verdict.pass ? 'ok' : 'bad'}`, id: 'verdict-overall', data: { pass: String(verdict.pass), decision: verdictDecisionOf(verdict) } },
        `${verdict.pass ? 'In tolerance: the board matches its design' : 'Out of tolerance: the board differs from its design'} (${decisionText(verdict)})`,
      ),
      h(
        'table',
        { class: 'verdict-table' },
        h(
          'thead',
          {},
          h('tr', {}, h('th', {}, 'Quantity'), h('th', { id: 'verdict-design-head' }, 'Design ± tolerance'), h('th', { id: 'verdict-measured-head' }, 'Measured ± combined'), h('th', {}, 'Limits'), h('th', {}, 'Margin'), h('th', {}, 'Zone')),
        ),
        h(
          'tbody',
          {},
          ...verdict.quantities.map((q) =>
            h(
              'tr',
              { data: { quantity: q.name, inTolerance: String(q.inTolerance), zone: quantityZoneOf(q), counted: String(isCounted(q)) }, class: q.inTolerance || !isCounted(q) ? '' : 'out' },
              h('th', { attrs: { scope: 'row' } }, NAMES[q.name] ?? q.name),
              h('td', { class: 'number' }, showCompact(q.design)),
              h('td', { class: 'number' }, showCompact(q.measured)),
              h('td', { class: 'number' }, limitsText(q, showValue)),
              h('td', { class: 'number' }, marginText(q)),
              h('td', { class: !isCounted(q) ? 'muted' : q.inTolerance ? 'pass' : 'fail' }, zoneText(q)),
            ),
          ),
        ),
      ),
      h('p', { class: 'small muted', id: 'verdict-uncertainty' }, COMBINED_UNCERTAINTY),
      h('p', { class: 'small', id: 'verdict-rule' }, ruleText(verdict) ?? ''),
      verdict.rmsDifference !== null ? h('p', { class: 'small' }, `Measured minus predicted over the fit window: ${showValue(verdict.rmsDifference, state.trace?.unit ?? '')} rms.`) : null,
      verdict.likelyCause
        ? h(
            'p',
            { class: 'small', id: 'likely-cause' },
            `Most likely cause: ${verdict.likelyCause.component} is ${Math.abs(verdict.likelyCause.change * 100).toFixed(1)} % ${verdict.likelyCause.change >= 0 ? 'higher' : 'lower'} than designed (about ${showValue(verdict.likelyCause.impliedValue.value, verdict.likelyCause.impliedValue.unit)}); it explains ${(verdict.likelyCause.explains * 100).toFixed(0)} % of the deviation.`,
          )
        : null,
      h('ul', { class: 'notes' }, ...verdict.notes.map((n) => h('li', {}, n))),
    );
  }

  return { root, render };
}

/** A value as compact prefixed text that the design reader takes back: 4.7e-8 -> '47n'. */
function compact(value: number): string {
  // Formatted with a placeholder unit so the prefix is written, then the placeholder dropped.
  return formatEngineering(value, 'x', 6).replace(/x$/, '').replace(/\s+/g, '').replace('µ', 'u');
}
