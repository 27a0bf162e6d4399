// Per-pixel-column min/max reduction of a trace, so that a long capture draws quickly at any zoom.

export interface ReducedTrace {
  x: Float64Array;
  y: Float64Array;
}

/**
 * The samples of (time, values) with start <= time <= end reduced to at most 2 points per column:
 * the minimum and the maximum of the column, in time order, so every excursion stays visible.
 * When the range holds no more than 2 * columns samples they are returned unchanged. One sample on
 * each side of the range is kept so that a line still runs to the plot edges. `time` must be sorted.
 */
export function reduceMinMax(
  time: ArrayLike<number>,
  values: ArrayLike<number>,
  start: number,
  end: number,
  columns: number,
): ReducedTrace {
  if (time.length !== values.length) throw new RangeError(`reduceMinMax: time has ${time.length} samples, values ${values.length}`);
  if (!(columns >= 1)) throw new RangeError(`reduceMinMax: columns must be at least 1, got ${columns}`);
  const first = Math.max(0, lowerBound(time, start) - 1);
  const last = Math.min(time.length, upperBound(time, end) + 1);
  const count = last - first;
  if (count <= 0) return { x: new Float64Array(0), y: new Float64Array(0) };
  if (count <= 2 * columns) return { x: copyRange(time, first, last), y: copyRange(values, first, last) };
  const x = new Float64Array(2 * columns);
  const y = new Float64Array(2 * columns);
  let n = 0;
  const t0 = time[first];
  const span = time[last - 1] - t0 || 1;
  let i = first;
  for (let column = 0; column < columns && i < last; column++) {
    const columnEnd = column === columns - 1 ? Infinity : t0 + (span * (column + 1)) / columns;
    let minAt = i;
    let maxAt = i;
    while (i < last && time[i] < columnEnd) {
      if (values[i] < values[minAt]) minAt = i;
      if (values[i] > values[maxAt]) maxAt = i;
      i++;
    }
    if (i === minAt) continue; // an empty column (sparse samples): nothing to emit
    const [a, b] = minAt <= maxAt ? [minAt, maxAt] : [maxAt, minAt];
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

function copyRange(array: ArrayLike<number>, from: number, to: number): Float64Array {
  const out = new Float64Array(to - from);
  for (let i = from; i < to; i++) out[i - from] = array[i];
  return out;
}
