// Float64Arrays built by plain loops: Float64Array.from(list, map) walks an iterator, one result object per value.

/** 0, 1, ..., n - 1: the x of a model evaluated by sample index. */
export function indexRamp(n: number): Float64Array {
  const ramp = new Float64Array(n);
  for (let i = 0; i < n; i++) ramp[i] = i;
  return ramp;
}

/** valueAt(rows[k]) for each k. */
export function gathered(rows: readonly number[], valueAt: (row: number) => number): Float64Array {
  const out = new Float64Array(rows.length);
  for (let k = 0; k < rows.length; k++) out[k] = valueAt(rows[k]);
  return out;
}
