// Metadata written beside the data: key/value cells in the leading columns of a table's first rows, empty further on.

import { slowCellValue } from './cellValue';
import type { DataShape } from './dataShape';
import type { PreambleLine } from './preamble';
import { WHITESPACE, splitLine, trimTrailingEmpty } from './splitLine';

/**
 * Rows of plain data, after the last with metadata beside it, on which the layout of a table whose rows open with
 * empty fields is decided: such metadata fills a table's first rows, with empty rows before and between its groups,
 * and all of it is read before the layout.
 */
export const SIDE_SETTLING_ROWS = 16;

/** The leading cells a row of plain data leaves empty, in a delimited table: where metadata may sit beside the data. */
export function sideWidth(shape: DataShape): number {
  if (shape.delimiter === WHITESPACE || shape.delimiter === '') return 0;
  const cells = trimTrailingEmpty(shape.cells);
  let width = 0;
  while (width < cells.length && cells[width].trim() === '') width++;
  return width < cells.length ? width : 0;
}

/**
 * True when `text` is a row of the table whose data rows have `shape`, with metadata beside its data: as many cells,
 * something in the cells the data rows leave empty, and numbers (or missing values) in the cells they fill, and only there.
 */
export function isSideRow(text: string, shape: DataShape): boolean {
  const width = sideWidth(shape);
  if (width === 0) return false;
  const cells = splitLine(text, shape.delimiter);
  if (cells.length !== shape.cells.length || cells.slice(0, width).every((c) => c.trim() === '')) return false;
  const data = cells.slice(width);
  if (data.some((c, k) => (c.trim() === '') !== (shape.cells[width + k].trim() === ''))) return false;
  // As dataShape reads cells: a ',' inside a cell of a comma-separated line is a decimal comma (it was quoted).
  const values = data.map((c) => slowCellValue(c, shape.delimiter !== ',' || c.includes(',')));
  return values.every((v) => v !== null) && values.some((v) => v !== null && !Number.isNaN(v));
}

/** The rows with metadata beside the data directly above head line `index`, the first data row of a table of `shape`. */
export function sideRowsAbove(head: PreambleLine[], index: number, shape: DataShape): number[] {
  let start = index;
  while (start > 0 && isSideRow(head[start - 1].text, shape)) start--;
  return Array.from({ length: index - start }, (_, k) => start + k);
}

/** The metadata cells of a row, as a key/value line of the preamble ('Sample Interval,2e-7,s'). */
export function sideLine(row: PreambleLine, shape: DataShape): PreambleLine {
  const cells = splitLine(row.text, shape.delimiter).slice(0, sideWidth(shape));
  return { text: trimTrailingEmpty(cells).join(shape.delimiter), line: row.line };
}

/** The row with its metadata cells emptied, for the row reader: the data cells as written, quoted again where needed. */
export function withoutSide(text: string, shape: DataShape): string {
  const width = sideWidth(shape);
  const cells = splitLine(text, shape.delimiter).map((c, k) => (k < width ? '' : quoted(c, shape.delimiter)));
  return cells.join(shape.delimiter);
}

/** A cell as a delimited line may hold it: in quotes when it holds the delimiter or a quote. */
function quoted(cell: string, delimiter: string): string {
  return cell.includes(delimiter) || cell.includes('"') ? `"${cell.replace(/"/g, '""')}"` : cell;
}
