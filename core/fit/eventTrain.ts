// The events of a record driven again and again (a square wave, a pulse train): where each ring starts and ends.

import { estimateNoise, robustSpread, stretchOf } from './noise';

/** One event of a record, in sample indices of the values searched. */
export interface EventSpan {
  /** First sample of the block the event clears the noise in (the record's start when it began before the record). */
  onset: number;
  /** First sample of the natural response to fit: a block or two after the onset's, so never before the true onset. */
  start: number;
  /** One past the last sample to fit: a margin before the next event's onset, or the record's end. */
  end: number;
  /** False when the record starts inside this event (its onset lies before the first sample). */
  hasOnset: boolean;
  /** Whether the ring has died into the noise before the span ends. */
  settledAtEnd: boolean;
}

/** The events found and the noise they were found against. */
export interface EventTrain {
  spans: EventSpan[];
  /** Standard deviation of one sample's noise, band-limited noise read whole (see noiseModel). */
  noise: number;
  /**
   * Whether the events were placed by a ring period read from the record's turns; false where the record turns fewer
   * than MIN_TURNS times and the search's blocks fall back to a share of the record (a slow ring's own swings may
   * then pass for events: see fitEvents).
   */
  ringPeriodRead: boolean;
}

/** Smallest block whose variance is read: fewer samples make the variance too noisy to tell ring from noise. */
const MIN_BLOCK = 8;
/** Blocks of a quarter ring period: long enough to see a ring's swing, short enough to place its start. */
const BLOCKS_PER_PERIOD = 4;
/** Without a ring (too few turns), the lookback spans this share of the record (events are further apart than this). */
const FALLBACK_PERIOD_SHARE = 1 / 16;
/** A block is active when its variance exceeds the noise's by this many of its own standard deviations (chi-square, normal approximation). */
const ACTIVE_SIGMAS = 5;
/**
 * A ring's activity never rises above its own last period's (its envelope decays); a new event lifts it
 * at least this many times over. At 2, band-limited noise riding a long ring passed for events.
 */
const JUMP_RATIO = 3;
/** An event's largest activity (the rms of its swing within a block) stands this many noise levels clear... */
const MIN_EVENT_NOISES = 2.5;
/** ...and is at least this share of the record's largest event (a glitch beside full-scale rings is no event). */
const MIN_EVENT_SHARE = 0.05;
/** Blocks left out before the next event's cut: a smooth start clears the noise a little after it begins. */
const END_MARGIN_BLOCKS = 1;
/** The last blocks of a span that must be quiet for its ring to count as died away. */
const SETTLED_BLOCKS = 2;
/** An event's swing stands above the previous ring's in this many blocks of its first ring period (a lone spike's in one). */
const MIN_ACTIVE_BLOCKS = 2;
/** Fewest blocks over the record for the search to run at all. */
const MIN_BLOCKS = 16;
/** A move of the level must stand this many of its own noise levels clear (the noise of two period means). */
const SHIFT_NOISES = 6;
/** Stretches whose spread is read for the noise: this many samples, or a 32nd of the record when longer. */
const NOISE_STRETCH = 128;
/** The record's head, read for the noise too: this share of it (inside a usual pre-trigger)... */
const HEAD_SHARE = 0.02;
/** ...and at least this many samples (fewer read band-limited noise low). */
const HEAD_MIN = 128;
/** The quietest quarter of the stretches shows the noise (events fill the rest). */
const QUIET_QUANTILE = 0.25;
/** ...counted for at most this many times the difference estimate: in a record that rings throughout, the quietest stretches still ring. */
const QUIET_NOISE_CAP = 4;

/**
 * The events of a record. A block (a quarter ring period) whose swing about its own mean stands clear of
 * the noise and of the previous ring period's swing by JUMP_RATIO begins an event: the swing does not
 * depend on the level, so alternate edges of a square wave and kicks about one level are found alike,
 * after a quiet stretch or while the previous ring still decays. An edge in step with the ring before it
 * may hardly lift the swing; it moves the level, so a move of the mean over a ring period by JUMP_RATIO
 * times the swing (and the previous period's move) begins an event too. Every threshold is read against
 * the record's own noise, band-limited noise included. A record with no event, or too short to search,
 * gives an empty list.
 */
