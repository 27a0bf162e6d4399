// Zoom and pan of one axis range: the arithmetic the wheel, the keys and the buttons share.

export type Range = [number, number];

/** The narrowest view, as a share of the span it zooms in: far below one sample of any capture, far above rounding. */
const MIN_WIDTH_SHARE = 1e-7;

/** `range` zoomed about `at` (a value on the axis, kept where it is): factor below 1 zooms in. */
export function zoomAbout(range: Range, at: number, factor: number, span: Range = range): Range {
  const minWidth = (span[1] - span[0]) * MIN_WIDTH_SHARE;
  const width = Math.max(minWidth, (range[1] - range[0]) * factor);
  const share = range[1] > range[0] ? (at - range[0]) / (range[1] - range[0]) : 0.5;
  return [at - share * width, at - share * width + width];
}

/** `range` moved by `fraction` of its width (positive: towards larger values). */
export function panBy(range: Range, fraction: number): Range {
  const step = (range[1] - range[0]) * fraction;
  return [range[0] + step, range[1] + step];
}

/** A time view kept over the record: no wider than its span, and moved back inside it when it wanders off. */
export function keepWithin(range: Range, span: Range): Range {
  const width = range[1] - range[0];
  if (width >= span[1] - span[0]) return [span[0], span[1]];
  if (range[0] < span[0]) return [span[0], span[0] + width];
  if (range[1] > span[1]) return [span[1] - width, span[1]];
  return range;
}

/** The smallest and largest finite values of some arrays, widened by `pad` of the extent each way; null when there are none. */
export function paddedExtent(arrays: ArrayLike<number>[], pad: number): Range | null {
  let low = Infinity;
  let high = -Infinity;
  for (const values of arrays) {
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (v < low) low = v;
      if (v > high) high = v;
    }
  }
  if (!(low <= high)) return null;
  const margin = high > low ? (high - low) * pad : Math.abs(high) * pad || 1;
  return [low - margin, high + margin];
}
