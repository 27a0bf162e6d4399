// Bins of a lot histogram: equal widths over the values, their number by Sturges' rule.

export interface Histogram {
  /** Bin edges, ascending; bin k holds edges[k] <= v < edges[k + 1] (the last bin includes its upper edge). */
  edges: number[];
  counts: number[];
}

/** Relative width given to the single bin of values that are all equal (a bar must have some width). */
const FLAT_WIDTH = 1e-3;

/** Sturges' rule, 1 + ceil(log2 n) bins (H. A. Sturges, JASA 21, 1926): few bins for a small lot, one more per doubling. */
export function sturgesBins(n: number): number {
  return n <= 1 ? 1 : 1 + Math.ceil(Math.log2(n));
}

/** The histogram of finite values (non-finite ones are left out); null when none is left. */
export function histogramOf(values: readonly number[]): Histogram | null {
  const finite = values.filter(Number.isFinite);
  if (!finite.length) return null;
  const min = Math.min(...finite);
  const max = Math.max(...finite);
  if (min === max) {
    const half = (Math.abs(min) || 1) * FLAT_WIDTH;
    return { edges: [min - half, max + half], counts: [finite.length] };
  }
  const bins = sturgesBins(finite.length);
  const width = (max - min) / bins;
  const edges = Array.from({ length: bins + 1 }, (_, k) => (k === bins ? max : min + k * width));
  const counts = new Array<number>(bins).fill(0);
  for (const v of finite) counts[Math.min(bins - 1, Math.floor((v - min) / width))]++;
  return { edges, counts };
}
