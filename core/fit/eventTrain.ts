// The events of a record driven again and again (a square wave, a pulse train): where each ring starts and ends.

/** One event of a record, in sample indices of the values searched. */
export interface EventSpan {
  /** First sample of the block the event clears the noise in (the record's start when it began before the record). */
  onset: number;
  /** First sample of the natural response to fit: the block after the onset's, so never before the true onset. */
  start: number;
  /** One past the last sample to fit: a margin before the next event's onset, or the record's end. */
  end: number;
  /** False when the record starts inside this event (its onset lies before the first sample). */
  hasOnset: boolean;
  /** Whether the ring has died into the noise before the span ends. */
  settledAtEnd: boolean;
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
 * at least this many times over within one block. Smaller ratios would let a ring's phase pass for an event.
 */
const JUMP_RATIO = 2;
/** An event's largest activity (the rms of its swing within a block) stands this many noise levels clear... */
const MIN_EVENT_NOISES = 2.5;
/** ...and is at least this share of the record's largest event (a glitch beside full-scale rings is no event). */
const MIN_EVENT_SHARE = 0.05;
/** Blocks left out before the next event's cut: a smooth start clears the noise a little after it begins. */
const END_MARGIN_BLOCKS = 1;
/** The last blocks of a span that must be quiet for its ring to count as died away. */
const SETTLED_BLOCKS = 2;
/** Fewest blocks over the record for the search to run at all. */
const MIN_BLOCKS = 16;

/**
 * The events of a record: a block (a quarter ring period) whose swing about its own mean stands clear of
 * the noise and of the previous ring period's swing by JUMP_RATIO begins an event. The swing within a
 * block does not depend on the level, so alternate edges of a square wave and kicks about one level are
 * found alike, after a quiet stretch or while the previous ring still decays. `noise` is the standard
 * deviation of one sample's noise. A record with no event, or
 * too short to search, gives an empty list; one event gives one span.
 */
export function findEventTrain(values: ArrayLike<number>, noise: number): EventSpan[] {
  const n = values.length;
  const period = ringPeriodSamples(values, noise) ?? n * FALLBACK_PERIOD_SHARE;
  const block = Math.max(MIN_BLOCK, Math.round(period / BLOCKS_PER_PERIOD));
  const blocks = Math.floor(n / block);
  if (blocks < MIN_BLOCKS || !(noise > 0)) return [];
  const lookback = Math.max(1, Math.ceil(period / block));
  const activity = blockActivity(values, block, blocks, noise);
  const activeVariance = noise * noise * ACTIVE_SIGMAS * Math.sqrt(2 / (block - 1));
  const active = (k: number) => activity[k] ** 2 > activeVariance;
  const largest = Math.max(...activity);
  const eventFloor = Math.max(MIN_EVENT_NOISES * noise, MIN_EVENT_SHARE * largest);
  const peakFrom = (k: number) => {
    let best = k;
    for (let j = k; j < Math.min(blocks, k + lookback + 1); j++) if (activity[j] > activity[best]) best = j;
    return best;
  };

  // cut: the first block whose next ring period rises above the previous one; onset: where it does (cut <= onset).
  const onsets: { cut: number; onset: number; hasOnset: boolean }[] = [];
  let k = 0;
  if (active(0)) {
    if (activity[peakFrom(0)] < eventFloor) return [];
    onsets.push({ cut: 0, onset: 0, hasOnset: false });
    k = peakFrom(0) + 1;
  }
  for (; k < blocks; k++) {
    if (!active(k)) continue;
    let before = 0;
    for (let j = Math.max(0, k - lookback); j < k; j++) before = Math.max(before, activity[j]);
    const peak = peakFrom(k);
    if (activity[peak] < Math.max(JUMP_RATIO * before, eventFloor)) continue;
    let onset = k;
    while (!(active(onset) && activity[onset] >= JUMP_RATIO * before)) onset++;
    onsets.push({ cut: k, onset, hasOnset: true });
    k = peak;
  }

  return onsets.map((o, i) => {
    const next = onsets[i + 1];
    // The next event may begin up to a block before its cut (a smooth start clears the noise late).
    const endBlock = next ? Math.max(o.onset + 1, next.cut - END_MARGIN_BLOCKS) : blocks;
    let quietEnd = endBlock - SETTLED_BLOCKS > o.onset;
    for (let j = endBlock - SETTLED_BLOCKS; quietEnd && j < endBlock; j++) quietEnd = !active(j);
    return {
      onset: o.onset * block,
      start: Math.min(n, (o.onset + 1) * block),
      end: next ? endBlock * block : n,
      hasOnset: o.hasOnset,
      settledAtEnd: quietEnd,
    };
  });
}

/** Per block, the rms swing of the samples about the block's mean beyond the noise: sqrt(max(0, variance - noise^2)). */
function blockActivity(values: ArrayLike<number>, block: number, blocks: number, noise: number): Float64Array {
  const activity = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    let sum = 0;
    for (let i = k * block; i < (k + 1) * block; i++) sum += values[i];
    const mean = sum / block;
    let squares = 0;
    for (let i = k * block; i < (k + 1) * block; i++) squares += (values[i] - mean) ** 2;
    activity[k] = Math.sqrt(Math.max(0, squares / (block - 1) - noise * noise));
  }
  return activity;
}

/** A turning point counts once the record has come back from it by this many noise levels. */
const TURN_NOISES = 6;
/** Fewest turns for a ring period to be read from them. */
const MIN_TURNS = 3;

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
