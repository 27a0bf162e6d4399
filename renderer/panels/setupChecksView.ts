// The setup checks in the fit panel: can this capture support the answer? Refusals, then warnings, then notes, one line each; and the scope and probe they weigh.

import type { SetupCheck, SetupOptions } from '../../core/circuit/setupTypes';
import { parseLength, parsePositiveValue } from '../../core/workflow/userValues';
import { parseProbeCapacitance, probeSetup } from '../../core/workflow/capacitorValues';
import { button, field, h, textInput } from '../dom';
import { plainMessage } from '../plainMessage';
import { inWindowTerms } from '../windowTerms';

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
        return h('li', { class: `setup-check ${tone}`, data: { check: check.id, level: check.level } }, h('span', { class: `badge ${tone}` }, word), ' ', inWindowTerms(check.message));
      }),
    ),
  ];
}

/**
 * What the person states about the scope and probe, typed as on the command line ('200M', '10p', '6in'), read by the
 * same parsers; `apply` refits with them. A value that cannot be read is said beside the fields and nothing changes.
 */
export function setupOptionsForm(apply: (setup: SetupOptions) => void): HTMLElement {
  const bandwidth = textInput('', { id: 'setup-bandwidth', attrs: { 'aria-label': 'Scope bandwidth', placeholder: 'preamble' } });
  const probeC = textInput('', { id: 'setup-probe-c', attrs: { 'aria-label': 'Probe capacitance, with its tolerance in percent after a comma', placeholder: 'e.g. 10p,10' } });
  const lead = textInput('', { id: 'setup-ground-lead', attrs: { 'aria-label': 'Ground-lead length', placeholder: '6in' } });
  const note = h('p', { class: 'field-note', id: 'setup-note' });
  const read = () => {
    try {
      const text = (input: HTMLInputElement) => (input.value.trim() === '' ? undefined : input.value.trim());
      const setup: SetupOptions = {};
      const hertz = parsePositiveValue(text(bandwidth), 'scope bandwidth', 'Hz');
      const probe = parseProbeCapacitance(text(probeC), 'probe capacitance');
      const leadText = text(lead);
      if (hertz !== undefined) setup.scopeBandwidth = hertz;
      if (probe !== undefined) Object.assign(setup, probeSetup(probe));
      if (leadText !== undefined) setup.groundLead = parseLength(leadText, 'ground lead');
      note.textContent = '';
      apply(setup);
    } catch (error) {
      note.textContent = plainMessage(error);
    }
  };
  for (const input of [bandwidth, probeC, lead]) input.addEventListener('keydown', (e) => e.key === 'Enter' && read());
  return h(
    'details',
    { class: 'setup-options', id: 'setup-options' },
    h('summary', {}, 'Scope and probe'),
    h('div', { class: 'window-row' }, field('Bandwidth', bandwidth), field('Probe C', probeC), field('Ground lead', lead), button('Check', read, { id: 'apply-setup' })),
    note,
  );
}
