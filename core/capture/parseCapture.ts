// Reads capture text (a scope's CSV or text export), or a file's bytes, into a Capture, whole or streamed in chunks.
//
// How a text is read:
// - Bytes are UTF-8, UTF-16 (told by its byte-order mark) or, when not valid UTF-8, Windows-1252 (textEncoding).
//   A file that is not text (a known binary signature, or a NUL byte not in a run of them ending the file) is refused,
//   naming the telltale (binaryContent).
// - Lines end in LF, CRLF or CR; a byte-order mark is dropped (both noted in the capture's importSummary).
//   Blank lines and comments ('#', ';', '%', '//') are skipped anywhere; 'CR CR LF' ends a line like CR LF.
// - The table starts at the first of 3 rows that split the same way into numbers (or missing-value markers, or
//   wall-clock stamps). The delimiter is the one of tab, ';', ',', whitespace giving the most cells; ',' inside a
//   cell of a ';', tab or whitespace table (or of a quoted field) is a decimal comma. Rows opening with empty fields
//   may carry key/value metadata there beside the data in the table's first rows ('Sample Interval,2e-7,s,-1e-4,0.5'):
//   those rows are rows of the table, their metadata cells preamble lines; the layout is decided on 16 rows after the last.
// - The non-blank line just above the table is its header when none of its cells is a number (a line of units
//   such as '(s),(mV)' under the names is read too; a line of units alone, or one cell holding a number, is no
//   header; start and increment may sit in header cells or under the names in the row below; without any, a comment
//   line just above the data naming every column, the first time, is the header: '# t[us]  CH1[V]'). Units come from
//   'name (unit)', 'name [unit]', 'name/unit' or 'time_ns'; values are scaled to SI. A time column without a unit, and
//   a stated time without one, are in the unit a preamble line gives the horizontal axis ('Horizontal units,us',
//   '# Time unit: ms', 'X unit'; a comment line counts), else in seconds. Everything above the header is
//   the preamble of key/value lines. A ',' table of one whole number and fixed decimals per row is one column
//   written with decimal commas (see layout for when).
// - Time columns: a column holding wall-clock stamps; a header named time, t, x, sec(onds), timestamp or starting
//   with 'time', or with a time unit; where no column is so named, 't1', 'x2'... stepping evenly with a channel after
//   each. Each channel uses the nearest time column on its left (time/value pairs).
//   Without a header, the first of two or more columns is time when strictly increasing (or when sortTime is set);
//   otherwise every column is a channel. An empty field opening every row, and a column counting samples (an index
//   beside a time column, or a sequence number where the start and increment are stated) are no channels; see layout.
//   A time column whose unit neither its header, a units row nor timeUnit states is read in seconds, with a note.
// - Without a numeric time column, t = t0 + i * dt: dt from the sampleInterval option or a preamble key meaning
//   the sample interval (sample interval, sampling period, xincrement, delta t, dt, time per point, increment;
//   never a per-division scale), t0 from a numeric 't0', 'x origin' or 'start time' key, else 0.
// - Empty, NaN, inf, '****', '----' and overrange (|x| >= 9.9e37) cells are dropped per channel and counted; a line
//   repeating the header is skipped with a warning. Any other text in the table is an error naming its line, unless
//   no row of the table's shape follows it (a footer or a later section of another shape: left out, listed in
//   importSummary.ignoredSections), or the time goes back there to start another segment, or the first such row lies
//   more than 4 sample steps beyond the table's time (a later section of the same shape, a footer of totals: left out).
//   A number written with digit groups ('1,234.5', '1.234,5', '1 234,5') is refused naming its thousands separator, on
//   the line after the table too.
// - Segments: blocks of the same shape whose time restarts where the first block's did (after a line of text, a
//   blank line and the header, or nothing), or blocks after lines of text in a table without a time column, each of
//   at least 20 rows, are repeated acquisitions: the first is read, or the one `segment` names (see segments).
// - A last line without a line end that lacks cells, or digits its column is always written with, was cut off (a copy
//   or a write broken off): it is left out with a warning.
// - Time must increase strictly (sortTime sorts instead, keeping the first of repeated stamps); at least 20
//   samples are needed; flat runs at an ADC rail are marked in `clipped` (see detectClipping).
// - A line over 1 MiB or a table over 1,000 columns is refused naming its line (captureLimits), and so are rows so
//   much shorter than their table that storing them would take more cells than the file has bytes (ColumnStore).

