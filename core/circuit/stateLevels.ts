// State levels of a two-state waveform by the histogram mode method (IEEE Std 181-2011, state-level
// estimation from the histogram; clause numbers from memory).

/** Where the state levels of a transition came from. */
export type StateLevelMethod = 'fitted model' | 'histogram mode' | 'given';

export interface StateLevels {
  /** Level before the transition. */
  initial: number;
  /** Level after the transition. */
  final: number;
}

/**
 * The histogram of the samples is split at the middle of their range; each half's modal bin gives a
 * state level: the mean of the samples in that bin and its two neighbours (within the half), which
 * keeps a level that falls near a bin edge, or quantisation codes unevenly shared between bins, from
 * pulling it by up to half a bin. The level nearer the start of the record is the initial one.
 * Bin count: sqrt(N), between 16 and 512 (our choice; the standard leaves it open).
 */
export function histogramStateLevels(values: ArrayLike<number>): StateLevels {
  const n = values.length;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    if (values[i] < min) min = values[i];
    if (values[i] > max) max = values[i];
  }
  if (!(max > min)) return { initial: min, final: min };
  const bins = Math.min(512, Math.max(16, 2 * Math.round(Math.sqrt(n) / 2)));
  const width = (max - min) / bins;
  const counts = new Float64Array(bins);
  const sums = new Float64Array(bins);
  for (let i = 0; i < n; i++) {
    const k = Math.min(bins - 1, Math.floor((values[i] - min) / width));
    counts[k] += 1;
    sums[k] += values[i];
  }
  const modeLevel = (from: number, to: number): number => {
    let best = from;
    for (let k = from; k < to; k++) if (counts[k] > counts[best]) best = k;
    let count = 0;
    let sum = 0;
    for (let k = Math.max(from, best - 1); k <= Math.min(to - 1, best + 1); k++) {
      count += counts[k];
      sum += sums[k];
    }
    return sum / count;
  };
  const low = modeLevel(0, bins / 2);
  const high = modeLevel(bins / 2, bins);
  const head = startLevel(values);
  return Math.abs(head - low) <= Math.abs(head - high) ? { initial: low, final: high } : { initial: high, final: low };
}

/** Median of the first 5 % of the record (at least one sample). */
function startLevel(values: ArrayLike<number>): number {
  const count = Math.max(1, Math.floor(values.length / 20));
  const head = Array.from({ length: count }, (_, i) => values[i]).sort((a, b) => a - b);
  return head[Math.floor(count / 2)];
}
