// The lot report as CSV: one row per quantity (and design), SI base units, Cp and Cpk with their 95 % intervals, empty where not defined.

import { csvCell } from './escape';
import { DECISION_ZONES } from '../circuit/decisionRule';
import type { LotSummary } from './lotSummary';
import type { CapabilityIndex } from './capability';

const HEADER = [
  'design', 'quantity', 'unit', 'counted', 'n', 'mean', 'sd', 'min', 'max', 'lsl', 'usl', 'design_value', 'cp', 'cp_lower_95', 'cp_upper_95', 'cpk', 'cpk_lower_95', 'cpk_upper_95', 'capability_note',
  ...DECISION_ZONES.map((zone) => `units_${zone.replace('-', '_')}`),
  'first_pass_yield_pct', 'final_yield_pct',
];

/** The yields repeat on every row so each row stands alone in a spreadsheet filter. */
export function renderLotCsv(summary: LotSummary): string {
  const lines = [HEADER.join(',')];
  for (const group of summary.groups) {
    for (const q of group.quantities) {
      const s = q.stats;
      const { cp, cpk } = q.capability;
      const note = [cp.reason && `Cp not defined: ${cp.reason}`, cpk.reason && `Cpk not defined: ${cpk.reason}`].filter(Boolean).join('; ');
      const row: (string | number | null)[] = [
        group.design, q.name, q.unit, q.counted ? 'yes' : 'no', s?.n ?? 0, s?.mean ?? null, s?.sd ?? null, s?.min ?? null, s?.max ?? null,
        q.limits?.lower ?? null, q.limits?.upper ?? null, q.design, ...indexCells(cp), ...indexCells(cpk), note || null,
        ...DECISION_ZONES.map((zone) => q.zones[zone]),
        summary.firstPass.percent, summary.final.percent,
      ];
      lines.push(row.map(csvCell).join(','));
    }
  }
  return `${lines.join('\r\n')}\r\n`;
}

/** An index and its 95 % interval's bounds, empty where it is not defined. */
function indexCells(index: CapabilityIndex): (number | null)[] {
  return index.value === null ? [null, null, null] : [index.value, index.interval.lower, index.interval.upper];
}
