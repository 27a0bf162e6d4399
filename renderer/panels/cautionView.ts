// One caution result drawn as the window shows it: the rules that fire, the stored energy, the standing advice.

import type { CautionResult } from '../../core/safety/evaluateCautions';
import { h } from '../dom';
import { showValue } from '../show';

/** The elements for a caution result; `idPrefix` keeps ids unique when two panels show one. */
export function cautionView(result: CautionResult, idPrefix: string): HTMLElement[] {
  const fired = result.fired;
  const energies = [
    result.energies.capacitor ? `capacitor energy ${showValue(result.energies.capacitor.value, 'J')}` : null,
    result.energies.inductor ? `inductor energy ${showValue(result.energies.inductor.value, 'J')}` : null,
    result.charge ? `charge ${showValue(result.charge.value, 'C')}` : null,
    result.discharge ? `bleeder discharge to ${result.discharge.toVoltage} V in ${showValue(result.discharge.time.value, 's')}` : null,
  ].filter((s): s is string => s !== null);
  const stored = energies.length ? h('p', { class: 'small' }, `Stored: ${energies.join('; ')}.`) : null;
  if (fired.length === 0) {
    return [h('p', { class: 'muted', id: `${idPrefix}-none` }, 'No caution rule fires for this capture.'), ...(stored ? [stored] : []), h('p', { class: 'fineprint' }, result.deferral)];
  }
  return [
    h(
      'ul',
      { class: 'caution-list', id: `${idPrefix}-fired` },
      ...fired.map((c) =>
        h(
          'li',
          { data: { caution: c.id } },
          h('p', { class: 'caution-message' }, c.message),
          h('p', { class: 'caution-detail' }, `${c.checks} ${showValue(c.measured.value, c.measured.unit)}, threshold ${showValue(c.threshold.value, c.threshold.unit)}. Source: ${c.source} (${c.certainty}).`),
        ),
      ),
    ),
    ...(stored ? [stored] : []),
    h('h3', {}, 'At the bench'),
    h('ul', { class: 'advice', id: `${idPrefix}-advice` }, ...result.advice.map((a) => h('li', {}, a))),
    h('p', { class: 'small muted' }, `Advice: ${result.adviceSource}.`),
    h('p', { class: 'deferral', id: `${idPrefix}-deferral` }, result.deferral),
  ];
}