import { assembleCapture } from './assembleCapture';
import { BinaryWatch, SIGNATURE_BYTES } from './binaryContent';
import { cutOffReason } from './cutLastLine';
import { ByteRowReader } from './byteRowReader';
import { ColumnStore } from './columnStore';
import { groupingCause } from './cellValue';
import { dataShape, groupedCell, groupedCellAnyDelimiter, sameShape, unitSuffixedCell, unreadableNumberCell, type DataShape } from './dataShape';
import { decideLayout, isReadColumn, rowDelimiter, type Layout } from './layout';
import { MAX_LINE_LENGTH, checkLastLine, checkUnfinishedLine, lineTooLong } from './captureLimits';
import { LineMap } from './lineMap';
import { isBlankOrComment, type PreambleLine } from './preamble';
import { ROW, RowReader, SKIP } from './rowReader';
import type { LineEnd, TextEncoding } from './importSummary';
import type { TextSource } from './summarizeImport';
import { DetectingDecoder, utf16Decoder, utf16Of, utf8LineDecoder, type LineDecoder } from './textEncoding';
import { HeldBytes } from './heldBytes';
import { SIDE_SETTLING_ROWS, isSideRow, sideRowsAbove, sideWidth, withoutSide } from './sideMetadata';
import { chooseSegment, findSegments, linesOfSpan, rowsOfSpan } from './segments';
import { TrailingSections } from './trailingSections';
import { CaptureError, type Capture, type CaptureOptions } from './types';
import { quotedValue } from '../units/parseQuantity';

/** Data rows of the same shape needed in a row before the table is taken to have started. */
const CONFIRMING_ROWS = 3;
/** Bytes decoded to text at a time while the layout is not yet known. */
const HEAD_BYTES = 1 << 14;
/** Places the line length is sampled to reserve rows for a piece of the table. */
const ESTIMATE_WINDOWS = 8;
/** Rows reserved beyond the estimate: unused room is never touched, so it costs address space, not memory. */
const ESTIMATE_MARGIN = 1.05;
/**
 * Further margin on the rows reserved for a whole file from the density of its first piece: lines lengthen or shorten
 * along a record by a character or two (a time stamp's exponent, a value's sign and digits as the signal rings).
 */
const EXTRAPOLATION_MARGIN = 1.25;
/**
 * Sample steps within which rows after a line that is not data resume the table's time: that line stood in for a few
 * rows (junk inside the table, refused); rows further on are a later section of the same shape (a footer of totals).
 */
const RESUMING_STEPS = 4;
const LF = 10;
const CR = 13;

/** The host's UTF-8 decoder (Buffer's toString, TextDecoder); it is only ever given whole lines. */
export type Utf8Decoder = (bytes: Uint8Array) => string;

export interface CaptureReader {
  /** Adds the next piece of text; pieces may split lines (and CRLF pairs) anywhere. */
  push(chunk: string): void;
  /**
   * Adds the next piece of the file's UTF-8 bytes, split anywhere (needs the reader's decoder; do not mix with
   * push). Lines of plain numbers are read straight from the bytes; every other line is decoded and read as text.
   */
  pushBytes(chunk: Uint8Array): void;
  /** Ends the text and returns the capture; throws CaptureError for a bad file. */
  finish(): Capture;
}

