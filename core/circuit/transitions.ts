// Step-response transition metrics with the IEEE Std 181-2011 definitions (clause numbers from
// memory): reference-level instants, rise time, overshoot and undershoot, settling time, ring frequency.
import { CircuitInputError } from './errors';
import { firstAtOrAfter } from './peakFit';
import { histogramStateLevels, type StateLevelMethod } from './stateLevels';

export interface TransitionReference {
  /** State level before the transition (the fit's pre level, say). */
  initial: number;
  /** State level after the transition (the fit's final value). */
  final: number;
  /** Instant of the event (the fit's t0), s: the search starts here and the peak time counts from it. */
  eventTime?: number;
  /** Where the levels came from (default 'given'). */
  method?: Exclude<StateLevelMethod, 'histogram mode'>;
  /**
   * When the fitted model settles within 2 % of the step, s. A record whose last fifth starts before it holds the
   * ring there, not noise alone: the settled-noise warning is then not given (a noise-free simulation's ring,
   * running at the record's end, read as 18 % of noise).
   */
  modelSettled?: number;
}

export interface TransitionMetrics {
  levels: { initial: number; final: number; method: StateLevelMethod };
  /** final - initial, in the unit of the samples. */
  amplitude: number;
  /** 10 %, 50 % and 90 % reference-level instants, s (null when not crossed). */
  instants: { t10: number | null; t50: number | null; t90: number | null };
  /** t90 - t10, s (a fall time for a falling step). */
  riseTime: number | null;
  /** Largest excursion beyond the final level after the transition, % of |amplitude|. */
  overshoot: number | null;
  /** Largest excursion back short of the final level after it was first reached, % of |amplitude|. */
  undershoot: number | null;
  /** Instant of the overshoot peak, s; null without overshoot. */
  peakInstant: number | null;
  /** Peak instant minus the event time, s; null without an event time or without overshoot. */
  peakTime: number | null;
  /** From the 50 % instant until the waveform stays within +/-2 % / +/-5 % of |amplitude| of the final level, s. */
  settlingTime2: number | null;
  settlingTime5: number | null;
  /** From the crossings of the final level after the 50 % instant, Hz; null with fewer than two. */
  ringFrequency: number | null;
  warnings: string[];
}

/** Hysteresis of the final-level crossing count, as a fraction of the largest excursion past it. */
const CROSSING_HYSTERESIS = 0.02;

/**
 * Metrics of one transition. Without `reference` the state levels come from the histogram mode
 * method. Where several crossings of a reference level exist, the 10 % instant is the last one
 * before the 50 % instant and the 90 % instant the first one after it (our choice; the standard
 * asks that the choice be stated). The time axis ascends, as a channel's does.
 */
