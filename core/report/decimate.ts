// Min/max per pixel column, for the report's SVG plots and the window's trace: a plot of a million
// samples keeps every peak with a few hundred points. Time axes are sorted (captures guarantee it).

/** The report plot's form: the least and greatest value of every non-empty column. */
export interface ColumnEnvelope {
  /** Column centre on the x axis. */
  x: Float64Array;
  min: Float64Array;
  max: Float64Array;
}

/** The window's form: real samples, in time order, at most 2 per column. */
export interface ReducedTrace {
  x: Float64Array;
  y: Float64Array;
}

/**
 * The samples with start <= x <= end split into `columns` equal columns; each non-empty column
 * gives the least and greatest finite y in it. Empty columns are left out.
 */
export function decimateMinMax(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  start: number,
  end: number,
  columns: number,
): ColumnEnvelope {
  checkInput('decimateMinMax', x, y, columns);
  const { minAt, maxAt } = columnExtremes(x, y, lowerBound(x, start), upperBound(x, end), start, end, columns);
  const width = columnWidth(start, end, columns);
  const kept: number[] = [];
  for (let c = 0; c < columns; c++) if (minAt[c] >= 0) kept.push(c);
  const envelope: ColumnEnvelope = {
    x: new Float64Array(kept.length),
    min: new Float64Array(kept.length),
    max: new Float64Array(kept.length),
  };
  kept.forEach((c, k) => {
    envelope.x[k] = start + (c + 0.5) * width;
    envelope.min[k] = y[minAt[c]];
    envelope.max[k] = y[maxAt[c]];
  });
  return envelope;
}

/**
 * The samples of (time, values) with start <= time <= end reduced to at most 2 points per column:
 * the minimum and the maximum of the column, in time order, so every excursion stays visible.
 * When the range holds no more than 2 * columns samples they are returned unchanged. One sample on
 * each side of the range is kept so that a line still runs to the plot edges.
 */
export function reduceMinMax(
  time: ArrayLike<number>,
  values: ArrayLike<number>,
  start: number,
  end: number,
  columns: number,
): ReducedTrace {
  checkInput('reduceMinMax', time, values, columns);
  const first = Math.max(0, lowerBound(time, start) - 1);
  const last = Math.min(time.length, upperBound(time, end) + 1);
  const count = last - first;
  if (count <= 0) return { x: new Float64Array(0), y: new Float64Array(0) };
  if (count <= 2 * columns) return { x: copyRange(time, first, last), y: copyRange(values, first, last) };
  const { minAt, maxAt } = columnExtremes(time, values, first, last, time[first], time[last - 1], columns);
  const x = new Float64Array(2 * columns);
  const y = new Float64Array(2 * columns);
  let n = 0;
  for (let c = 0; c < columns; c++) {
    if (minAt[c] < 0) continue; // an empty column (sparse samples): nothing to emit
    const a = Math.min(minAt[c], maxAt[c]);
    const b = Math.max(minAt[c], maxAt[c]);
    x[n] = time[a];
    y[n++] = values[a];
    if (b !== a) {
      x[n] = time[b];
      y[n++] = values[b];
    }
  }
  return { x: x.slice(0, n), y: y.slice(0, n) };
}

/** First index with time[i] >= value. */
export function lowerBound(time: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (time[mid] < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index with time[i] > value. */
export function upperBound(time: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (time[mid] <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Per column of [start, end], the index of the least and of the greatest finite value among the
 * samples from..to-1 (-1 for a column without one). The one scan both forms are made from.
 */
function columnExtremes(
  time: ArrayLike<number>,
  values: ArrayLike<number>,
  from: number,
  to: number,
  start: number,
  end: number,
  columns: number,
): { minAt: Int32Array; maxAt: Int32Array } {
  const width = columnWidth(start, end, columns);
  const minAt = new Int32Array(columns).fill(-1);
  const maxAt = new Int32Array(columns).fill(-1);
  let i = from;
  // Time is sorted, so each column is the run of samples before its right edge.
  for (let c = 0; c < columns && i < to; c++) {
    const edge = c === columns - 1 ? Infinity : start + (c + 1) * width;
    let low = Infinity;
    let high = -Infinity;
    for (; i < to && time[i] < edge; i++) {
      const v = values[i];
      if (!Number.isFinite(v)) continue;
      if (v < low) {
        low = v;
        minAt[c] = i;
      }
      if (v > high) {
        high = v;
        maxAt[c] = i;
      }
    }
  }
  return { minAt, maxAt };
}

/** A zero-width range puts every sample in the first column. */
function columnWidth(start: number, end: number, columns: number): number {
  return (end - start) / columns || 1;
}

function checkInput(name: string, time: ArrayLike<number>, values: ArrayLike<number>, columns: number): void {
  if (time.length !== values.length) throw new RangeError(`${name}: time has ${time.length} samples, values ${values.length}`);
  if (!(columns >= 1)) throw new RangeError(`${name}: columns must be at least 1, got ${columns}`);
}

function copyRange(array: ArrayLike<number>, from: number, to: number): Float64Array {
  const out = new Float64Array(to - from);
  for (let i = from; i < to; i++) out[i - from] = array[i];
  return out;
}