class StreamingReader implements CaptureReader {
  private line = 0;
  private carry = '';
  private started = false;
  private finished = false;
  private terminator: '\n' | '\r' | null = null;
  private lineEnd: LineEnd | null = null;
  /** Filled as the text is decoded: a byte-order mark is noted here when dropped. */
  private readonly encoding: TextEncoding;
  private head: PreambleLine[] = [];
  private run: number[] = [];
  private runShape: DataShape | null = null;
  /** Head lines of the run's table with metadata beside the data (see sideMetadata), and the data rows since the last. */
  private side: number[] = [];
  private plainSinceSide = 0;
  private layout: Layout | null = null;
  private store: ColumnStore | null = null;
  private rows: RowReader | null = null;
  private readonly lines = new LineMap();
  /** The first line after the rows that is not data: a later section, or a segment's separator when rows follow. */
  private pending: { line: number; message: string; text: string } | null = null;
  private pendingCount = 0;
  /** Set once the lines after the table are known to be a later section, whatever their shape: left out to the end. */
  private laterSection = false;
  private readonly trailing = new TrailingSections();
  /** Lines between rows of the table where its time goes back: each a segment's separator (or junk, if no segment starts there). */
  private readonly separators: { row: number; line: number; message: string }[] = [];
  /** Lines inside the table that repeat its header: skipped, counted; `rows` are the rows right after them. */
  private repeatedHeader: { line: number; count: number; rows: number[] } | null = null;
  private byteRows: ByteRowReader | null = null;
  /** Bytes pushed and not yet read: the unfinished last line, or pieces whose end is not yet known. */
  private readonly held = new HeldBytes();
  /** Bytes pushed so far. */
  private received = 0;
  /** Set when text read as text must wait for the end of the bytes (see readLines). */
  private textWaitsForEnd = false;
  /** Set once rows are reserved for the whole file (see reserveRows). */
  private reservedForFile = false;
  /** Why the last line, cut off, was left out; null when it was read. */
  private cutOff: string | null = null;

  /** `size`: the bytes the whole file will push, when known (no byte may come after them), so that its rows are reserved at once. */
  constructor(
    private readonly options: CaptureOptions,
    private readonly decode: LineDecoder | null,
    encoding: TextEncoding = { name: 'UTF-8', byteOrderMark: false },
    private readonly size: number | null = null,
  ) {
    this.encoding = decode?.encoding ?? encoding;
  }

  push(chunk: string): void {
    if (this.finished) throw new CaptureError('text pushed after finish()');
    if (!this.started && chunk.length > 0) {
      this.started = true;
      if (chunk.charCodeAt(0) === 0xfeff) {
        chunk = chunk.slice(1);
        this.encoding.byteOrderMark = true;
      }
    }
    const text = this.carry === '' ? chunk : this.carry + chunk;
    if (this.terminator === null) {
      // A CR is known to end lines alone once text other than CR or LF follows it ('CR CR LF' may be split after 'CR CR').
      this.terminator = text.includes('\n') ? '\n' : /\r[^\r\n]/.test(text) ? '\r' : null;
      if (this.terminator === null) {
        this.carry = text;
        return;
      }
      this.lineEnd = lineEndOf(text, this.terminator);
    }
    this.rows?.begin(text);
    let pos = 0;
    for (;;) {
      const at = text.indexOf(this.terminator, pos);
      if (at < 0) break;
      let end = at;
      // 'CR CR LF' ends lines too: every CR before the LF belongs to the line end.
      if (this.terminator === '\n') while (end > pos && text.charCodeAt(end - 1) === 13) end--;
      this.take(text, pos, end);
      pos = at + 1;
    }
    this.carry = pos === 0 ? text : text.slice(pos);
  }

  pushBytes(chunk: Uint8Array): void {
    if (this.finished) throw new CaptureError('bytes pushed after finish()');
    this.decoder(); // refused at once by a reader without one, though the bytes may wait to be decoded
    // A plain Uint8Array view (not a Buffer) keeps the hot loop's element reads monomorphic.
    const piece = new Uint8Array(chunk.buffer, chunk.byteOffset, chunk.byteLength);
    const held = this.held;
    this.received += piece.length;
    const last = this.received === this.size;
    if (held.length === 0) held.keep(piece, this.readLines(piece, last));
    else {
      held.append(piece);
      // A piece without a line end finishes no line, and cuts no piece of the head: the held bytes stay as they are.
      if (piece.includes(LF)) held.keep(held.bytes, this.readLines(held.bytes, last));
    }
    this.refuseLongUnfinishedLine();
  }

  /**
   * Refuses the unfinished last line once it is over the limit, rather than hold more of it: after the lines before
   * it are read, or while they wait in a piece of the head (which, whole, would end with this line and be refused for
   * it first). Only where it has no CR: a CR there may end lines or not, known only at the end, and the lines counted
   * before it depend on which.
   */
  private refuseLongUnfinishedLine(): void {
    const bytes = this.held.bytes;
    if (bytes.length <= MAX_LINE_LENGTH) return;
    const start = bytes.lastIndexOf(LF) + 1;
    if (bytes.length - start <= MAX_LINE_LENGTH || bytes.includes(CR, start) || (start > 0 && this.layout !== null)) return;
    throw lineTooLong(this.line + 1 + countLines(bytes, 0, start));
  }

