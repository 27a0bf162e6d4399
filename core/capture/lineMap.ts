// Remembers which 1-based file line each data row came from, storing only the places where lines were skipped.

export class LineMap {
  private readonly rows: number[] = [];
  private readonly lines: number[] = [];

  /** Row `row` came from `line`; rows are recorded in increasing order. */
  record(row: number, line: number): void {
    const n = this.rows.length;
    if (n > 0 && line - this.lines[n - 1] === row - this.rows[n - 1]) return;
    this.rows.push(row);
    this.lines.push(line);
  }

  lineOf(row: number): number {
    let lo = 0;
    let hi = this.rows.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.rows[mid] <= row) lo = mid;
      else hi = mid - 1;
    }
    return this.lines[lo] + (row - this.rows[lo]);
  }
}
