// Min/max per pixel column: a plot of a million samples keeps every peak with a few hundred points.

export interface ColumnEnvelope {
  /** Column centre on the x axis. */
  x: Float64Array;
  min: Float64Array;
  max: Float64Array;
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
  const width = (end - start) / columns;
  const min = new Float64Array(columns).fill(Infinity);
  const max = new Float64Array(columns).fill(-Infinity);
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const yi = y[i];
    if (!(xi >= start && xi <= end) || !Number.isFinite(yi)) continue;
    const column = Math.min(columns - 1, Math.floor((xi - start) / width));
    if (yi < min[column]) min[column] = yi;
    if (yi > max[column]) max[column] = yi;
  }
  const kept: number[] = [];
  for (let c = 0; c < columns; c++) if (min[c] <= max[c]) kept.push(c);
  const envelope: ColumnEnvelope = {
    x: new Float64Array(kept.length),
    min: new Float64Array(kept.length),
    max: new Float64Array(kept.length),
  };
  kept.forEach((c, k) => {
    envelope.x[k] = start + (c + 0.5) * width;
    envelope.min[k] = min[c];
    envelope.max[k] = max[c];
  });
  return envelope;
}