  finish(): Capture {
    if (this.finished) throw new CaptureError('finish() called twice');
    if (this.held.length > 0) {
      const bytes = this.held.bytes;
      const complete = this.readLines(bytes, true);
      checkUnfinishedLine(bytes, complete, this.line + 1);
      if (complete < bytes.length) this.push(this.decoder().decode(bytes.subarray(complete), this.line + 1));
      this.held.keep(bytes, bytes.length);
    }
    const last = this.carry.endsWith('\r') ? this.carry.slice(0, -1) : this.carry;
    // The last line has no line end (a CR left there ended it): when it lacks cells or digits, it was cut off.
    const known = this.layout;
    const cut = last === this.carry && last !== '' && known ? cutOffReason(last, rowDelimiter(known), known.cellFormats) : null;
    this.carry = '';
    if (cut !== null) this.cutOff = `line ${++this.line}, the last, has no line end and ${cut}: it was cut off and is left out`;
    else if (last !== '') {
      this.rows?.begin(last);
      this.take(last, 0, last.length);
    }
    this.finished = true;
    if (this.layout === null) {
      if (this.run.length === 0) throw noRowsOfNumbers(this.line, this.head);
      this.startTable();
    }
    const layout = this.layout as Layout;
    const store = this.store as ColumnStore;
    const separatorRows = [...this.separators.map((s) => s.row), ...(this.repeatedHeader?.rows ?? [])];
    const spans = findSegments(layout, store, separatorRows);
    if (spans === null && this.separators.length > 0) throw new CaptureError(this.separators[0].message, this.separators[0].line);
    const { span, index } = chooseSegment(spans, store.length, this.options.segment);
    const footer =
      this.pending === null
        ? []
        : [`${this.pendingCount} line(s) after the last data row were ignored (from line ${this.pending.line}: '${this.pending.text}')`];
    if (this.cutOff !== null) footer.push(this.cutOff);
    const headers = this.repeatedHeader;
    // A header repeated at the start of each segment is part of the segments' layout, not worth a warning.
    if (headers && !(spans && headers.rows.every((row) => spans.some((s) => s.start === row)))) {
      footer.unshift(`${headers.count} line(s) repeating the header were skipped (first on line ${headers.line})`);
    }
    const segments = (spans ?? []).map((s, k) => ({ firstLine: this.lines.lineOf(s.start), lastLine: this.lines.lineOf(s.end - 1), rows: s.end - s.start, read: k === index }));
    const source: TextSource = { encoding: this.encoding, lineEnd: this.lineEnd, ignoredSections: this.trailing.list(), segments };
    const lines = linesOfSpan(this.lines, span);
    const read = spans === null ? layout : { ...layout, firstDataLine: lines.lineOf(0) };
    if (spans !== null) footer.push(`the file holds ${spans.length} segments (repeated acquisitions); segment ${index + 1} was read`);
    return assembleCapture(read, rowsOfSpan(store, span), lines, this.options, footer, source);
  }

  /** One line, text[start, end) without its terminator. */
  private take(text: string, start: number, end: number): void {
    this.line++;
    if (end - start > MAX_LINE_LENGTH) throw lineTooLong(this.line);
    if (this.rows) {
      this.readRow(text, this.line, start, end);
      return;
    }
    this.takeHeadLine(text.slice(start, end));
    // The table may have started on this line: later lines of this text go to the row reader.
    (this.rows as RowReader | null)?.begin(text);
  }

  private readRow(text: string, line: number, start: number, end: number): void {
    if (this.pending) {
      this.readAfterBreak(text, line, start, end);
      return;
    }
    const rows = this.rows as RowReader;
    const outcome = rows.read(start, end);
    if (outcome === SKIP) return;
    if (outcome === ROW) {
      this.rowStored(line);
      return;
    }
    const header = (this.layout as Layout).headerText;
    if (header !== null && text.slice(start, end).trim() === header.trim()) {
      this.repeatedHeader ??= { line, count: 0, rows: [] };
      this.repeatedHeader.count++;
      this.repeatedHeader.rows.push((this.store as ColumnStore).length);
      return;
    }
    // A row of numbers written with digit groups is data the reader cannot take: refused here, not left out as a later section.
    if (groupedCell(text.slice(start, end), rowDelimiter(this.layout as Layout)) !== null) throw new CaptureError(outcome as string, line);
    const shown = text.slice(start, Math.min(end, start + 60)).trim();
    this.pending = { line, message: outcome as string, text: shown };
    this.pendingCount = 1;
    this.trailing.add(line, text.slice(start, end), null);
  }

