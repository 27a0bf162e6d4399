// Growable Float64Array columns for the rows of a capture, doubling in size so appends stay cheap.

const INITIAL_CAPACITY = 4096;

export class ColumnStore {
  /** One array per column; columns not stored (time stamps) stay empty. */
  readonly columns: Float64Array[];
  /** Committed rows. */
  length = 0;
  private capacity = INITIAL_CAPACITY;
  private readonly stored: boolean[];

  constructor(stored: boolean[]) {
    this.stored = stored;
    this.columns = stored.map((s) => new Float64Array(s ? INITIAL_CAPACITY : 0));
  }

  /** Makes room for the row at index `length`. */
  reserve(): void {
    if (this.length < this.capacity) return;
    this.grow(this.capacity * 2);
  }

  /** Makes room for `rows` more rows at once, when a reader can tell how many are coming (still at least doubling). */
  expect(rows: number): void {
    if (this.length + rows > this.capacity) this.grow(Math.max(this.length + rows, this.capacity * 2));
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
}
