// Means of consecutive samples, the coarser views of a record that event detection and starting rates look at.

/** Block means of `size` samples starting at `start`, at most `count` of them. */
export function blockMeans(values: ArrayLike<number>, start: number, end: number, size: number, count: number): Float64Array {
  const blocks = Math.min(count, Math.floor((end - start) / size));
  const out = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    let sum = 0;
    const from = start + k * size;
    for (let i = from; i < from + size; i++) sum += values[i];
    out[k] = sum / size;
  }
  return out;
}