  /**
   * After a line that is not data: a row of the table's shape starts a new segment when the time goes back there (or
   * the table has no time column: judged at the end), means junk inside the table when its time resumes the table's,
   * and else starts a later section of the same shape (a footer of totals); other lines are a later section. A later
   * section runs to the end, left out.
   */
  private readAfterBreak(text: string, line: number, start: number, end: number): void {
    const lineText = text.slice(start, end);
    if (isBlankOrComment(lineText)) {
      this.trailing.gap();
      return;
    }
    const shape = dataShape(lineText);
    const pending = this.pending as NonNullable<typeof this.pending>;
    if (!this.laterSection && shape && this.runShape && sameShape(shape, this.runShape)) {
      const store = this.store as ColumnStore;
      if ((this.rows as RowReader).read(start, end) !== ROW) throw new CaptureError(pending.message, pending.line);
      if (this.timeGoesBack()) {
        this.separators.push({ row: store.length - 1, line: pending.line, message: pending.message });
        this.pending = null;
        this.pendingCount = 0;
        this.trailing.clear();
        this.rowStored(line);
        return;
      }
      if (this.timeResumes()) throw new CaptureError(pending.message, pending.line);
      // The row just read is no row of the table: taken back, and left out with the rest of its section.
      store.length--;
      this.laterSection = true;
    }
    this.pendingCount++;
    this.trailing.add(line, lineText, shape);
  }

  /** True when the last stored row's time resumes the table's (RESUMING_STEPS steps or fewer after the row before), or cannot be judged. */
  private timeResumes(): boolean {
    const store = this.store as ColumnStore;
    const index = (this.layout as Layout).columns.findIndex((c) => c.kind === 'time' || c.kind === 'maybe-time');
    const n = store.length;
    if (index < 0 || n < 3) return true;
    const time = store.columns[index];
    const step = time[n - 2] - time[n - 3];
    return !(step > 0) || time[n - 1] - time[n - 2] <= RESUMING_STEPS * step;
  }

  /** True when the last stored row's time is not after the row before it, or the table has no time column. */
  private timeGoesBack(): boolean {
    const store = this.store as ColumnStore;
    const index = (this.layout as Layout).columns.findIndex((c) => c.kind === 'time' || c.kind === 'maybe-time');
    if (index < 0) return true;
    const n = store.length;
    return n >= 2 && store.columns[index][n - 1] <= store.columns[index][n - 2];
  }

  private rowStored(line: number): void {
    if (this.pending) throw new CaptureError(this.pending.message, this.pending.line);
    this.lines.record((this.store as ColumnStore).length - 1, line);
  }

  /**
   * Reads the complete lines of `bytes` (which end with the last byte pushed) as far as can be done now, and returns
   * where the bytes not yet read start. Until the `final` bytes, a piece of the head is cut only once the line end that closes
   * it has come, and text that reads as text waits while its encoding may still turn on later bytes: so the decoder
   * sees the pieces it would see were all the bytes pushed at once, and decides the same.
   */
  private readLines(bytes: Uint8Array, final: boolean): number {
    const complete = bytes.lastIndexOf(LF) + 1;
    let pos = 0;
    while (pos < complete && this.byteRows === null) {
      let cut = complete;
      if (this.layout === null) {
        // The piece ends at the first line end at least HEAD_BYTES on (bytes[complete - 1] is a line end).
        if (!final && complete < pos + HEAD_BYTES) return pos;
        cut = lineEndAfter(bytes, pos + HEAD_BYTES, complete);
      } else if (!final && (this.textWaitsForEnd || !this.decoder().settles(bytes.subarray(pos, complete)))) {
        // The rest is one piece of text: it waits, once, for the end of the bytes.
        this.textWaitsForEnd = true;
        return pos;
      }
      checkLastLine(bytes, pos, cut, this.line + 1);
      this.push(this.decoder().decode(bytes.subarray(pos, cut), this.line + 1));
      pos = cut;
      this.byteRows = this.byteRowReader();
    }
    if (pos < complete) {
      this.reserveRows(bytes, pos, complete);
      this.readByteLines(bytes, pos, complete);
    }
    return complete;
  }

