// The hot loop on UTF-8 bytes: reads a plain data line of a known layout into the column store, or declines it to the text path.

import { leadingNumber, numberEnd } from './cellValue';
import type { ColumnStore } from './columnStore';
import { ROW, SKIP } from './rowReader';
import { WHITESPACE } from './splitLine';

/** The line holds something only the text path judges (quotes, a cell that is not a plain number, extra cells). */
export const DECLINED = 2;

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
  /** Index of the LF ending the line last read. */
  lineFeed = 0;
  private readonly count: number;
  private readonly delimiterCode: number;
  /** Tabs pad cells unless they separate them. */
  private readonly tabPads: boolean;

  constructor(
    private readonly store: ColumnStore,
    delimiter: string,
    private readonly decimalCode: number,
  ) {
    this.count = store.columns.length;
    this.delimiterCode = delimiter === WHITESPACE ? -1 : delimiter.charCodeAt(0);
    this.tabPads = this.delimiterCode !== TAB;
  }

  /** Reads the line starting at `start` (an LF lies before `limit`): ROW, SKIP or DECLINED; sets lineFeed. */
  read(bytes: Uint8Array, start: number, limit: number): number {
    let p = start;
    let c = 0;
    while ((c = bytes[p]) === SPACE || c === TAB) p++;
    if (this.endsLine(bytes, p)) return SKIP;
    if (c === 35 || c === 37 || (c === 47 && bytes[p + 1] === 47) || (c === 59 && this.delimiterCode !== 59)) return this.passLine(bytes, p, SKIP);
    this.store.reserve();
    return this.delimiterCode < 0 ? this.readWhitespace(bytes, p, limit) : this.readDelimited(bytes, start, limit);
  }

  private readDelimited(bytes: Uint8Array, start: number, limit: number): number {
    const columns = this.store.columns;
    const row = this.store.length;
    const delimiter = this.delimiterCode;
    let col = 0;
    let p = this.skipPads(bytes, start);
    for (;;) {
      if (col < this.count) {
        const value = leadingNumber(bytes, p, limit, this.decimalCode);
        if (value !== value) return this.passLine(bytes, p, DECLINED);
        columns[col][row] = value;
        p = this.skipPads(bytes, numberEnd);
      }
      col++;
      if (bytes[p] !== delimiter) break;
      p = this.skipPads(bytes, p + 1);
    }
    if (!this.endsLine(bytes, p)) return this.passLine(bytes, p, DECLINED);
    return this.commit(columns, row, col, start);
  }

  private readWhitespace(bytes: Uint8Array, p: number, limit: number): number {
    const start = p;
    const columns = this.store.columns;
    const row = this.store.length;
    let col = 0;
    for (;;) {
      if (col >= this.count) return this.passLine(bytes, p, DECLINED);
      const value = leadingNumber(bytes, p, limit, this.decimalCode);
      if (value !== value) return this.passLine(bytes, p, DECLINED);
      columns[col][row] = value;
      col++;
      p = this.skipPads(bytes, numberEnd);
      if (this.endsLine(bytes, p)) break;
      // A number must be followed by whitespace to be the whole cell.
      if (p === numberEnd) return this.passLine(bytes, p, DECLINED);
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

  /** Finds the end of a line not read to its end, and returns `outcome`. */
  private passLine(bytes: Uint8Array, p: number, outcome: number): number {
    this.lineFeed = bytes.indexOf(LF, p);
    return outcome;
  }

  /** Missing trailing cells are empty (NaN); the row, from `start` to lineFeed, is kept and counted as input. */
  private commit(columns: Float64Array[], row: number, filled: number, start: number): number {
    for (let col = filled; col < this.count; col++) columns[col][row] = NaN;
    this.store.length = row + 1;
    this.store.input += this.lineFeed - start + 1;
    return ROW;
  }
}
