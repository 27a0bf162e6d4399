// Time axes of a capture: order checks, optional sorting, axes rebuilt from an interval, uniformity.

export interface OrderProblem {
  /** Row index where the time first fails to increase. */
  row: number;
  /** Time of that row and of the last earlier row with a time, s. */
  time: number;
  previous: number;
}

/** The first row whose time does not exceed the previous time (rows without a time are skipped); null if none. */
export function findOrderProblem(time: Float64Array): OrderProblem | null {
  // The row of the previous time, not the time: a double carried through this long loop would be boxed at every row.
  let previous = -1;
  for (let i = 0; i < time.length; i++) {
    const t = time[i];
    if (t !== t) continue;
    if (previous >= 0 && t <= time[previous]) return { row: i, time: t, previous: time[previous] };
    previous = i;
  }
  return null;
}

export interface SortedOrder {
  /** Row indexes in increasing time, rows without a time last, repeated times removed (the first kept). */
  order: Uint32Array;
  /** Rows removed for repeating a time stamp, and the first of them. */
  repeated: number;
  firstRepeatedRow: number | null;
}

export function sortByTime(time: Float64Array): SortedOrder {
  const index = new Uint32Array(time.length);
  for (let i = 0; i < index.length; i++) index[i] = i;
  // Stable: equal times keep file order, so the first of a repeated stamp is the one kept.
  index.sort((a, b) => {
    const ta = time[a];
    const tb = time[b];
    if (ta !== ta) return tb !== tb ? a - b : 1;
    if (tb !== tb) return -1;
    return ta - tb || a - b;
  });
  const kept: number[] = [];
  let repeated = 0;
  let firstRepeatedRow: number | null = null;
  let previous = NaN;
  for (const row of index) {
    const t = time[row];
    if (t === previous) {
      repeated++;
      if (firstRepeatedRow === null || row < firstRepeatedRow) firstRepeatedRow = row;
      continue;
    }
    if (t === t) previous = t;
    kept.push(row);
  }
  return { order: Uint32Array.from(kept), repeated, firstRepeatedRow };
}

/** t_i = offset + i * interval for i = 0 .. count-1. */
export function rebuildAxis(count: number, interval: number, offset: number): Float64Array {
  const time = new Float64Array(count);
  for (let i = 0; i < count; i++) time[i] = offset + i * interval;
  return time;
}

/** Relative deviation from the straight line t0 + i * dt allowed for a uniform axis (of dt). */
const UNIFORM_TOLERANCE = 0.01;

/** The interval when the (increasing) axis is uniform to 1 % of a step, else null; rows without a time skipped. */
export function uniformInterval(time: Float64Array): number | null {
  let first = 0;
  while (first < time.length && time[first] !== time[first]) first++;
  let last = time.length - 1;
  while (last > first && time[last] !== time[last]) last--;
  if (first >= last) return null;
  const step = (time[last] - time[first]) / (last - first);
  if (!(step > 0)) return null;
  for (let i = first; i <= last; i++) {
    const t = time[i];
    if (t === t && Math.abs(t - time[first] - (i - first) * step) > UNIFORM_TOLERANCE * step) return null;
  }
  return step;
}
