// A ring that grows where no decaying model fits it: found from the record's median crossings and its amplitude along the record.

import { MIN_PERIODS_PER_WINDOW, ringFrequencyAlong } from './setupDrift';

/** For a ring the fit could not take: each window's frequency within this fraction of the crossings' estimate... */
const GROWTH_FREQUENCY_SPREAD = 0.05;
/** ...and its standard error under this fraction of it: a clear ring in every window, not noise. */
const GROWTH_FREQUENCY_STDERR = 0.01;
/**
 * ...and every window's ring at least this share of the record's half-range: a fitted sinusoid in noise alone is far
 * smaller (about 0.05 of it over a few hundred samples), a growing ring's first third larger unless it grows tenfold.
 */
const GROWTH_MIN_AMPLITUDE = 0.15;
/** Crossings of the median count once the record is this share of its half-range beyond it. */
const CROSSING_HYSTERESIS = 0.1;

export interface GrowingRing {
  /** The ring's frequency in the first window, Hz. */
  frequency: number;
  /** The last window's amplitude over the first's. */
  growth: number;
  /** Ring periods from the first crossing to the record's end. */
  periods: number;
}

/**
 * A ring in a record no decaying model fits: its frequency from the crossings of the record's median, then its
 * amplitude in `windowCount` windows from the first crossing on (ringFrequencyAlong, no decay held). Null unless every
 * window holds a clear ring at that frequency (within GROWTH_FREQUENCY_SPREAD, its standard error under
 * GROWTH_FREQUENCY_STDERR of it, its amplitude at least GROWTH_MIN_AMPLITUDE of the record's half-range) and the last
 * window's amplitude is above `growthRatio` times the first's.
 */
export function growingRingIn(time: ArrayLike<number>, values: ArrayLike<number>, windowCount: number, growthRatio: number): GrowingRing | null {
  const { crossings, halfRange } = medianCrossings(time, values);
  if (crossings.length < 2 * windowCount * MIN_PERIODS_PER_WINDOW) return null;
  const start = crossings[0];
  const end = time[time.length - 1];
  const omega = (Math.PI * (crossings.length - 1)) / (crossings[crossings.length - 1] - start);
  const windows = ringFrequencyAlong(time, values, { start, end, alpha: 0, omegaD: omega, windows: windowCount });
  const frequency = omega / (2 * Math.PI);
  const clear =
    windows.length === windowCount &&
    windows.every(
      (w) =>
        Math.abs(w.frequency.value / frequency - 1) < GROWTH_FREQUENCY_SPREAD &&
        (w.frequency.stderr ?? Infinity) < GROWTH_FREQUENCY_STDERR * w.frequency.value &&
        w.amplitude > GROWTH_MIN_AMPLITUDE * halfRange,
    );
  const growth = clear ? windows[windowCount - 1].amplitude / windows[0].amplitude : 0;
  if (!(growth > growthRatio)) return null;
  return { frequency: windows[0].frequency.value, growth, periods: (omega * (end - start)) / (2 * Math.PI) };
}

/**
 * Times the record crosses its median, counting a crossing only once it reaches CROSSING_HYSTERESIS of its half-range
 * beyond (against noise), and that half-range (half the spread between its 5th and 95th percentiles).
 */
function medianCrossings(time: ArrayLike<number>, values: ArrayLike<number>): { crossings: number[]; halfRange: number } {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  if (n < 3) return { crossings: [], halfRange: 0 };
  const level = sorted[Math.floor(n / 2)];
  const halfRange = (sorted[Math.floor(0.95 * (n - 1))] - sorted[Math.floor(0.05 * (n - 1))]) / 2;
  const band = CROSSING_HYSTERESIS * halfRange;
  const out: number[] = [];
  let side = 0;
  for (let i = 0; i < n; i++) {
    const now = values[i] > level + band ? 1 : values[i] < level - band ? -1 : 0;
    if (now !== 0 && now !== side) {
      if (side !== 0) out.push(time[i]);
      side = now;
    }
  }
  return { crossings: out, halfRange };
}
