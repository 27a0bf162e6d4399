// The bench log as CSV: one row per measurement, SI base units, text cells made safe for spreadsheets.

import type { Quantity } from '../quantity';
import type { BenchRecord } from './benchRecord';
import { csvCell } from './escape';
import { hertz } from './resultRows';
import { recordStatus } from './yieldSummary';

const QUANTITY_COLUMNS = ['alpha_per_s', 'omega0_rad_per_s', 'f0_hz', 'zeta', 'Q', 'final_value', 't0_s', 'R_ohm', 'L_h', 'C_f'] as const;

const HEADER = [
  'id', 'time', 'unit', 'operator', 'note', 'file', 'channel', 'channel_unit', 'status', 'regime',
  ...QUANTITY_COLUMNS.flatMap((name) => [name, `${name}_stderr`]),
  'verdict', 'design', 'cautions', 'capture_path', 'capture_sha256', 'software_version',
];

export function renderReportCsv(records: readonly BenchRecord[]): string {
  const lines = [HEADER.join(',')];
  for (const r of records) {
    const fit = r.fit;
    const quantities: (Quantity | undefined)[] = [
      fit.alpha, fit.omega0, hertz(fit.omega0), fit.zeta, fit.Q, fit.finalValue, fit.t0,
      fit.components?.R, fit.components?.L, fit.components?.C,
    ];
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
