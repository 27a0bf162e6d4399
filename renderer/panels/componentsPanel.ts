// The components panel: topology and one known part in, the other two with their uncertainties out.

import { componentModeText } from '../../core/report/resultRows';
import { card, field, h, replaceChildren, select, textInput } from '../dom';
import { quantityRow } from '../show';
import type { BenchState } from '../benchState';
import { TOLERANCE_HINT, TOLERANCE_RULE } from './toleranceHint';
import type { BenchActions } from '../actions';

const UNITS = { R: 'Ω', L: 'H', C: 'F' } as const;

/** What the ± of these rows is, beside the design check's wider, combined one. */
const MEASUREMENT_UNCERTAINTY = '± measurement uncertainty (1σ): the fit, and the known part\'s tolerance when one is given';

/** Says which known part this capture's R, L and C rest on, and where it came from; none carries over from another capture. */
function knownStateText(state: BenchState): string {
  const file = state.capture?.opened.name ?? state.refused?.opened.name;
  if (!file) return 'No capture open.';
  const { knownName, knownText } = state.componentsInput;
  if (state.knownPartFrom === null || knownText.trim() === '') return `No known part for ${file}: enter one to derive R, L and C.`;
  const part = `${knownName} = ${knownText.trim()}`;
  return state.knownPartFrom === 'sample' ? `Known part ${part}, as the sample list states for ${file}.` : `Known part ${part}, typed for ${file}.`;
}

export function createComponentsPanel(actions: BenchActions) {
  const { root, body } = card('Components', 'components-panel');
  const topology = select(
    [
      { value: 'series', label: 'series R-L-C' },
      { value: 'parallel', label: 'parallel R ∥ L ∥ C' },
    ],
    'series',
    (value) => actions.setComponentsInput({ topology: value as 'series' | 'parallel' }),
    { id: 'topology-select' },
  );
  const knownName = select(
    (['C', 'L', 'R'] as const).map((n) => ({ value: n, label: `${n} is known` })),
    'C',
    (value) => actions.setComponentsInput({ knownName: value as 'R' | 'L' | 'C' }),
    { id: 'known-name' },
  );
  const knownValue = textInput('', { id: 'known-value', attrs: { placeholder: 'e.g. 47u', 'aria-label': 'Known value' } });
  const tolerance = textInput('', { id: 'known-tolerance', title: TOLERANCE_RULE, attrs: { placeholder: 'e.g. 5', 'aria-label': 'Known tolerance in percent' } });
  const unitLabel = h('span', { class: 'unit' });
  knownValue.addEventListener('change', () => actions.setComponentsInput({ knownText: knownValue.value }));
  tolerance.addEventListener('change', () => actions.setComponentsInput({ toleranceText: tolerance.value }));
  const inputs = h(
    'div',
    { class: 'grid-2' },
    field('Topology', topology),
    field('Known part', knownName),
    field('Value', h('span', { class: 'with-unit' }, knownValue, unitLabel), 'SI prefixes: 470n, 4k7, 2.2u'),
    field('Tolerance', h('span', { class: 'with-unit' }, tolerance, h('span', { class: 'unit' }, '%')), TOLERANCE_HINT),
  );
  const knownState = h('p', { class: 'known-state', id: 'known-part-state', attrs: { role: 'status' } });
  const results = h('div', { id: 'components-results' });
  body.append(knownState, inputs, results);

  function render(state: BenchState): void {
    const input = state.componentsInput;
    topology.value = input.topology;
    knownName.value = input.knownName;
    if (document.activeElement !== knownValue) knownValue.value = input.knownText;
    if (document.activeElement !== tolerance) tolerance.value = input.toleranceText;
    unitLabel.textContent = UNITS[input.knownName];
    knownState.dataset.from = state.knownPartFrom ?? 'none';
    knownState.textContent = knownStateText(state);
    const { components, componentsError } = state;
    if (componentsError) return replaceChildren(results, h('p', { class: 'error-text' }, componentsError));
    if (!components) return replaceChildren(results, state.fit ? null : h('p', { class: 'muted' }, 'Needs a fit.'));
    const row = (name: 'R' | 'L' | 'C', words: string) => {
      const tr = quantityRow(name, name, name === input.knownName ? `${words} (known)` : words, components[name]);
      if (name === input.knownName) tr.classList.add('known');
      return tr;
    };
    replaceChildren(
      results,
      h('p', { class: 'known-part' }, 'Known: ', h('span', { id: 'known-part' }, components.known)),
      components.mode ? h('p', { class: 'known-part', id: 'components-mode' }, `R, L and C ${componentModeText(components)}: choose the mode in the fit panel.`) : null,
      h(
        'table',
        { class: 'results' },
        h('caption', { class: 'uncertainty-note', id: 'components-uncertainty' }, MEASUREMENT_UNCERTAINTY),
        h('tbody', {}, row('R', 'resistance'), row('L', 'inductance'), row('C', 'capacitance')),
      ),
      h('p', { class: 'field-hint' }, input.topology === 'series' ? 'Series: α = R / 2L, ω₀ = 1 / √(LC).' : 'Parallel: α = 1 / 2RC, ω₀ = 1 / √(LC).'),
      h('p', { class: 'field-hint' }, 'The tolerance counts as a rectangular half-width: standard uncertainty tol/√3 (GUM 4.3.7).'),
    );
  }

  return { root, render };
}