  /**
   * Reserves the rows of bytes[pos, complete) at once. When the file's size is known and more of it is to come, the
   * rows of all of it are reserved the first time, at the density of these lines, so that the columns are allocated
   * once; rows beyond that grow them as they come.
   */
  private reserveRows(bytes: Uint8Array, pos: number, complete: number): void {
    if (this.reservedForFile) return;
    const store = this.store as ColumnStore;
    const rows = estimateLines(bytes, pos, complete);
    const later = this.size === null ? 0 : this.size - this.received;
    if (later <= 0) return store.expect(rows, complete - pos);
    this.reservedForFile = true;
    const coming = complete - pos + later;
    store.expect(Math.ceil((rows * coming * EXTRAPOLATION_MARGIN) / (complete - pos)), coming);
  }

  /** The complete lines bytes[pos, complete) of the table, runs of them from the bytes, each line declined as text. */
  private readByteLines(bytes: Uint8Array, pos: number, complete: number): void {
    const byteRows = this.byteRows as ByteRowReader;
    while (pos < complete) {
      // After a line that is not data, every line goes to the text path, which tells junk from a later section.
      if (this.pending === null) {
        pos = byteRows.readRows(bytes, pos, complete, this.line);
        this.line = byteRows.line;
        if (pos === complete) return;
      }
      const line = ++this.line;
      const at = bytes.indexOf(LF, pos);
      if (at - pos > MAX_LINE_LENGTH) throw lineTooLong(line);
      let end = at;
      while (end > pos && bytes[end - 1] === CR) end--;
      const text = this.decoder().decode(bytes.subarray(pos, end), line);
      (this.rows as RowReader).begin(text);
      this.readRow(text, line, 0, text.length);
      pos = at + 1;
    }
  }

  /** The byte reader once the layout is known, when lines end in LF and every column holds numbers; else null. */
  private byteRowReader(): ByteRowReader | null {
    const layout = this.layout;
    if (layout === null || this.terminator !== '\n' || layout.columns.some((c) => !isReadColumn(c))) return null;
    const delimiter = rowDelimiter(layout);
    // A decimal comma in a comma-separated table (from quoted fields) needs the cells split first: the text path.
    if (layout.decimalComma && delimiter === ',') return null;
    return new ByteRowReader(this.store as ColumnStore, this.lines, delimiter, layout.decimalComma ? 44 : 46);
  }

  private decoder(): LineDecoder {
    if (this.decode === null) throw new Error('pushBytes needs a reader made with a UTF-8 decoder (createCaptureReader(options, decode))');
    return this.decode;
  }

  private takeHeadLine(text: string): void {
    this.head.push({ text, line: this.line });
    const index = this.head.length - 1;
    const shape = dataShape(text);
    if (shape === null && isBlankOrComment(text)) return;
    const side = this.runShape !== null && isSideRow(text, this.runShape);
    // Rows enough for a table, broken while metadata beside them might still come: the table has started, and this
    // line is read as one of its lines (a footer, junk, a segment's separator), as when the table starts at once.
    if (!side && !(shape && this.runShape && sameShape(shape, this.runShape)) && this.run.length >= CONFIRMING_ROWS) {
      this.startTable();
      return;
    }
    if (side) {
      this.side.push(index);
      this.plainSinceSide = 0;
    } else if (shape && this.runShape && sameShape(shape, this.runShape)) {
      this.run.push(index);
      this.plainSinceSide++;
    } else if (shape) {
      this.run = [index];
      this.runShape = shape;
      this.side = sideRowsAbove(this.head, index, shape);
      this.plainSinceSide = 1;
    } else {
      this.run = [];
      this.runShape = null;
      this.side = [];
      this.plainSinceSide = 0;
    }
    // Rows opening with empty fields may have metadata beside the first of them: all of it is read before the layout.
    const confirming = this.runShape && sideWidth(this.runShape) > 0 ? SIDE_SETTLING_ROWS : CONFIRMING_ROWS;
    if (this.plainSinceSide === confirming) this.startTable();
  }

