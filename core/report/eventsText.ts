// Several events in one record as text lines under the fit's table: each event, then their combination.

import type { Quantity } from '../quantity';
import { formatEngineering, formatMeasured } from '../units/format';
import { hertz } from './resultRows';
import type { EventTrainSummary, SpreadTest } from './eventTrainSummary';

/** Label column of the fit's text table, which these lines continue. */
const LABEL_WIDTH = 16;

function line(label: string, text: string): string {
  return `  ${label.padEnd(LABEL_WIDTH)} ${text}\n`;
}

function brief(alpha: Quantity | null, omega0: Quantity | null): string {
  return alpha && omega0 ? `alpha ${formatMeasured(alpha)}, f0 ${formatMeasured(hertz(omega0))}` : '';
}

/** The events as lines under the fit's table: one per event, then the combination and its consistency. */
export function formatEventsText(e: EventTrainSummary): string {
  const how = e.chosenBy === 'request' ? 'as asked' : 'the first complete one; --event N chooses another';
  let text = line('events', `${e.list.length} in the record; the fit above is event ${e.chosen} (${how})`);
  for (const ev of e.list) {
    const span = `${formatEngineering(ev.onset, 's')} to ${formatEngineering(ev.end, 's')}`;
    const state = ev.complete ? 'complete' : ev.hasOnset ? 'incomplete' : 'under way at the record start';
    const result = ev.status === 'converged' ? brief(ev.alpha, ev.omega0) : `${ev.status}: ${ev.message}`;
    text += line(`event ${ev.index}`, `${span}, ${state}, ${result}`);
  }
  const c = e.combined;
  if (!c) return text + line('combined', e.combinedNote);
  text += line('combined', `events ${c.events.join(', ')}: ${c.status}${c.status === 'converged' ? '' : ` (${c.message})`}`);
  text += line('', `${brief(c.alpha, c.omega0)}, zeta ${formatMeasured(c.zeta)}, Q ${formatMeasured(c.Q)}`);
  const test = (name: string, s: SpreadTest) => `${name} chi^2 ${s.chiSquare.toFixed(2)} (${s.dof} dof, p ${s.pValue.toPrecision(2)})`;
  text += line('', `spread: ${test('alpha', c.consistency.alpha)}, ${test('omega0', c.consistency.omega0)}`);
  return text;
}
