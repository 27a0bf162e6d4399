// The cautions: shown whenever a rule fires, with the standing advice and the pointer to local codes.

import { card, h, replaceChildren } from '../dom';
import { showValue } from '../show';
import type { BenchState } from '../benchState';

export function createCautionsPanel() {
  const { root, body } = card('Cautions', 'cautions-panel');
  root.classList.add('cautions');

  function render(state: BenchState): void {
    const result = state.cautions;
    const fired = result?.fired ?? [];
    root.classList.toggle('firing', fired.length > 0);
    if (!result) return replaceChildren(body, h('p', { class: 'muted' }, 'Cautions are checked once a capture is open.'));
    const energies = [
      result.energies.capacitor ? `capacitor energy ${showValue(result.energies.capacitor.value, 'J')}` : null,
      result.energies.inductor ? `inductor energy ${showValue(result.energies.inductor.value, 'J')}` : null,
      result.charge ? `charge ${showValue(result.charge.value, 'C')}` : null,
      result.discharge ? `bleeder discharge to ${result.discharge.toVoltage} V in ${showValue(result.discharge.time.value, 's')}` : null,
    ].filter((s): s is string => s !== null);
    if (fired.length === 0) {
      return replaceChildren(
        body,
        h('p', { class: 'muted', id: 'cautions-none' }, 'No caution rule fires for this capture.'),
        energies.length ? h('p', { class: 'small' }, `Stored: ${energies.join('; ')}.`) : null,
        h('p', { class: 'fineprint' }, result.deferral),
      );
    }
    replaceChildren(
      body,
      h(
        'ul',
        { class: 'caution-list', id: 'cautions-fired' },
        ...fired.map((c) =>
          h(
            'li',
            { data: { caution: c.id } },
            h('p', { class: 'caution-message' }, c.message),
            h('p', { class: 'caution-detail' }, `${c.checks} ${showValue(c.measured.value, c.measured.unit)}, threshold ${showValue(c.threshold.value, c.threshold.unit)}. Source: ${c.source} (${c.certainty}).`),
          ),
        ),
      ),
      energies.length ? h('p', { class: 'small' }, `Stored: ${energies.join('; ')}.`) : null,
      h('h3', {}, 'At the bench'),
      h('ul', { class: 'advice', id: 'standing-advice' }, ...result.advice.map((a) => h('li', {}, a))),
      h('p', { class: 'small muted' }, `Advice: ${result.adviceSource}.`),
      h('p', { class: 'deferral', id: 'cautions-deferral' }, result.deferral),
    );
  }

  return { root, render };
}
