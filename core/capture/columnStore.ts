// Growable Float64Array columns for the rows of a capture: reserved as rows come, never ahead for the column count.

import { CaptureError } from './types';

/** Rows reserved at first for a narrow table: enough that a short capture never grows. */
const INITIAL_ROWS = 4096;
/**
 * Cells reserved at first over all stored columns (8 columns of INITIAL_ROWS, 256 kB): a wide table starts with
 * fewer rows, so that what is reserved follows the rows read rather than the column count.
 */
const INITIAL_CELLS = 8 * INITIAL_ROWS;
/**
 * Cells the stored rows may hold per character (byte) of the lines read: a cell written in the file takes at least
 * one (a digit or its delimiter), so only rows far shorter than the table (missing cells stored as NaN) reach it.
 */
const CELLS_PER_INPUT_CHARACTER = 1;
/** Cells always allowed (32 MB), so that a small file's short rows are read as before. */
const SPARE_CELLS = 4 * 1024 * 1024;

export class ColumnStore {
  /** One array per column; columns not stored (time stamps) stay empty. */
  readonly columns: Float64Array[];
  /** Committed rows. */
  length = 0;
  /** Characters (bytes on the byte path) of the lines offered to the store so far: what its rows may take room for. */
  input = 0;
  private capacity: number;
  private readonly stored: boolean[];
  private readonly storedCount: number;

  /** `currentLine` names the line being read when the rows are too short for the table to be held. */
  constructor(
    stored: boolean[],
    private readonly currentLine: () => number,
  ) {
    this.stored = stored;
    this.storedCount = Math.max(1, stored.filter((s) => s).length);
    this.capacity = Math.max(1, Math.min(INITIAL_ROWS, Math.floor(INITIAL_CELLS / this.storedCount)));
    this.columns = stored.map((s) => new Float64Array(s ? this.capacity : 0));
  }

  /** Makes room for the row at index `length`; throws CaptureError when the rows are too short for the table to be held. */
  reserve(): void {
    if (this.length < this.capacity) return;
    const limit = this.rowLimit();
    if (this.length >= limit) {
      throw new CaptureError(
        `${this.length} rows hold far fewer cells than the table's ${this.storedCount} columns; ` +
          `storing them would take more than ${8 * CELLS_PER_INPUT_CHARACTER} bytes for each byte of the file`,
        this.currentLine(),
      );
    }
    this.grow(Math.min(this.capacity * 2, limit));
  }

  /** Makes room for `rows` more rows at once, read from `bytes` more bytes (still at least doubling, within the limit). */
  expect(rows: number, bytes: number): void {
    const wanted = Math.min(Math.max(this.length + rows, this.capacity * 2), this.rowLimit(bytes));
    if (this.length + rows > this.capacity && wanted > this.capacity) this.grow(wanted);
  }

  /** Rows the input read so far (and `coming` characters more) can justify. */
  private rowLimit(coming = 0): number {
    return Math.floor(((this.input + coming) * CELLS_PER_INPUT_CHARACTER + SPARE_CELLS) / this.storedCount);
  }

  private grow(capacity: number): void {
    this.capacity = capacity;
    for (let c = 0; c < this.columns.length; c++) {
      if (!this.stored[c]) continue;
      const grown = new Float64Array(this.capacity);
      grown.set(this.columns[c].subarray(0, this.length));
      this.columns[c] = grown;
    }
  }

  /** The committed values of column c (a view, not a copy). */
  column(c: number): Float64Array {
    return this.columns[c].subarray(0, this.length);
  }

  /** Column c for a capture to keep and change in place: its rows as they are stored (the store is done with). */
  keep(c: number): Float64Array {
    return this.column(c);
  }
}
