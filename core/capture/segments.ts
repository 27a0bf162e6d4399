// Segments: a table holding several acquisitions of the same shape one after another, split apart, and the one to read.

import { MIN_SAMPLES } from './captureLimits';
import type { Layout } from './layout';
import { CaptureError } from './types';

/** Rows [start, end) of the stored table. */
export interface RowSpan {
  start: number;
  end: number;
}

/** The stored rows as the assembler reads them (a ColumnStore, or a segment of one). */
export interface StoredRows {
  readonly length: number;
  column(c: number): Float64Array;
  /**
   * Column c's rows for the capture to keep, which may be changed in place: the stored rows themselves where they are
   * all the column holds (its room beyond them is never touched), else a copy. Column c is not read again after.
   */
  keep(c: number): Float64Array;
}

/** The file line of each stored row (a LineMap, or a segment's view of one). */
export interface RowLines {
  lineOf(row: number): number;
}

/**
 * How far a segment's first time may lie from the first segment's, in sample steps: repeated acquisitions start at
 * the same time after their trigger, give or take the placing of one sample.
 */
const START_TOLERANCE_STEPS = 1;

/**
 * The segments of a table, or null when it is one block (or its blocks are not clean repeats). With a time column,
 * a segment starts wherever the time goes back (separator lines there are skipped), and every segment must start
 * where the first does and hold at least MIN_SAMPLES rows; without one (an axis from the interval), segments start
 * after separator lines (`separatorRows`: the first row after each) and must hold MIN_SAMPLES rows.
 */
export function findSegments(layout: Layout, rows: StoredRows, separatorRows: number[]): RowSpan[] | null {
  const timeIndex = layout.columns.findIndex((c) => c.kind === 'time' || c.kind === 'maybe-time');
  const starts = timeIndex < 0 ? [...new Set([0, ...separatorRows])].sort((a, b) => a - b) : restarts(rows.column(timeIndex));
  if (starts.length < 2) return null;
  const spans = starts.map((start, k) => ({ start, end: starts[k + 1] ?? rows.length }));
  if (spans.some((s) => s.end - s.start < MIN_SAMPLES)) return null;
  if (timeIndex >= 0 && !startTogether(rows.column(timeIndex), spans)) return null;
  return spans;
}

/** Row 0 and each row whose time is not after the last readable time before it. */
function restarts(time: Float64Array): number[] {
  const starts = [0];
  // The row of the last readable time, not the time: a double carried through this long loop would be boxed at every row.
  let previous = -1;
  for (let r = 0; r < time.length; r++) {
    const t = time[r];
    if (t !== t) continue;
    if (previous >= 0 && t <= time[previous]) starts.push(r);
    previous = r;
  }
  return starts;
}

function firstReadable(time: Float64Array, span: RowSpan): { t: number; row: number } | null {
  for (let r = span.start; r < span.end; r++) if (time[r] === time[r]) return { t: time[r], row: r };
  return null;
}

/** True when every span starts within START_TOLERANCE_STEPS mean steps of the first span's start. */
function startTogether(time: Float64Array, spans: RowSpan[]): boolean {
  const first = firstReadable(time, spans[0]);
  if (first === null) return false;
  let last = first;
  for (let r = spans[0].end - 1; r > first.row; r--) {
    if (time[r] === time[r]) {
      last = { t: time[r], row: r };
      break;
    }
  }
  const step = (last.t - first.t) / Math.max(1, last.row - first.row);
  return spans.every((span) => {
    const start = firstReadable(time, span);
    return start !== null && Math.abs(start.t - first.t) <= START_TOLERANCE_STEPS * step;
  });
}

/** The span to read: segment `asked` (1-based; default 1), refusing a number that names no segment with the count. */
export function chooseSegment(spans: RowSpan[] | null, rows: number, asked: number | undefined): { span: RowSpan; index: number } {
  const all = spans ?? [{ start: 0, end: rows }];
  if (asked === undefined) return { span: all[0], index: 0 };
  if (!(Number.isInteger(asked) && asked >= 1 && asked <= all.length)) {
    const count = all.length === 1 ? 'one segment (it holds no repeated blocks)' : `${all.length} segments`;
    throw new CaptureError(`segment ${String(asked)} was asked for, but the file has ${count}; segments count from 1`);
  }
  return { span: all[asked - 1], index: asked - 1 };
}

/** The rows of one span, as the assembler reads a whole table; a segment's column is kept as a copy, not with the others around it. */
export function rowsOfSpan(rows: StoredRows, span: RowSpan): StoredRows {
  const whole = span.start === 0 && span.end === rows.length;
  return {
    length: span.end - span.start,
    column: (c) => rows.column(c).subarray(span.start, span.end),
    keep: (c) => (whole ? rows.keep(c) : rows.column(c).slice(span.start, span.end)),
  };
}

/** The file lines of one span's rows. */
export function linesOfSpan(lines: RowLines, span: RowSpan): RowLines {
  return { lineOf: (row) => lines.lineOf(row + span.start) };
}
