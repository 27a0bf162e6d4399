// One fit as a CSV header and row (SI base units, the report CSV's column names), for copying into a spreadsheet.

import { csvCell } from './escape';
import type { FitSummary } from './fitSummary';
import { MODE_RESULT_ROWS, RESULT_ROWS, TRANSITION_ROWS, fitTransitionRows, regimeTag, rowQuantity } from './resultRows';

const HEADER = [
  'file', 'channel', 'channel_unit', 'status', 'regime',
  ...[...RESULT_ROWS, ...MODE_RESULT_ROWS].flatMap((row) => [row.column, `${row.column}_stderr`]),
  ...TRANSITION_ROWS.flatMap((row) => [row.columns.model, `${row.columns.model}_stderr`, row.columns.measured]),
  'known_part',
];

/** The header line and the fit's row, CRLF-terminated as the report's CSV; empty cells where the fit has no value. */
export function fitCsv(fit: FitSummary): string {
  const transitions = fitTransitionRows(fit);
  const row: (string | number | null)[] = [
    fit.file, fit.channel, fit.finalValue.unit, fit.status, regimeTag(fit),
    ...[...RESULT_ROWS, ...MODE_RESULT_ROWS].flatMap((spec) => {
      const q = rowQuantity(spec, fit);
      return [q?.value ?? null, q?.stderr ?? null];
    }),
    ...TRANSITION_ROWS.flatMap((_, k) => [transitions[k]?.model?.value ?? null, transitions[k]?.model?.stderr ?? null, transitions[k]?.measured ?? null]),
    fit.components ? `${fit.components.topology}, ${fit.components.known}` : null,
  ];
  return `${HEADER.join(',')}\r\n${row.map(csvCell).join(',')}\r\n`;
}
