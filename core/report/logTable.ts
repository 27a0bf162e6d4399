// The bench log as the table `ringbench log list` prints: one line per measurement.

import type { BenchRecord } from './benchRecord';
import { escapeControls } from './escape';
import { briefValue, regimeTag } from './resultRows';
import { recordStatus } from './yieldSummary';

/** The regime cell of a failed fit, which has none. */
const NONE = '-';

const COLUMNS = ['time', 'unit', 'regime', 'f0', 'zeta', 'verdict'] as const;

export function formatLogTable(records: readonly BenchRecord[]): string {
  const rows = records.map((r) => [
    r.time.slice(0, 19).replace('T', ' '),
    escapeControls(r.unit),
    regimeTag(r.fit) ?? NONE,
    briefValue(r.fit, 'f0'),
    briefValue(r.fit, 'zeta'),
    recordStatus(r),
  ]);
  const widths = COLUMNS.map((name, c) => Math.max(name.length, ...rows.map((row) => row[c].length)));
  const line = (cells: readonly string[]) => cells.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd();
  return [line(COLUMNS), ...rows.map(line)].map((l) => `${l}\n`).join('');
}