export function findEventTrain(values: ArrayLike<number>): EventTrain {
  const n = values.length;
  const { sigma: noise, independentShare } = noiseModel(values);
  if (!(noise > 0)) return { spans: [], noise, ringPeriodRead: false };
  // Samples whose noise averages out like this many independent ones (fewer when the noise is band-limited).
  const independent = (count: number) => Math.max(2, (count * independentShare) / (2 - independentShare));
  const ringPeriod = ringPeriodSamples(values, noise);
  const period = ringPeriod ?? n * FALLBACK_PERIOD_SHARE;
  const ringPeriodRead = ringPeriod !== null;
  const block = Math.max(MIN_BLOCK, Math.round(period / BLOCKS_PER_PERIOD));
  const blocks = Math.floor(n / block);
  if (blocks < MIN_BLOCKS) return { spans: [], noise, ringPeriodRead };
  const lookback = Math.max(1, Math.ceil(period / block));
  const { mean, activity } = blockStatistics(values, block, blocks, noise);
  const activeVariance = noise * noise * ACTIVE_SIGMAS * Math.sqrt(2 / (independent(block) - 1));
  const shiftFloor = SHIFT_NOISES * noise * Math.sqrt(2 / independent(lookback * block));
  const active = (k: number) => activity[k] ** 2 > activeVariance;
  const largest = Math.max(...activity);
  const eventFloor = Math.max(MIN_EVENT_NOISES * noise, MIN_EVENT_SHARE * largest);
  const peakFrom = (k: number) => {
    let best = k;
    for (let j = k; j < Math.min(blocks, k + lookback + 1); j++) if (activity[j] > activity[best]) best = j;
    return best;
  };
  // A new ring stands above the one before for more than one block; a lone spike does not.
  const lasts = (k: number, above: number) => {
    let count = 0;
    for (let j = k; j < Math.min(blocks, k + lookback + 1); j++) if (active(j) && activity[j] >= above) count++;
    return count >= MIN_ACTIVE_BLOCKS;
  };
  // How far the level moves from the ring period before block k to the one from it (0 where either is cut off).
  const shift = (k: number) => (k < lookback || k + lookback > blocks ? 0 : Math.abs(periodMean(mean, k, lookback) - periodMean(mean, k - lookback, lookback)));

  // The move from the period before block k to the period after the next one: a new level stays, a spike's does not.
  const settledShift = (k: number) =>
    k < lookback || k + 2 * lookback > blocks ? 0 : Math.abs(periodMean(mean, k + lookback, lookback) - periodMean(mean, k - lookback, lookback));

  // cut: the first block that announces the event; onset: the block it starts in; first: the first block fitted.
  const onsets: { cut: number; onset: number; first: number; hasOnset: boolean }[] = [];
  let k = 0;
  // The level test compares whole periods after the last onset only (an event's own rise moves the level).
  let levelFrom = 0;
  if (active(0) && activity[peakFrom(0)] >= eventFloor) {
    onsets.push({ cut: 0, onset: 0, first: 1, hasOnset: false });
    k = peakFrom(0) + 1;
    levelFrom = 2 * lookback + 1;
  }
  for (; k < blocks; k++) {
    if (!active(k)) continue;
    let before = 0;
    for (let j = Math.max(0, k - lookback); j < k; j++) before = Math.max(before, activity[j]);
    const peak = peakFrom(k);
    if (activity[peak] >= Math.max(JUMP_RATIO * before, eventFloor) && lasts(k, JUMP_RATIO * before)) {
      let onset = k;
      while (!(active(onset) && activity[onset] >= JUMP_RATIO * before)) onset++;
      onsets.push({ cut: k, onset, first: onset + 1, hasOnset: true });
      levelFrom = onset + 2 * lookback + 1;
      k = peak;
      continue;
    }
    if (k < levelFrom) continue;
    // An edge of a square wave in step with the ring before it may not lift the swing, but it moves the level.
    const needed = Math.max(JUMP_RATIO * before, JUMP_RATIO * shift(k - lookback), eventFloor, shiftFloor);
    if (shift(k) < needed || !(settledShift(k) >= needed)) continue;
    let edge = k;
    for (let j = k; j <= Math.min(k + lookback, blocks - lookback); j++) if (shift(j) > shift(edge)) edge = j;
    // The largest move falls within a block of the edge: one block more keeps the fit clear of it.
    onsets.push({ cut: k, onset: edge, first: edge + 2, hasOnset: true });
    levelFrom = edge + 2 * lookback + 1;
    k = edge + lookback - 1;
  }

  const spans = onsets.map((o, i) => {
    const next = onsets[i + 1];
    // The next event may begin up to a block before its cut (a smooth start clears the noise late).
    const endBlock = next ? Math.max(o.first, next.cut - END_MARGIN_BLOCKS) : blocks;
    let quietEnd = endBlock - SETTLED_BLOCKS > o.onset;
    for (let j = endBlock - SETTLED_BLOCKS; quietEnd && j < endBlock; j++) quietEnd = !active(j);
    return {
      onset: o.onset * block,
      start: Math.min(n, o.first * block),
      end: next ? endBlock * block : n,
      hasOnset: o.hasOnset,
      settledAtEnd: quietEnd,
    };
  });
  return { spans, noise, ringPeriodRead };
}

