// The hot loop: reads one data line of a known layout straight into the column store.

import { cellText, fastNumber, groupingCause, slowCellValue } from './cellValue';
import type { ColumnStore } from './columnStore';
import { WHITESPACE, splitLine } from './splitLine';

/** Outcome of reading a line: a row was stored, or the line carried nothing (blank, comment). */
export const ROW = 0;
export const SKIP = 1;

const NOT_FOUND = Number.MAX_SAFE_INTEGER;

/** ASCII codes of the two decimal marks. */
const COMMA = 44;
const POINT = 46;

/**
 * A number that points may group in threes ('1.234', '0.905', '12.345.678'), in a table whose decimal mark is the
 * comma: grouping reads it as 1234, another export's decimal mark as 1.234, a factor of 1000 apart, so neither is
 * guessed. A point no grouping explains ('1.5', '1.000E-08') can only mark decimals, and is read so.
 */
const GROUPED_BY_POINTS = /^[+-]?\d{1,3}(?:\.\d{3})+$/;

/** Why a cell that reads two ways is refused, with both readings. */
function twoReadings(cell: string): string {
  const text = cellText(cell);
  const grouped = Number(text.replaceAll('.', ''));
  const decimal = text.split('.').length === 2 ? ` or ${Number(text)} (a decimal point from another export)` : '';
  return `in a table whose decimal mark is the comma this reads as ${grouped} (points grouping thousands)${decimal}; export the numbers with one decimal mark and no digit grouping`;
}

/** Whether a cell reads two ways in a table whose decimal mark is `decimalCode` (see GROUPED_BY_POINTS). */
function readsTwoWays(cell: string, decimalCode: number): boolean {
  return decimalCode === COMMA && GROUPED_BY_POINTS.test(cellText(cell));
}

/** The message for cell `col` (0-based) of a table of `count` columns that is not a number, with its likely cause. */
function notANumber(count: number, cell: string, col: number, decimalCode: number): string {
  const found = `expected ${count} numeric columns, found '${cell.trim()}' (column ${col + 1})`;
  const cause = readsTwoWays(cell, decimalCode) ? twoReadings(cell) : groupingCause(cell);
  return cause === null ? found : `${found}: ${cause}`;
}

/** A cell's value when the fast path left it, or null (not a number, or a number that reads two ways). */
function slowValue(cell: string, decimalCode: number, commaMayMarkDecimals: boolean): number | null {
  return readsTwoWays(cell, decimalCode) ? null : slowCellValue(cell, commaMayMarkDecimals);
}

export class RowReader {
  private readonly count: number;
  private readonly delimiterCode: number;
  private readonly decimalCode: number;
  private nextDelimiter = -1;
  private nextQuote = -1;
  private text = '';

  constructor(
    private readonly store: ColumnStore,
    /** true where the column is parsed (time stamps are not). */
    private readonly parsed: boolean[],
    private readonly delimiter: string,
    decimalComma: boolean,
  ) {
    this.count = parsed.length;
    this.delimiterCode = delimiter === WHITESPACE ? -1 : delimiter.charCodeAt(0);
    this.decimalCode = decimalComma ? COMMA : POINT;
  }

  /** Call before reading lines of a new text: the look-ahead caches belong to one string. */
  begin(text: string): void {
    this.text = text;
    this.nextDelimiter = -1;
    this.nextQuote = -1;
  }

  /** Reads text[start, end) (no line terminator): ROW, SKIP, or a message saying what is wrong. */
  read(start: number, end: number): number | string {
    const text = this.text;
    let p = start;
    let c = 0;
    while (p < end && ((c = text.charCodeAt(p)) === 32 || c === 9)) p++;
    if (p === end) return SKIP;
    // '#', '%', '//' and (unless ';' separates cells) ';' start comments.
    if (c === 35 || c === 37 || (c === 47 && text.charCodeAt(p + 1) === 47) || (c === 59 && this.delimiterCode !== 59)) return SKIP;
    if (this.nextQuote < start) {
      const q = text.indexOf('"', start);
      this.nextQuote = q < 0 ? NOT_FOUND : q;
    }
    this.store.input += end - start + 1;
    this.store.reserve();
    if (this.nextQuote < end) return this.readCells(splitLine(text.slice(start, end), this.delimiter));
    return this.delimiterCode < 0 ? this.readWhitespace(p, end) : this.readDelimited(start, end);
  }

  private readDelimited(start: number, end: number): number | string {
    const text = this.text;
    const columns = this.store.columns;
    const row = this.store.length;
    let col = 0;
    let cellStart = start;
    for (;;) {
      if (this.nextDelimiter < cellStart) {
        const d = text.indexOf(this.delimiter, cellStart);
        this.nextDelimiter = d < 0 ? NOT_FOUND : d;
      }
      const cellEnd = this.nextDelimiter < end ? this.nextDelimiter : end;
      const problem = this.store1(columns, row, col, cellStart, cellEnd);
      if (problem !== null) return problem;
      col++;
      if (cellEnd === end) break;
      cellStart = cellEnd + 1;
    }
    return this.commit(columns, row, col);
  }

  private readWhitespace(p: number, end: number): number | string {
    const text = this.text;
    const columns = this.store.columns;
    const row = this.store.length;
    let col = 0;
    while (p < end) {
      const cellStart = p;
      let c = text.charCodeAt(p);
      while (p < end && c !== 32 && c !== 9) c = text.charCodeAt(++p);
      const problem = this.store1(columns, row, col, cellStart, p);
      if (problem !== null) return problem;
      col++;
      while (p < end && ((c = text.charCodeAt(p)) === 32 || c === 9)) p++;
    }
    return this.commit(columns, row, col);
  }

  /** Stores one cell; null when fine, else what is wrong. */
  private store1(columns: Float64Array[], row: number, col: number, start: number, end: number): string | null {
    const text = this.text;
    if (col >= this.count) {
      const extra = text.slice(start, end).trim();
      return extra === '' ? null : `expected ${this.count} columns, found more ('${extra}' in column ${col + 1})`;
    }
    if (!this.parsed[col]) return null;
    let value = fastNumber(text, start, end, this.decimalCode);
    if (value !== value) {
      const cell = text.slice(start, end);
      const slow = slowValue(cell, this.decimalCode, this.delimiterCode !== COMMA);
      if (slow === null) return notANumber(this.count, cell, col, this.decimalCode);
      value = slow;
    }
    columns[col][row] = value;
    return null;
  }

  /** A quoted line, already split. */
  private readCells(cells: string[]): number | string {
    const columns = this.store.columns;
    const row = this.store.length;
    for (let col = 0; col < cells.length; col++) {
      const cell = cells[col];
      if (col >= this.count) {
        if (cell.trim() !== '') return `expected ${this.count} columns, found more ('${cell.trim()}' in column ${col + 1})`;
        continue;
      }
      if (!this.parsed[col]) continue;
      let value = fastNumber(cell, 0, cell.length, this.decimalCode);
      if (value !== value) {
        const slow = slowValue(cell, this.decimalCode, this.delimiterCode !== COMMA || cell.includes(','));
        if (slow === null) return notANumber(this.count, cell, col, this.decimalCode);
        value = slow;
      }
      columns[col][row] = value;
    }
    return this.commit(columns, row, cells.length);
  }

  /** Missing trailing cells are empty (NaN); the row is kept. */
  private commit(columns: Float64Array[], row: number, filled: number): number {
    for (let col = filled; col < this.count; col++) if (this.parsed[col]) columns[col][row] = NaN;
    this.store.length = row + 1;
    return ROW;
  }
}
