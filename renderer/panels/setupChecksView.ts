// The setup checks in the fit panel: can this capture support the answer? Refusals, then warnings, then notes, one line each.

import type { SetupCheck } from '../../core/circuit/setupTypes';
import { h } from '../dom';

/** The words and tone of each level (the tones of the fit's badge). */
const LEVEL = { refusal: ['refused', 'bad'], warning: ['warning', 'warn'], note: ['note', 'muted'] } as const;

/** The section's elements; none when no check applies. */
export function setupChecksView(checks: readonly SetupCheck[]): HTMLElement[] {
  if (!checks.length) return [];
  return [
    h('h3', {}, 'Setup checks'),
    h(
      'ul',
      { class: 'setup-checks', id: 'setup-checks-list' },
      ...checks.map((check) => {
        const [word, tone] = LEVEL[check.level];
        return h('li', { class: `setup-check ${tone}`, data: { check: check.id, level: check.level } }, h('span', { class: `badge ${tone}` }, word), ' ', check.message);
      }),
    ),
  ];
}
