// Builds the import summary from what the reader decided: the text's encoding and line end, the layout, the axes.

import { formatEngineering } from '../units/format';
import { LONG_TIME_SYMBOL } from '../units/unitText';
import type { DelimiterName, IgnoredSection, ImportSegment, ImportSummary, LineEnd, RowDrop, TextEncoding, TimeSource } from './importSummary';
import { INTERVAL_OPTION, type ColumnPlan, type Layout } from './layout';
import type { RowLines } from './segments';
import type { Channel } from './types';

/** What the reader found about the text itself: its decoding, and the parts of it beside the table read. */
export interface TextSource {
  encoding: TextEncoding;
  lineEnd: LineEnd | null;
  ignoredSections: IgnoredSection[];
  /** Every segment of a segmented table, the one read marked; empty for a table of one block. */
  segments: ImportSegment[];
}

/** A time axis as the assembler built it. */
export interface ImportedAxis {
  time: Float64Array;
  /** Source row of each axis row, or null when they are the file rows in order. */
  order: Uint32Array | null;
  interval: number | null;
  /** File rows this axis left out (repeated time stamps when sorted), or null. */
  leftOut: RowDrop | null;
}

export interface KeptChannel {
  channel: Channel;
  column: ColumnPlan;
  axis: ImportedAxis;
}

const DELIMITER_NAMES: Record<string, DelimiterName> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', ' ': 'whitespace', '': 'none' };

/** The unit a time column is written in: 's' for a scale of 1, a minute, hour or day by its symbol, else the scale in engineering notation ('ns'). */
function writtenTimeUnit(column: ColumnPlan): string {
  if (column.unit === '') return '';
  if (column.scale === 1) return 's';
  return LONG_TIME_SYMBOL[column.scale] ?? formatEngineering(column.scale, 's').replace(/^1 /, '');
}

function timeSource(layout: Layout, kept: KeptChannel): TimeSource {
  const index = kept.column.timeColumn;
  const source = index === null ? null : layout.columns[index];
  // The sampleInterval option builds the axis over a time column's own stamps too (assembleCapture's statedIntervalAxis).
  if (index !== null && source !== null && source.kind !== 'timestamp' && layout.interval?.key !== INTERVAL_OPTION) {
    return { kind: 'column', column: source.heading || `column ${index + 1}`, index: index + 1, unit: writtenTimeUnit(source) };
  }
  // The layout refuses a capture without a time column and without an interval, so one is stated here.
  const stated = layout.interval as NonNullable<Layout['interval']>;
  const option = stated.line === 0;
  return { kind: 'interval', interval: stated.value, from: option ? 'option' : 'preamble', key: option ? null : stated.key, line: option ? null : stated.line };
}

/** Mean step and, when the axis is not uniform, the standard deviation of its steps (rows without a time skipped). */
function steps(axis: ImportedAxis): { mean: number; jitter: number | null } {
  if (axis.interval !== null) return { mean: axis.interval, jitter: null };
  const time = axis.time;
  let count = 0;
  let sum = 0;
  let sumSquares = 0;
  let previous = NaN;
  for (let k = 0; k < time.length; k++) {
    const t = time[k];
    if (t !== t) continue;
    if (previous === previous) {
      const step = t - previous;
      count++;
      sum += step;
      sumSquares += step * step;
    }
    previous = t;
  }
  const mean = count > 0 ? sum / count : 0;
  return { mean, jitter: count > 1 ? Math.sqrt(Math.max(0, (sumSquares - count * mean * mean) / (count - 1))) : 0 };
}

/** Rows of a column axis that have no time (empty or unreadable time cell): left out of every channel on it. */
function timelessRows(axis: ImportedAxis, lines: RowLines): RowDrop | null {
  const { time, order } = axis;
  // includes() scans natively: the usual axis has a time on every row.
  if (!time.includes(NaN)) return null;
  let count = 0;
  let first: number | null = null;
  for (let k = 0; k < time.length; k++) {
    if (time[k] === time[k]) continue;
    count++;
    const row = order ? order[k] : k;
    if (first === null || row < first) first = row;
  }
  return count === 0 ? null : { reason: 'no readable time', count, firstLine: first === null ? null : lines.lineOf(first) };
}

/** Samples marked in a channel's clipped flags (each 0 or 1). */
function countMarked(flags: Uint8Array): number {
  // indexOf() scans natively: most channels have no clipped sample.
  if (flags.indexOf(1) < 0) return 0;
  let count = 0;
  for (let k = 0; k < flags.length; k++) count += flags[k];
  return count;
}

export function summarizeImport(source: TextSource, layout: Layout, rows: number, kept: KeptChannel[], lines: RowLines, warnings: string[]): ImportSummary {
  const axes = [...new Set(kept.map((k) => k.axis))];
  const droppedRows: RowDrop[] = [];
  for (const axis of axes) {
    if (axis.leftOut) droppedRows.push(axis.leftOut);
    const timeless = timelessRows(axis, lines);
    if (timeless) droppedRows.push(timeless);
  }
  const { mean, jitter } = steps(kept[0].axis);
  return {
    encoding: { ...source.encoding },
    delimiter: DELIMITER_NAMES[layout.delimiter] ?? 'none',
    decimalMark: layout.decimalComma ? ',' : '.',
    lineEnd: source.lineEnd,
    headerLine: layout.headerLine,
    firstDataLine: layout.firstDataLine,
    rows,
    time: timeSource(layout, kept[0]),
    sampleInterval: mean,
    jitter,
    channels: kept.map(({ channel }) => ({
      name: channel.name,
      unit: channel.unit,
      samples: channel.values.length,
      dropped: channel.dropped,
      clipped: countMarked(channel.clipped),
    })),
    droppedRows,
    ignoredSections: source.ignoredSections.map((x) => ({ ...x })),
    segments: source.segments.map((x) => ({ ...x })),
    warnings: [...warnings],
  };
}