  /**
   * The table has started at its first row (the first confirming row, or one above it with metadata beside the data):
   * fix the layout, then read the rows held back.
   */
  private startTable(): void {
    const layout = decideLayout(this.head, this.run, this.options, this.side);
    const parsed = layout.columns.map(isReadColumn);
    this.layout = layout;
    this.store = new ColumnStore(parsed, () => this.line);
    const rows = new RowReader(this.store, parsed, rowDelimiter(layout), layout.decimalComma);
    this.rows = rows;
    const side = new Set(this.side);
    const start = Math.min(this.run[0], this.side[0] ?? this.run[0]);
    for (let i = start; i < this.head.length; i++) {
      const { line } = this.head[i];
      // Metadata beside the data went to the preamble (decideLayout): the row reader reads the data cells only.
      const text = side.has(i) ? withoutSide(this.head[i].text, this.runShape as DataShape) : this.head[i].text;
      rows.begin(text);
      this.readRow(text, line, 0, text.length);
    }
    this.head = [];
  }
}

/**
 * An incremental reader: push the text (or, given a decoder, the bytes) in pieces of any size, then finish().
 * A UTF-8 function reads UTF-8 bytes; a DetectingDecoder also reads Windows-1252 (createCaptureFileReader reads any
 * capture file).
 */
export function createCaptureReader(options: CaptureOptions = {}, decode: Utf8Decoder | LineDecoder | null = null): CaptureReader {
  return new StreamingReader(options, typeof decode === 'function' ? utf8LineDecoder(decode) : decode);
}

/** Reads a whole capture from its UTF-8 bytes: the same capture as parseCapture(decode(bytes)), sooner. */
export function parseCaptureBytes(bytes: Uint8Array, decode: Utf8Decoder, options: CaptureOptions = {}): Capture {
  const reader = createCaptureReader(options, decode);
  reader.pushBytes(bytes);
  return reader.finish();
}

/**
 * The one entry for a capture file's bytes as written (read from disk, or dropped in the window): UTF-8 with or
 * without a byte-order mark (numbers read straight from the bytes), UTF-16 LE or BE, or Windows-1252 / Latin-1 when
 * the bytes are not valid UTF-8. The encoding found, and why, is in importSummary.encoding. Pure: uses TextDecoder only.
 */
export function parseCaptureFileBytes(bytes: Uint8Array, options: CaptureOptions = {}): Capture {
  const reader = createCaptureFileReader(options, bytes.length);
  reader.pushBytes(bytes);
  return reader.finish();
}

/** A reader of a file's bytes in any encoding (the text itself is not pushed). */
export type CaptureFileReader = Pick<CaptureReader, 'pushBytes' | 'finish'>;

/** Bytes of the start of a file that tell UTF-16 without a byte-order mark (see utf16Of). */
const ENCODING_BYTES = 4;
/** Bytes of the start of a file held until its reader is chosen: its encoding, or the signature of a binary file, told from them. */
const START_BYTES = Math.max(ENCODING_BYTES, SIGNATURE_BYTES);

/**
 * A capture file's bytes pushed in pieces of any size, then finish(): the capture parseCaptureFileBytes gives for all
 * of them. `size`, the file's length when known (no byte may be pushed beyond it), lets the columns be reserved once
 * rather than grown, and the last piece be read at once.
 */
export function createCaptureFileReader(options: CaptureOptions = {}, size: number | null = null): CaptureFileReader {
  let start: Uint8Array = new Uint8Array(0);
  let reader: StreamingReader | null = null;
  let utf16: ((bytes?: Uint8Array) => string) | null = null;
  // Bytes read as UTF-8 or Windows-1252 are checked for binary content before they are read (UTF-16 text holds NUL bytes).
  const binary = new BinaryWatch();
  const pass = (bytes: Uint8Array): void => {
    if (utf16) return (reader as StreamingReader).push(utf16(bytes));
    binary.check(bytes);
    (reader as StreamingReader).pushBytes(bytes);
  };
  /** The encoding is told from the first bytes; they go to the reader it needs. */
  const begin = (first: Uint8Array): void => {
    const encoding = utf16Of(first);
    if (encoding === null) reader = new StreamingReader(options, new DetectingDecoder(), undefined, size);
    else {
      reader = new StreamingReader(options, null, encoding);
      utf16 = utf16Decoder(encoding);
    }
    pass(first);
  };
  return {
    pushBytes(chunk) {
      if (reader !== null) pass(chunk);
      else if (start.length + chunk.length < START_BYTES) start = joinBytes(start, chunk);
      else begin(start.length === 0 ? chunk : joinBytes(start, chunk));
    },
    finish() {
      if (reader === null) begin(start);
      if (utf16) (reader as StreamingReader).push(utf16());
      else binary.end();
      return (reader as StreamingReader).finish();
    },
  };
}

