// The hot loop: reads one data line of a known layout straight into the column store.

import { cellText, fastNumber, GROUPED_IN_THREES, groupingCause, slowCellValue } from './cellValue';
import type { ColumnStore } from './columnStore';
import { WHITESPACE, splitLine } from './splitLine';

/** Outcome of reading a line: a row was stored, or the line carried nothing (blank, comment). */
export const ROW = 0;
export const SKIP = 1;

const NOT_FOUND = Number.MAX_SAFE_INTEGER;

/** ASCII code of the comma, a delimiter or a decimal mark. */
const COMMA = 44;

/**
 * A table's decimal mark, and the numbers the other mark may group in threes: '1.234' or '12.345.678' where the
 * decimal mark is the comma, '1,234' where it is the point (a spreadsheet's quoted grouping, or a ';' table's).
 * Grouping reads such a number as 1234, the other mark as a decimal one as 1.234, a factor of 1000 apart, so neither
 * is guessed. A mark no grouping explains ('1.5', '1.000E-08', '0,5', '0.905': no group starts with a zero) can only
 * be a decimal one, and is read so.
 */
interface DecimalMark {
  code: number;
  name: string;
  other: { name: string; text: ',' | '.' };
}
const DECIMAL_POINT: DecimalMark = { code: 46, name: 'point', other: { name: 'comma', text: ',' } };
const DECIMAL_COMMA: DecimalMark = { code: COMMA, name: 'comma', other: { name: 'point', text: '.' } };

/** Whether a cell reads two ways in a table of this decimal mark (see DecimalMark). */
function readsTwoWays(cell: string, mark: DecimalMark): boolean {
  return GROUPED_IN_THREES[mark.other.text].test(cellText(cell));
}

/** Why a cell that reads two ways (see DecimalMark) is refused, with both readings; null for any other cell. */
function twoReadings(cell: string, mark: DecimalMark): string | null {
  if (!readsTwoWays(cell, mark)) return null;
  const text = cellText(cell);
  const other = mark.other;
  const grouped = Number(text.replaceAll(other.text, ''));
  const decimal = text.split(other.text).length === 2 ? ` or ${Number(text.replace(other.text, '.'))} (a decimal ${other.name} from another export)` : '';
  return `in a table whose decimal mark is the ${mark.name} this reads as ${grouped} (${other.name}s grouping thousands)${decimal}; export the numbers with one decimal mark and no digit grouping`;
}

/** The message for cell `col` (0-based) of a table of `count` columns that is not a number, with its likely cause. */
function notANumber(count: number, cell: string, col: number, mark: DecimalMark): string {
  const found = `expected ${count} numeric columns, found '${cell.trim()}' (column ${col + 1})`;
  const cause = twoReadings(cell, mark) ?? groupingCause(cell);
  return cause === null ? found : `${found}: ${cause}`;
}

/** A cell's value when the fast path left it, or null (not a number, or a number that reads two ways). */
function slowValue(cell: string, mark: DecimalMark, commaMayMarkDecimals: boolean): number | null {
  return readsTwoWays(cell, mark) ? null : slowCellValue(cell, commaMayMarkDecimals);
}

export class RowReader {
  private readonly count: number;
  private readonly delimiterCode: number;
  private readonly mark: DecimalMark;
  /** The mark's code, kept beside it: every cell of the hot loop reads it. */
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
    this.mark = decimalComma ? DECIMAL_COMMA : DECIMAL_POINT;
    this.decimalCode = this.mark.code;
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
      const slow = slowValue(cell, this.mark, this.delimiterCode !== COMMA);
      if (slow === null) return notANumber(this.count, cell, col, this.mark);
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
        const slow = slowValue(cell, this.mark, this.delimiterCode !== COMMA || cell.includes(','));
        if (slow === null) return notANumber(this.count, cell, col, this.mark);
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
