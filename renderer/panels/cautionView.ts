// One caution result drawn as the window shows it: each quantity once with the thresholds it reaches (strongest
// first, each with its source), the stored energy, the standing advice folded away, and the deferral always.

import { groupCautions, type CautionGroup } from '../../core/safety/cautionGroups';
import type { CautionResult } from '../../core/safety/evaluateCautions';
import { h } from '../dom';
import { showValue } from '../show';
import { inWindowTerms } from '../windowTerms';

/** The elements for a caution result; `idPrefix` keeps ids unique when two panels show one. */
export function cautionView(result: CautionResult, idPrefix: string): HTMLElement[] {
  const energies = [
    result.energies.capacitor ? `capacitor energy ${showValue(result.energies.capacitor.value, 'J')}` : null,
    result.energies.inductor ? `inductor energy ${showValue(result.energies.inductor.value, 'J')}` : null,
    result.charge ? `charge ${showValue(result.charge.value, 'C')}` : null,
    result.discharge ? `bleeder discharge to ${result.discharge.toVoltage} V in ${showValue(result.discharge.time.value, 's')}` : null,
  ].filter((s): s is string => s !== null);
  // Without a capacitance (no known part, no design) the stored charge and energy are not weighed: said, not implied safe.
  const stored = energies.length
    ? h('p', { class: 'small', id: `${idPrefix}-stored` }, `Stored: ${energies.join('; ')}.`)
    : h('p', { class: 'small muted', id: `${idPrefix}-stored` }, 'Stored charge and energy not weighed: they need a voltage capture and a capacitance (a known part or a design).');
  const deferral = h('p', { class: 'deferral', id: `${idPrefix}-deferral` }, result.deferral);
  const notWeighed = result.peakNotWeighed ? h('p', { class: 'caution-unweighed', id: `${idPrefix}-unweighed` }, `Not weighed: ${inWindowTerms(result.peakNotWeighed)}.`) : null;
  if (result.fired.length === 0) {
    return [h('p', { class: 'muted', id: `${idPrefix}-none` }, 'No caution rule fires for this capture.'), ...(notWeighed ? [notWeighed] : []), stored, deferral];
  }
  return [
    h('ul', { class: 'caution-list', id: `${idPrefix}-fired` }, ...groupCautions(result.fired).map(groupView)),
    ...(notWeighed ? [notWeighed] : []),
    stored,
    h(
      'details',
      { class: 'bench-advice', id: `${idPrefix}-advice-box` },
      h('summary', {}, `At the bench: ${result.advice.length} habits (${result.adviceSource})`),
      h('ul', { class: 'advice', id: `${idPrefix}-advice` }, ...result.advice.map((a) => h('li', {}, a))),
    ),
    deferral,
  ];
}

/** A quantity once, the strongest threshold's words, then every threshold reached with its source. */
function groupView(group: CautionGroup): HTMLElement {
  const [strongest, ...weaker] = group.cautions;
  const reached = group.cautions.length === 1 ? 'reaches 1 threshold' : `reaches ${group.cautions.length} thresholds`;
  return h(
    'li',
    { class: 'caution-group', data: { group: group.checks } },
    h('p', { class: 'caution-quantity' }, `${capitalised(group.checks)} ${showValue(group.measured.value, group.measured.unit)}`, h('span', { class: 'muted' }, ` — ${reached}`)),
    h('p', { class: 'caution-message' }, strongest.message),
    h(
      'ul',
      { class: 'caution-thresholds' },
      ...group.cautions.map((c) =>
        h(
          'li',
          { data: { caution: c.id, threshold: String(c.threshold.value) } },
          h('span', { class: 'threshold' }, showValue(c.threshold.value, c.threshold.unit)),
          h('span', { class: 'caution-source' }, `${c.source} (${c.certainty})`),
        ),
      ),
    ),
    weaker.length
      ? h('details', { class: 'caution-more' }, h('summary', {}, 'What the lower thresholds say'), ...weaker.map((c) => h('p', { class: 'caution-detail' }, c.message)))
      : null,
  );
}

function capitalised(text: string): string {
  return `${text[0].toUpperCase()}${text.slice(1)}`;
}