export function transitionMetrics(
  time: ArrayLike<number>,
  values: ArrayLike<number>,
  reference?: TransitionReference,
): TransitionMetrics {
  if (time.length !== values.length) throw new CircuitInputError('values', `length ${values.length} differs from the time axis (${time.length})`);
  if (time.length < 3) throw new CircuitInputError('values', 'need at least three samples');
  const levels = reference ?? histogramStateLevels(values);
  const amplitude = levels.final - levels.initial;
  const warnings: string[] = [];
  const result: TransitionMetrics = {
    levels: { initial: levels.initial, final: levels.final, method: reference ? (reference.method ?? 'given') : 'histogram mode' },
    amplitude,
    instants: { t10: null, t50: null, t90: null },
    riseTime: null,
    overshoot: null,
    undershoot: null,
    peakInstant: null,
    peakTime: null,
    settlingTime2: null,
    settlingTime5: null,
    ringFrequency: null,
    warnings,
  };
  if (!(Math.abs(amplitude) > 0) || !Number.isFinite(amplitude)) {
    warnings.push('the initial and final state levels coincide: there is no transition to measure.');
    return result;
  }
  const n = time.length;
  // The time axis is ascending: the first sample at or after the event is found by bisection, not a walk over the head.
  const start = reference?.eventTime === undefined ? 0 : Math.min(n - 1, firstAtOrAfter(time, reference.eventTime));
  // Every reader below starts at the sample before the event's or later.
  const d: StepFraction = { values, initial: levels.initial, amplitude };

  const i50 = firstRisingCrossing(d, 0.5, start, n);
  if (i50 === null) {
    warnings.push('the waveform never crosses the 50 % reference level after the event.');
    return result;
  }
  const t50 = crossingTime(time, d, i50, 0.5);
  const i10 = lastRisingCrossing(d, 0.1, start, i50);
  const i90 = firstRisingCrossing(d, 0.9, i50, n);
  const t10 = i10 === null ? null : crossingTime(time, d, i10, 0.1);
  const t90 = i90 === null ? null : crossingTime(time, d, i90, 0.9);
  result.instants = { t10, t50, t90 };
  result.riseTime = t10 !== null && t90 !== null ? t90 - t10 : null;
  if (t10 === null) warnings.push('the 10 % reference level is not crossed before the 50 % instant: the record starts inside the transition.');

  const i100 = firstRisingCrossing(d, 1, i50, n);
  const { noise, from: settledFrom } = settledNoise(d, i50);
  const noisePeak = noise * Math.sqrt(2 * Math.log(n));
  const extremes = i100 === null ? null : extremesFrom(d, i100, noisePeak);
  if (extremes === null) {
    result.overshoot = 0;
    result.undershoot = 0;
  } else {
    const { peak, trough } = extremes;
    result.overshoot = Math.max(0, fractionAt(d, peak) - 1) * 100;
    result.undershoot = Math.max(0, 1 - fractionAt(d, trough)) * 100;
    if (fractionAt(d, peak) > 1) {
      result.peakInstant = time[peak];
      if (reference?.eventTime !== undefined) result.peakTime = time[peak] - reference.eventTime;
    }
  }

  // The last sample outside each band, from i50 on: the pass from i100 found those after it; only a ring that
  // never leaves a band after i100 sends the search back over [i50, i100). None beyond 2 % means none beyond 5 %.
  const scanned = i100 ?? n;
  const last2 = extremes && extremes.beyond2 >= 0 ? extremes.beyond2 : lastBeyond(d, 0.02, i50, scanned);
  const last5 = extremes && extremes.beyond5 >= 0 ? extremes.beyond5 : lastBeyond(d, 0.05, i50, Math.min(scanned, last2 + 1));
  result.settlingTime2 = settlingTime(time, d, last2, t50, 0.02);
  result.settlingTime5 = settlingTime(time, d, last5, t50, 0.05);
  if (result.settlingTime2 === null) warnings.push('the waveform does not stay within 2 % of the final level before the record ends.');
  const ringAtEnd = reference?.modelSettled !== undefined && time[settledFrom] < reference.modelSettled;
  if (noise > 0.02 / 3 && !ringAtEnd) {
    warnings.push(
      `the settled noise is ${(100 * noise).toFixed(2)} % rms of the step, so noise alone leaves the 2 % band now and then: ` +
        'the 2 % settling time reads late.',
    );
  }
  if (i100 !== null && extremes !== null) result.ringFrequency = ringFrequency(time, d, i100, noisePeak, extremes);
  return result;
}

/**
 * The samples as fractions of the step, d = (value - initial) / amplitude: 0 at the initial state, 1 at the final one,
 * whichever way the step goes. Computed where read, inline in the passes: a stored copy of a long record would cost
 * the first touch of as much fresh memory. Each pass over the samples is a small function of its own, so each is
 * optimised on what it alone has run.
 */
interface StepFraction {
  values: ArrayLike<number>;
  initial: number;
  amplitude: number;
}

/** d at sample i. */
function fractionAt(d: StepFraction, i: number): number {
  return (d.values[i] - d.initial) / d.amplitude;
}

