// Reads capture text (a scope's CSV or text export) into a Capture, whole or streamed in chunks.
//
// How a text is read:
// - Lines end in LF, CRLF or CR; a UTF-8 byte-order mark is dropped. Blank lines and comments ('#', ';', '%', '//')
//   are skipped anywhere.
// - The table starts at the first of 3 rows that split the same way into numbers (or missing-value markers, or
//   wall-clock stamps). The delimiter is the one of tab, ';', ',', whitespace giving the most cells; ',' inside a
//   cell of a ';', tab or whitespace table (or of a quoted field) is a decimal comma.
// - The non-blank line just above the table is its header when none of its cells is a number (a line of units
//   such as '(s),(mV)' under the names is read too). Units come from 'name (unit)', 'name [unit]', 'name/unit' or
//   'time_ns'; values are scaled to SI. Everything above the header is the preamble of key/value lines.
// - Time columns: a column holding wall-clock stamps; a header named time, t, x, sec(onds), timestamp or starting
//   with 'time', or with a time unit. Each channel uses the nearest time column on its left (time/value pairs).
//   Without a header, the first of two or more columns is time when strictly increasing (or when sortTime is set);
//   otherwise every column is a channel.
// - Without a numeric time column, t = t0 + i * dt: dt from the sampleInterval option or a preamble key meaning
//   the sample interval (sample interval, sampling period, xincrement, delta t, dt, time per point, increment;
//   never a per-division scale), t0 from a numeric 't0', 'x origin' or 'start time' key, else 0.
// - Empty, NaN, inf, '****' and overrange (|x| >= 9.9e37) cells are dropped per channel and counted. Any other text
//   in the table is an error naming its line, unless only such lines follow (a footer, ignored with a warning).
// - Time must increase strictly (sortTime sorts instead, keeping the first of repeated stamps); at least 20
//   samples are needed; flat runs at an ADC rail are marked in `clipped` (see detectClipping).

import { assembleCapture } from './assembleCapture';
import { ColumnStore } from './columnStore';
import { dataShape, sameShape, type DataShape } from './dataShape';
import { decideLayout, type Layout } from './layout';
import { LineMap } from './lineMap';
import { isBlankOrComment, type PreambleLine } from './preamble';
import { ROW, RowReader, SKIP } from './rowReader';
import { CaptureError, type Capture, type CaptureOptions } from './types';

/** Data rows of the same shape needed in a row before the table is taken to have started. */
const CONFIRMING_ROWS = 3;

export interface CaptureReader {
  /** Adds the next piece of text; pieces may split lines (and CRLF pairs) anywhere. */
  push(chunk: string): void;
  /** Ends the text and returns the capture; throws CaptureError for a bad file. */
  finish(): Capture;
}

class StreamingReader implements CaptureReader {
  private line = 0;
  private carry = '';
  private started = false;
  private finished = false;
  private terminator: '\n' | '\r' | null = null;
  private head: PreambleLine[] = [];
  private run: number[] = [];
  private runShape: DataShape | null = null;
  private layout: Layout | null = null;
  private store: ColumnStore | null = null;
  private rows: RowReader | null = null;
  private readonly lines = new LineMap();
  private pending: { line: number; message: string; text: string } | null = null;
  private pendingCount = 0;

  constructor(private readonly options: CaptureOptions) {}

  push(chunk: string): void {
    if (this.finished) throw new CaptureError('text pushed after finish()');
    if (!this.started && chunk.length > 0) {
      this.started = true;
      if (chunk.charCodeAt(0) === 0xfeff) chunk = chunk.slice(1);
    }
    const text = this.carry === '' ? chunk : this.carry + chunk;
    this.terminator ??= text.includes('\n') ? '\n' : /\r[^]/.test(text) ? '\r' : null;
    if (this.terminator === null) {
      this.carry = text;
      return;
    }
    this.rows?.begin(text);
    let pos = 0;
    for (;;) {
      const at = text.indexOf(this.terminator, pos);
      if (at < 0) break;
      const end = this.terminator === '\n' && at > pos && text.charCodeAt(at - 1) === 13 ? at - 1 : at;
      this.take(text, pos, end);
      pos = at + 1;
    }
    this.carry = pos === 0 ? text : text.slice(pos);
  }

  finish(): Capture {
    if (this.finished) throw new CaptureError('finish() called twice');
    const last = this.carry.endsWith('\r') ? this.carry.slice(0, -1) : this.carry;
    this.carry = '';
    if (last !== '') {
      this.rows?.begin(last);
      this.take(last, 0, last.length);
    }
    this.finished = true;
    if (this.layout === null) {
      if (this.run.length === 0) throw new CaptureError(`no rows of numbers found in ${this.line} line(s)`);
      this.startTable();
    }
    const footer =
      this.pending === null
        ? []
        : [`${this.pendingCount} line(s) after the last data row were ignored (from line ${this.pending.line}: '${this.pending.text}')`];
    return assembleCapture(this.layout as Layout, this.store as ColumnStore, this.lines, this.options, footer);
  }

  /** One line, text[start, end) without its terminator. */
  private take(text: string, start: number, end: number): void {
    this.line++;
    if (this.rows) {
      this.readRow(text, this.line, start, end);
      return;
    }
    this.takeHeadLine(text.slice(start, end));
    // The table may have started on this line: later lines of this text go to the row reader.
    (this.rows as RowReader | null)?.begin(text);
  }

  private readRow(text: string, line: number, start: number, end: number): void {
    const rows = this.rows as RowReader;
    const outcome = rows.read(start, end);
    if (outcome === SKIP) return;
    if (outcome === ROW) {
      if (this.pending) throw new CaptureError(this.pending.message, this.pending.line);
      this.lines.record((this.store as ColumnStore).length - 1, line);
      return;
    }
    const shown = text.slice(start, Math.min(end, start + 60)).trim();
    this.pending ??= { line, message: outcome as string, text: shown };
    this.pendingCount++;
  }

  private takeHeadLine(text: string): void {
    this.head.push({ text, line: this.line });
    if (isBlankOrComment(text)) return;
    const shape = dataShape(text);
    if (shape && this.runShape && sameShape(shape, this.runShape)) this.run.push(this.head.length - 1);
    else if (shape) {
      this.run = [this.head.length - 1];
      this.runShape = shape;
    } else {
      this.run = [];
      this.runShape = null;
    }
    if (this.run.length === CONFIRMING_ROWS) this.startTable();
  }

  /** The table has started at the first confirming row: fix the layout, then read the rows held back. */
  private startTable(): void {
    const layout = decideLayout(this.head, this.run, this.options);
    const parsed = layout.columns.map((c) => c.kind !== 'timestamp');
    this.layout = layout;
    this.store = new ColumnStore(parsed);
    const rows = new RowReader(this.store, parsed, layout.delimiter || ',', layout.decimalComma);
    this.rows = rows;
    for (const { text, line } of this.head.slice(this.run[0])) {
      rows.begin(text);
      this.readRow(text, line, 0, text.length);
    }
    this.head = [];
  }
}

/** An incremental reader: push the text in pieces of any size, then finish(). */
export function createCaptureReader(options: CaptureOptions = {}): CaptureReader {
  return new StreamingReader(options);
}

/** Reads a whole capture text. Throws CaptureError naming the 1-based line and what was wrong. */
export function parseCapture(text: string, options: CaptureOptions = {}): Capture {
  const reader = createCaptureReader(options);
  reader.push(text);
  return reader.finish();
}
