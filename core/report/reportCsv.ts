// The bench log as CSV: one row per measurement, SI base units, text cells made safe for spreadsheets.

import type { BenchRecord } from './benchRecord';
import { csvCell } from './escape';
import { MODE_RESULT_ROWS, RESULT_ROWS, TRANSITION_ROWS, fitTransitionRows, regimeTag, rowQuantity } from './resultRows';
import { recordStatus } from './yieldSummary';

const HEADER = [
  'id', 'time', 'unit', 'operator', 'station', 'note', 'file', 'channel', 'channel_unit', 'status', 'regime',
  ...[...RESULT_ROWS, ...MODE_RESULT_ROWS].flatMap((row) => [row.column, `${row.column}_stderr`]),
  ...TRANSITION_ROWS.flatMap((row) => [row.columns.model, `${row.columns.model}_stderr`, row.columns.measured]),
  'transition_levels',
  'verdict', 'decision', 'decision_rule', 'design', 'cautions', 'capture_path', 'capture_sha256', 'software_version',
];

export function renderReportCsv(records: readonly BenchRecord[]): string {
  const lines = [HEADER.join(',')];
  for (const r of records) {
    const fit = r.fit;
    const quantities = [...RESULT_ROWS, ...MODE_RESULT_ROWS].map((spec) => rowQuantity(spec, fit));
    // No transition rows (a ringdown, an older record): the columns stay empty.
    const transitions = fitTransitionRows(fit);
    const transitionCells = TRANSITION_ROWS.flatMap((_, k) => {
      const t = transitions[k];
      return [t?.model?.value ?? null, t?.model?.stderr ?? null, t?.measured ?? null];
    });
    const row: (string | number | null)[] = [
      r.id, r.time, r.unit, r.operator, r.station ?? null, r.note, fit.file, fit.channel, fit.finalValue.unit, fit.status, regimeTag(fit),
      ...quantities.flatMap((q) => [q?.value ?? null, q?.stderr ?? null]),
      ...transitionCells,
      transitions.length ? (fit.transitions?.levelMethod ?? null) : null,
      // The guard-banded zone and its rule; empty for a record without a verdict or logged before they were kept.
      recordStatus(r), r.verdict?.decision ?? null, r.verdict?.rule?.name ?? null, r.design?.name ?? null, r.cautions.fired.map((c) => c.id).join(';'),
      r.capture.path, r.capture.sha256, r.software.version,
    ];
    lines.push(row.map(csvCell).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