/** What the one pass from the final level's first crossing (sample i100) to the record's end finds. */
interface AfterCrossing {
  /** The first largest and first smallest sample. */
  peak: number;
  trough: number;
  /** The largest |d - 1|. */
  largest: number;
  /** The last sample with |d - 1| beyond 2 % and beyond 5 % (-1 for none): the settling times' ends. */
  beyond2: number;
  beyond5: number;
  /** The last sample with |d - 1| beyond the noise peak (-1 for none): no final-level crossing is counted after it. */
  beyondNoise: number;
}

/** From sample i100 on, in one pass: the extremes, and the last samples outside the settling bands and the noise peak. */
function extremesFrom(d: StepFraction, i100: number, noisePeak: number): AfterCrossing {
  const { values, initial, amplitude } = d;
  let peak = i100;
  let trough = i100;
  let high = fractionAt(d, i100);
  let low = high;
  let largest = 0;
  let beyond2 = -1;
  let beyond5 = -1;
  let beyondNoise = -1;
  for (let i = i100; i < values.length; i++) {
    const di = (values[i] - initial) / amplitude;
    if (di > high) {
      peak = i;
      high = di;
    }
    if (di < low) {
      trough = i;
      low = di;
    }
    const off = Math.abs(di - 1);
    largest = Math.max(largest, off);
    if (off > 0.02) {
      beyond2 = i;
      if (off > 0.05) beyond5 = i;
    }
    if (off > noisePeak) beyondNoise = i;
  }
  return { peak, trough, largest, beyond2, beyond5, beyondNoise };
}

/** The last sample in [from, to) with |d - 1| beyond band, or -1. */
function lastBeyond(d: StepFraction, band: number, from: number, to: number): number {
  const { values, initial, amplitude } = d;
  for (let i = to - 1; i >= from; i--) if (Math.abs((values[i] - initial) / amplitude - 1) > band) return i;
  return -1;
}

/** RMS of d - 1 over the last fifth of the record (not before sample `after`): the settled noise, and the sample it starts at. */
function settledNoise(d: StepFraction, after: number): { noise: number; from: number } {
  const { values, initial, amplitude } = d;
  const n = values.length;
  const from = Math.max(after, Math.floor(0.8 * n));
  let squares = 0;
  for (let i = from; i < n; i++) squares += ((values[i] - initial) / amplitude - 1) ** 2;
  return { noise: Math.sqrt(squares / Math.max(1, n - from)), from };
}

/** Index i (> from) of the first step d[i-1] < level <= d[i]. */
function firstRisingCrossing(d: StepFraction, level: number, from: number, to: number): number | null {
  const { values, initial, amplitude } = d;
  const first = Math.max(from, 1);
  if (first >= to) return null;
  let before = fractionAt(d, first - 1);
  for (let i = first; i < to; i++) {
    const di = (values[i] - initial) / amplitude;
    if (before < level && di >= level) return i;
    before = di;
  }
  return null;
}

/** Index i (<= to) of the last step d[i-1] < level <= d[i] at or after from. */
function lastRisingCrossing(d: StepFraction, level: number, from: number, to: number): number | null {
  const { values, initial, amplitude } = d;
  const last = Math.max(from, 1);
  if (to < last) return null;
  let after = fractionAt(d, to);
  for (let i = to; i >= last; i--) {
    const before = (values[i - 1] - initial) / amplitude;
    if (before < level && after >= level) return i;
    after = before;
  }
  return null;
}

/** Linear interpolation of the instant where d passes level between samples i - 1 and i. */
function crossingTime(time: ArrayLike<number>, d: StepFraction, i: number, level: number): number {
  const before = fractionAt(d, i - 1);
  const f = (level - before) / (fractionAt(d, i) - before);
  return time[i - 1] + f * (time[i] - time[i - 1]);
}

