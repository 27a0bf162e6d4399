// The hot loop on UTF-8 bytes: reads the plain data lines of a known layout into the column store, declining any other line to the text path.

import { MAX_LINE_LENGTH, lineTooLong } from './captureLimits';
import { NOT_PLAIN, storeLeadingNumber } from './cellValue';
import type { ColumnStore } from './columnStore';
import type { LineMap } from './lineMap';
import { ROW, SKIP } from './rowReader';
import { WHITESPACE } from './splitLine';

/** The line holds something only the text path judges (quotes, a cell that is not a plain number, extra cells). */
const DECLINED = 2;

const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;

/**
 * Mirrors RowReader.read for lines of plain numbers: what it stores it stores exactly as RowReader would, and
 * anything else it declines to RowReader (the row is not committed, so the text path simply reads it again).
 * It finds the end of each line as it reads the cells, in one pass over the bytes.
 */
export class ByteRowReader {
  /** File line of the last line read. */
  line = 0;
  /** Index of the LF ending the line last read. */
  private lineFeed = 0;
  private readonly count: number;
  private readonly delimiterCode: number;
  /** Tabs pad cells unless they separate them. */
  private readonly tabPads: boolean;

  constructor(
    private readonly store: ColumnStore,
    private readonly lines: LineMap,
    delimiter: string,
    private readonly decimalCode: number,
  ) {
    this.count = store.columns.length;
    this.delimiterCode = delimiter === WHITESPACE ? -1 : delimiter.charCodeAt(0);
    this.tabPads = this.delimiterCode !== TAB;
  }

  /**
   * Reads the lines from `pos` (after file line `line`) up to `complete` (just after an LF) while each is a row of
   * plain numbers, blank or a comment; returns where the first declined line starts, or `complete`. Each row's file
   * line goes to the line map; `this.line` is left at the last line read.
   */
  readRows(bytes: Uint8Array, pos: number, complete: number, line: number): number {
    if (this.delimiterCode >= 0) return this.readDelimitedRows(bytes, pos, complete, line);
    // The line map needs a row's line only where it does not follow from the row before (at the start, after a skip).
    let follows = false;
    while (pos < complete) {
      const outcome = this.skips(bytes, pos) ? SKIP : this.readWhitespace(bytes, this.skipPads(bytes, pos));
      if (outcome === DECLINED) break;
      line++;
      if (this.lineFeed - pos > MAX_LINE_LENGTH) throw lineTooLong(line);
      if (outcome === SKIP) follows = false;
      else if (!follows) {
        this.lines.record(this.store.length - 1, line);
        follows = true;
      }
      pos = this.lineFeed + 1;
    }
    this.line = line;
    return pos;
  }

  /**
   * readRows for a table with a delimiter: the whole row in one loop, the layout held in locals (a call per line,
   * and the fields read again on every line, took a fifth of the loop's time).
   */
  private readDelimitedRows(bytes: Uint8Array, pos: number, complete: number, line: number): number {
    const store = this.store;
    const columns = store.columns;
    const count = this.count;
    const delimiter = this.delimiterCode;
    const decimalCode = this.decimalCode;
    const tabPads = this.tabPads;
    let follows = false;
    for (; pos < complete; pos = this.lineFeed + 1) {
      if (this.skips(bytes, pos)) follows = false;
      else {
        store.reserve();
        const row = store.length;
        let col = 0;
        let p = pos;
        let c = 0;
        while ((c = bytes[p]) === SPACE || (c === TAB && tabPads)) p++;
        for (;;) {
          // An empty cell is a missing value, as the text path reads it (rows opening with empty fields are common).
          if (col < count && c === delimiter) columns[col][row] = NaN;
          else if (col < count) {
            p = storeLeadingNumber(bytes, p, decimalCode, columns[col], row);
            if (p === NOT_PLAIN) break;
            while ((c = bytes[p]) === SPACE || (c === TAB && tabPads)) p++;
          }
          col++;
          if (c !== delimiter) break;
          p++;
          while ((c = bytes[p]) === SPACE || (c === TAB && tabPads)) p++;
        }
        if (p === NOT_PLAIN || !this.endsLine(bytes, p)) break;
        this.commit(columns, row, col, pos);
        if (!follows) this.lines.record(row, line + 1);
        follows = true;
      }
      line++;
      if (this.lineFeed - pos > MAX_LINE_LENGTH) throw lineTooLong(line);
    }
    this.line = line;
    return pos;
  }

  /** True for a blank or comment line ('#', '%', '//', and ';' unless it separates cells); sets lineFeed. */
  private skips(bytes: Uint8Array, start: number): boolean {
    let p = start;
    let c = 0;
    while ((c = bytes[p]) === SPACE || c === TAB) p++;
    if (this.endsLine(bytes, p)) return true;
    if (c === 35 || c === 37 || (c === 47 && bytes[p + 1] === 47) || (c === 59 && this.delimiterCode !== 59)) {
      this.lineFeed = bytes.indexOf(LF, p);
      return true;
    }
    return false;
  }

  /** A row of a whitespace-separated table, from its first cell at p: ROW or DECLINED; sets lineFeed on a row. */
  private readWhitespace(bytes: Uint8Array, p: number): number {
    this.store.reserve();
    const start = p;
    const columns = this.store.columns;
    const row = this.store.length;
    let col = 0;
    for (;;) {
      if (col >= this.count) return DECLINED;
      const end = storeLeadingNumber(bytes, p, this.decimalCode, columns[col], row);
      if (end === NOT_PLAIN) return DECLINED;
      col++;
      p = this.skipPads(bytes, end);
      if (this.endsLine(bytes, p)) break;
      // A number must be followed by whitespace to be the whole cell.
      if (p === end) return DECLINED;
    }
    return this.commit(columns, row, col, start);
  }

  private skipPads(bytes: Uint8Array, p: number): number {
    let c = 0;
    while ((c = bytes[p]) === SPACE || (c === TAB && this.tabPads)) p++;
    return p;
  }

  /** True when the line ends at p (LF, or CR LF); sets lineFeed. */
  private endsLine(bytes: Uint8Array, p: number): boolean {
    const c = bytes[p];
    if (c === LF) this.lineFeed = p;
    else if (c === CR && bytes[p + 1] === LF) this.lineFeed = p + 1;
    else return false;
    return true;
  }

  /** Missing trailing cells are empty (NaN); the row, from `start` to lineFeed, is kept and counted as input. */
  private commit(columns: Float64Array[], row: number, filled: number, start: number): number {
    for (let col = filled; col < this.count; col++) columns[col][row] = NaN;
    this.store.length = row + 1;
    this.store.input += this.lineFeed - start + 1;
    return ROW;
  }
}
