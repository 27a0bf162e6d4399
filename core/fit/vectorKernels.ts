// Inner loops of the fit's linear algebra as small functions of their own: called thousands of times, each is
// compiled after a few calls, where the same loop inlined in a larger function called a few times a command ran
// interpreted (a heap number per step) through a command's first decompositions and solves.

/** sum a[i] b[i] over the first n rows, in order, over the rows in use only when `use` is given. */
export function dotInOrder(a: Float64Array, b: ArrayLike<number>, n: number, use: Uint8Array | null = null): number {
  let sum = 0;
  if (use) for (let i = 0; i < n; i++) sum += use[i] ? a[i] * b[i] : 0;
  else for (let i = 0; i < n; i++) sum += a[i] * b[i];
  return sum;
}

/** target[to + j] += scale * source[from + j] for j < length (target and source may be one array, in parts apart). */
export function addScaled(target: Float64Array, to: number, source: Float64Array, from: number, length: number, scale: number): void {
  for (let j = 0; j < length; j++) target[to + j] += scale * source[from + j];
}