/**
 * Lines (not blank, not comments) of a text without a table searched for a row written with digit groups: such rows
 * start near the top of an export, and a long text of another kind is not searched to its end.
 */
const GROUPED_SEARCH_LINES = 1000;

/** The error for a text without a table, naming the first line that would be a row of numbers but for digit groups. */
function noRowsOfNumbers(lines: number, head: PreambleLine[]): CaptureError {
  if (lines === 0) return new CaptureError('the file is empty: no rows of numbers');
  const message = `no rows of numbers found in ${lines} line(s)`;
  let searched = 0;
  for (const { text, line } of head) {
    if (isBlankOrComment(text)) continue;
    if (++searched > GROUPED_SEARCH_LINES) break;
    const cell = groupedCellAnyDelimiter(text);
    if (cell !== null) return new CaptureError(`${message}; line ${line} holds '${cell.trim()}': ${groupingCause(cell)}`);
    const withUnit = unitSuffixedCell(text);
    if (withUnit !== null) {
      return new CaptureError(
        `${message}; line ${line} holds ${quotedValue(withUnit.trim())}: a unit written after each number is not read; export the values as plain numbers, with the units in the column headers ('Time (us)')`,
      );
    }
    const unread = unreadableNumberCell(text);
    if (unread !== null) {
      return new CaptureError(`${message}; line ${line} holds ${quotedValue(unread.trim())}, which does not read as a number; export plain decimal numbers (such as -1.5e-06)`);
    }
  }
  return new CaptureError(message);
}

/** The line end of a text by its first terminator: CR alone, or LF with or without a CR before it. */
function lineEndOf(text: string, terminator: '\n' | '\r'): LineEnd {
  if (terminator === '\r') return 'CR';
  const at = text.indexOf('\n');
  return at > 0 && text.charCodeAt(at - 1) === CR ? 'CRLF' : 'LF';
}

function joinBytes(a: Uint8Array, b: Uint8Array): Uint8Array {
  const joined = new Uint8Array(a.length + b.length);
  joined.set(a);
  joined.set(b, a.length);
  return joined;
}

/**
 * Lines in bytes[from, to), a little over: from the shortest lines of ESTIMATE_WINDOWS windows of HEAD_BYTES spread
 * over the range (lines often lengthen further on, as a signal starts to ring), so that one allocation holds them.
 */
function estimateLines(bytes: Uint8Array, from: number, to: number): number {
  if (to - from <= ESTIMATE_WINDOWS * HEAD_BYTES) return countLines(bytes, from, to);
  const spacing = Math.floor((to - from - HEAD_BYTES) / (ESTIMATE_WINDOWS - 1));
  let densest = 0;
  for (let k = 0; k < ESTIMATE_WINDOWS; k++) densest = Math.max(densest, countLines(bytes, from + k * spacing, from + k * spacing + HEAD_BYTES));
  return Math.ceil((densest * (to - from) * ESTIMATE_MARGIN) / HEAD_BYTES);
}

function countLines(bytes: Uint8Array, from: number, to: number): number {
  let lines = 0;
  for (let at = bytes.indexOf(LF, from); at >= 0 && at < to; at = bytes.indexOf(LF, at + 1)) lines++;
  return lines;
}

/** The position just after the first LF at or beyond `from` - 1, at most `limit` (itself just after an LF). */
function lineEndAfter(bytes: Uint8Array, from: number, limit: number): number {
  if (from >= limit) return limit;
  const at = bytes.indexOf(LF, from - 1);
  return at < 0 || at >= limit ? limit : at + 1;
}

/** Reads a whole capture text. Throws CaptureError naming the 1-based line and what was wrong. */
export function parseCapture(text: string, options: CaptureOptions = {}): Capture {
  const reader = createCaptureReader(options);
  reader.push(text);
  return reader.finish();
}