/** Per block, its mean and the rms swing of its samples about that mean beyond the noise: sqrt(max(0, variance - noise^2)). */
function blockStatistics(values: ArrayLike<number>, block: number, blocks: number, noise: number): { mean: Float64Array; activity: Float64Array } {
  const mean = new Float64Array(blocks);
  const activity = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    let sum = 0;
    for (let i = k * block; i < (k + 1) * block; i++) sum += values[i];
    mean[k] = sum / block;
    let squares = 0;
    for (let i = k * block; i < (k + 1) * block; i++) squares += (values[i] - mean[k]) ** 2;
    activity[k] = Math.sqrt(Math.max(0, squares / (block - 1) - noise * noise));
  }
  return { mean, activity };
}

/** Mean of `count` block means from block `from`: over a whole ring period the ring itself averages out. */
function periodMean(mean: Float64Array, from: number, count: number): number {
  let sum = 0;
  for (let k = from; k < from + count; k++) sum += mean[k];
  return sum / count;
}

/**
 * The noise as the search sees it: its standard deviation, the larger of the first-difference estimate
 * and the spread of the record's head or of its quietest stretches, whichever is smaller (band-limited
 * noise reads low in differences, as noise.ts explains; capped as there), and the share of samples that
 * count as independent, (difference estimate / sigma)^2: 1 for white noise, about 1 - rho for noise
 * correlated rho from one sample to the next.
 */
function noiseModel(values: ArrayLike<number>): { sigma: number; independentShare: number } {
  const fromDifferences = estimateNoise(values);
  const stretch = Math.max(NOISE_STRETCH, Math.floor(values.length / 32));
  const headLength = Math.max(HEAD_MIN, Math.floor(values.length * HEAD_SHARE));
  if (stretch > values.length) return { sigma: fromDifferences, independentShare: 1 };
  // One room holds the head's copy, then each stretch's: fresh memory costs its first touch, and a copy each would add up to the record.
  const room = new Float64Array(Math.max(stretch, Math.min(headLength, values.length)));
  // The record's head (a pre-trigger stretch) is quiet where a train rings throughout the rest.
  const head = robustSpread(stretchOf(values, 0, headLength), room);
  const ceiling = Math.min(head, QUIET_NOISE_CAP * fromDifferences);
  const sigma = Math.max(fromDifferences, Math.min(ceiling, quietSpread(values, stretch, room, fromDifferences, ceiling)));
  return { sigma, independentShare: sigma > 0 ? Math.min(1, (fromDifferences / sigma) ** 2) : 1 };
}

/**
 * The spread of the stretch at QUIET_QUANTILE among the record's stretches, as far as noiseModel can tell it apart:
 * sigma = max(floor, min(ceiling, quantile)) only reads it between the two. So the stretches are read in turn until
 * the count decides: enough at or under the floor, and the floor stands for it (the sigma is the floor); too few left
 * to fall under the ceiling, and the ceiling does (the sigma is the ceiling). A ceiling at or under the floor reads
 * none. The same sigma as from every stretch, for finite samples (a channel's): their spreads are never NaN, so they sort.
 */
function quietSpread(values: ArrayLike<number>, stretch: number, room: Float64Array<ArrayBuffer>, floor: number, ceiling: number): number {
  if (!(ceiling > floor)) return ceiling;
  const count = Math.floor(values.length / stretch);
  const rank = Math.floor(count * QUIET_QUANTILE);
  const spreads: number[] = [];
  let atFloor = 0;
  let underCeiling = 0;
  for (let from = 0; from + stretch <= values.length; from += stretch) {
    const spread = robustSpread(stretchOf(values, from, from + stretch), room);
    spreads.push(spread);
    if (spread <= floor && ++atFloor > rank) return floor;
    if (spread < ceiling) underCeiling++;
    if (underCeiling + count - spreads.length <= rank) return ceiling;
  }
  spreads.sort((a, b) => a - b);
  return spreads[rank];
}

/** A turning point counts once the record has come back from it by this many noise levels. */
const TURN_NOISES = 6;
/** Fewest turns for a ring period to be read from them. */
export const MIN_TURNS = 3;

/**
 * Samples per ring period, from the record's own turning points (hysteresis of TURN_NOISES noise levels):
 * twice the median spacing of successive turns, which are half periods wherever the record rings; the
 * long spacings across quiet stretches and edges are few. Null when the record hardly turns (no ring).
 */
function ringPeriodSamples(values: ArrayLike<number>, noise: number): number | null {
  const band = TURN_NOISES * noise;
  const turns: number[] = [];
  let rising: boolean | null = null;
  let high = 0;
  let low = 0;
  for (let i = 1; i < values.length; i++) {
    if (values[i] > values[high]) high = i;
    if (values[i] < values[low]) low = i;
    if (rising !== false && values[i] < values[high] - band) {
      if (rising === true) turns.push(high);
      rising = false;
      low = i;
    } else if (rising !== true && values[i] > values[low] + band) {
      if (rising === false) turns.push(low);
      rising = true;
      high = i;
    }
  }
  if (turns.length < MIN_TURNS) return null;
  const spacing = Float64Array.from(turns.slice(1), (t, j) => t - turns[j]).sort();
  return 2 * spacing[spacing.length >> 1];
}
