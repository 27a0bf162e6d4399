// The bench log as CSV: one row per measurement, SI base units, text cells made safe for spreadsheets.

import type { BenchRecord } from './benchRecord';
import { csvCell } from './escape';
import { RESULT_ROWS, rowQuantity } from './resultRows';
import { recordStatus } from './yieldSummary';

const HEADER = [
  'id', 'time', 'unit', 'operator', 'note', 'file', 'channel', 'channel_unit', 'status', 'regime',
  ...RESULT_ROWS.flatMap((row) => [row.column, `${row.column}_stderr`]),
  'verdict', 'design', 'cautions', 'capture_path', 'capture_sha256', 'software_version',
];

export function renderReportCsv(records: readonly BenchRecord[]): string {
  const lines = [HEADER.join(',')];
  for (const r of records) {
    const fit = r.fit;
    const quantities = RESULT_ROWS.map((spec) => rowQuantity(spec, fit));
    const row: (string | number | null)[] = [
      r.id, r.time, r.unit, r.operator, r.note, fit.file, fit.channel, fit.finalValue.unit, fit.status, fit.regime,
      ...quantities.flatMap((q) => [q?.value ?? null, q?.stderr ?? null]),
      recordStatus(r), r.design?.name ?? null, r.cautions.fired.map((c) => c.id).join(';'),
      r.capture.path, r.capture.sha256, r.software.version,
    ];
    lines.push(row.map(csvCell).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
