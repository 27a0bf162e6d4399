// Finds samples held at an ADC rail: flat runs at the channel's extreme that the signal slews into.

/** Shortest run at the extreme that can be a rail. */
const MIN_RUN = 3;
/** Samples beside a run used to measure how steeply the signal enters or leaves it. */
const FLANK = 3;
/**
 * A smooth peak sampled finely stays on its top code for about 4 q / slope samples (q the code step), so a run
 * at least this many steps long for its flank slope, with flanks moving at least one step per sample, is a rail.
 */
const RUN_SLOPE_STEPS = 16;
/**
 * A smooth peak that holds its top code for L samples is a parabola within q of its top over those L, so L
 * samples beyond the run it lies at most 9 q below it; a signal that falls further than this there was cut off.
 */
const RUN_DROP_STEPS = 16;
/**
 * Runs at the extreme this few samples apart are judged as one stretch at the rail: where a clipped signal
 * stands only a few codes beyond the rail, noise carries single samples back under it, breaking the flat run.
 */
const MERGE_GAP = 3;

export interface Clipping {
  /** 1 where the sample is part of a rail run. */
  clipped: Uint8Array;
  /** Clipped samples at the top and at the bottom rail. */
  high: number;
  low: number;
  /** The rail levels (NaN when that side is not clipped). */
  highLevel: number;
  lowLevel: number;
}

// The passes over a whole channel are small loops that carry integers, not doubles, from one sample to the next: each
// runs once over a long record, a small loop is compiled mid-loop far sooner, and a double carried through a loop that
// was entered before it was compiled is boxed (a heap allocation) at every change.

/** The smallest non-zero step between neighbouring samples: one code for quantised data. */
function codeStep(values: Float64Array): number {
  let step = Infinity;
  for (let i = 1; i < values.length; i++) {
    const d = Math.abs(values[i] - values[i - 1]);
    if (d > 0 && d < step) step = d;
  }
  return step;
}

/** The largest and smallest values, NaN skipped (-Infinity and Infinity when there is none). */
function extremes(values: Float64Array): { highest: number; lowest: number } {
  let first = 0;
  while (first < values.length && values[first] !== values[first]) first++;
  if (first === values.length) return { highest: -Infinity, lowest: Infinity };
  let high = first;
  let low = first;
  for (let i = first + 1; i < values.length; i++) {
    const v = values[i];
    if (v > values[high]) high = i;
    if (v < values[low]) low = i;
  }
  return { highest: values[high], lowest: values[low] };
}

/** Mean slope towards the run (units per sample) over up to FLANK samples beside it, from index `near` outwards. */
function flankSlope(values: Float64Array, near: number, direction: 1 | -1, rail: number, sign: 1 | -1): number {
  let far = near;
  for (let k = 1; k <= FLANK && far + direction >= 0 && far + direction < values.length; k++) far += direction;
  if (far === near) return sign * (rail - values[near]);
  return (sign * (values[near] - values[far])) / Math.abs(far - near);
}

/** How far below the rail (towards the inside) the signal lies `distance` samples beyond the run, as the mean of 3 samples. */
function dropBeyond(values: Float64Array, edge: number, direction: 1 | -1, distance: number, rail: number, sign: 1 | -1): number {
  const centre = Math.max(1, Math.min(values.length - 2, edge + direction * distance));
  return sign * (rail - (values[centre - 1] + values[centre] + values[centre + 1]) / 3);
}

/** Marks the rail runs on one side (sign 1: top at `rail`, the maximum; -1: bottom, the minimum); returns how many samples were marked. */
function markSide(values: Float64Array, sign: 1 | -1, rail: number, step: number, clipped: Uint8Array): { count: number; level: number } {
  const runs = runsAt(values, rail);
  // Each run is judged on its own as well: merged with its neighbours, the runs of a ring whose tops are cut for most
  // of each period, then held at the rail to the record's end, are one stretch touching the end, never inside it.
  const confirmed = [...stretches(runs), ...runs.map((run) => [run])].some((stretch) => {
    if (!stretch.some((run) => run.end - run.start + 1 >= MIN_RUN)) return false;
    const start = stretch[0].start;
    const end = stretch[stretch.length - 1].end;
    const length = end - start + 1;
    const interior = start > 0 && end < values.length - 1;
    const steep = (slope: number): boolean => slope >= step && slope * length >= RUN_SLOPE_STEPS * step;
    const falls = (edge: number, direction: 1 | -1): boolean =>
      dropBeyond(values, edge, direction, Math.max(FLANK, length), rail, sign) >= RUN_DROP_STEPS * step;
    const steepBothSides = steep(flankSlope(values, start - 1, -1, rail, sign)) && steep(flankSlope(values, end + 1, 1, rail, sign));
    return interior && (steepBothSides || (falls(start, -1) && falls(end, 1)));
  });
  if (!confirmed) return { count: 0, level: rail };
  let count = 0;
  for (const run of runs) {
    if (run.end - run.start + 1 < MIN_RUN) continue;
    clipped.fill(1, run.start, run.end + 1);
    count += run.end - run.start + 1;
  }
  return { count, level: rail };
}

/** The runs of samples exactly at `rail` (a single sample is a run of one), in order; found by indexOf, which scans natively. */
function runsAt(values: Float64Array, rail: number): { start: number; end: number }[] {
  const runs: { start: number; end: number }[] = [];
  for (let i = values.indexOf(rail); i >= 0; i = values.indexOf(rail, i + 1)) {
    const start = i;
    while (i + 1 < values.length && values[i + 1] === rail) i++;
    runs.push({ start, end: i });
  }
  return runs;
}

/** The runs grouped into stretches: a run at most MERGE_GAP samples after the one before joins its stretch. */
function stretches(runs: { start: number; end: number }[]): { start: number; end: number }[][] {
  const out: { start: number; end: number }[][] = [];
  for (const run of runs) {
    const last = out[out.length - 1];
    if (last && run.start - last[last.length - 1].end - 1 <= MERGE_GAP) last.push(run);
    else out.push([run]);
  }
  return out;
}

/**
 * Rule: the channel's maximum (or minimum) is a rail when some stretch at it, or some run of at least 3 on its own,
 * lies inside the record (a stretch: runs exactly at it, at most 3 samples apart, one of them at least 3 long) and the
 * signal moves into and out of it steeply:
 * on both sides, either by at least one code step per sample (averaged over 3 samples) with that slope times the
 * stretch's length at least 16 code steps, or (finely sampled records) by at least 16 code steps at a distance of
 * the stretch's length beyond it. Then every run of 3 or more at that level is marked, those touching the start or
 * end of the record included (the fit's rail guard leaves out the samples beside them). A smooth peak repeating
 * its top code, a level the signal settles onto, or a flat pre-trigger baseline is not marked; a pulse top that is
 * exactly flat between steep edges cannot be told from a rail and is marked.
 */
export function detectClipping(values: Float64Array): Clipping {
  const clipped = new Uint8Array(values.length);
  const step = codeStep(values);
  if (!Number.isFinite(step)) return { clipped, high: 0, low: 0, highLevel: NaN, lowLevel: NaN };
  const { highest, lowest } = extremes(values);
  const high = markSide(values, 1, highest, step, clipped);
  const low = markSide(values, -1, lowest, step, clipped);
  return {
    clipped,
    high: high.count,
    low: low.count,
    highLevel: high.count > 0 ? high.level : NaN,
    lowLevel: low.count > 0 ? low.level : NaN,
  };
}