/** The settling time from t50, given the last sample outside the band (-1 for none): null when that is the record's last. */
function settlingTime(time: ArrayLike<number>, d: StepFraction, last: number, t50: number, band: number): number | null {
  if (last === d.values.length - 1) return null;
  if (last < 0) return 0;
  const atLast = fractionAt(d, last);
  const target = atLast > 1 ? 1 + band : 1 - band;
  const f = (target - atLast) / (fractionAt(d, last + 1) - atLast);
  return time[last] + f * (time[last + 1] - time[last]) - t50;
}

/**
 * Crossings of the final level from its first crossing (sample i100) on, counted with hysteresis so
 * that noise about a settled level adds none: a crossing is counted when the opposite threshold is
 * passed. Successive crossings are half a ring period apart. The threshold is 2 % of the largest
 * excursion past the final level or the noise peak sqrt(2 ln N) times the settled noise RMS (the
 * expected largest of N Gaussian samples), whichever is larger;
 * an excursion under twice the noise peak is not taken for a ring. From the pass after i100: `largest`, max |d - 1|
 * from i100 on, and `beyondNoise`, the last sample beyond the noise peak (hence the threshold): no crossing is
 * counted after it, so the count stops there.
 */
function ringFrequency(time: ArrayLike<number>, d: StepFraction, i100: number, noisePeak: number, after: Pick<AfterCrossing, 'largest' | 'beyondNoise'>): number | null {
  const { values, initial, amplitude } = d;
  const { largest, beyondNoise } = after;
  if (largest < 2 * noisePeak) return null;
  const h = Math.max(CROSSING_HYSTERESIS * largest, noisePeak);
  const crossings: Crossing[] = [];
  let side = -1;
  // First and last sign change since the last committed crossing: noise near a slow crossing adds
  // changes on both sides of the true one, so their midpoint is the estimate.
  let firstChange = i100;
  let lastChange = i100;
  let lobe = largest;
  let above = fractionAt(d, i100) - 1 >= 0;
  for (let i = i100 + 1; i <= beyondNoise; i++) {
    const e = (values[i] - initial) / amplitude - 1;
    if (e >= 0 !== above) {
      above = !above;
      if (firstChange < 0) firstChange = i;
      lastChange = i;
    }
    lobe = Math.max(lobe, Math.abs(e));
    if ((side < 0 && e > h) || (side > 0 && e < -h)) {
      crossings.push({ time: (crossingTime(time, d, firstChange, 1) + crossingTime(time, d, lastChange, 1)) / 2, lobe });
      side = -side;
      firstChange = -1;
      lobe = 0;
    }
  }
  if (crossings.length < 2) return null;
  return 1 / (2 * halfPeriod(crossings));
}

interface Crossing {
  time: number;
  /** Largest excursion of the lobe before the crossing: the slope there scales with it. */
  lobe: number;
}

/**
 * Weighted least-squares slope of crossing instant against half-period number: the mean half
 * period. The timing error of a crossing is noise / slope, so the weight is the lobe squared. Near
 * the noise floor a peak may fail to pass the threshold, so a gap counts as the whole number of
 * half periods (from the median gap) it spans.
 */
function halfPeriod(crossings: Crossing[]): number {
  const gaps = crossings.slice(1).map((c, i) => c.time - crossings[i].time);
  const guess = [...gaps].sort((a, b) => a - b)[Math.floor(gaps.length / 2)];
  const index = [0];
  gaps.forEach((g) => index.push(index[index.length - 1] + Math.max(1, Math.round(g / guess))));
  const w = crossings.map((c) => c.lobe * c.lobe);
  const sw = w.reduce((a, b) => a + b, 0);
  const meanK = index.reduce((a, k, i) => a + w[i] * k, 0) / sw;
  const meanT = crossings.reduce((a, c, i) => a + w[i] * c.time, 0) / sw;
  let sxy = 0;
  let sxx = 0;
  crossings.forEach((c, i) => {
    sxy += w[i] * (index[i] - meanK) * (c.time - meanT);
    sxx += w[i] * (index[i] - meanK) ** 2;
  });
  return sxy / sxx;
}
