// Loop inductance from a turn-on edge, L = V_L / (di/dt), as a cross-check of the added-capacitor L_p.
import { estimateNoise } from '../fit/noise';
import { quantity, type Quantity } from '../quantity';
import { formatEngineering, formatMeasured } from '../units/format';
import { CircuitInputError } from './errors';
import { transitionMetrics } from './transitions';

/** Samples of one channel: time in s, values in A (current) or V (voltage). */
export interface EdgeTrace {
  time: ArrayLike<number>;
  values: ArrayLike<number>;
}

export interface EdgeInductanceInput {
  /** The current through the loop across a turn-on edge. */
  current: EdgeTrace;
  /** The switch voltage across the same edge: its drop below the level before the edge, while the current rises, is V_L. */
  voltage?: EdgeTrace;
  /** V_L as read by the user instead (the plateau of the drop), V, with its standard uncertainty. */
  plateau?: Quantity;
}

export interface EdgeInductance {
  L: Quantity;
  /** Slope of the current over its 10-90 % rise, A/s (magnitude): the line's, or with the switch voltage the mean drop over L. */
  didt: Quantity;
  /** Mean voltage across the loop inductance over the same interval, V. */
  plateau: Quantity;
  plateauSource: 'voltage capture' | 'given';
  /** The current's 10 % and 90 % instants, s, and its step between the state levels, A. */
  edge: { t10: number; t90: number; step: number };
  notes: string[];
}

export interface InductanceCrossCheck {
  edge: EdgeInductance;
  /** L from the edge minus L_p from the ring, H. */
  difference: Quantity;
  /** Agree when |difference| <= COVERAGE_FACTOR combined standard uncertainties; undetermined when L_p has none. */
  verdict: 'agree' | 'disagree' | 'undetermined';
  coverageFactor: number;
}

/** Fewer samples than this between the 10 % and 90 % instants leave too little to fit: refused. */
const MIN_EDGE_SAMPLES = 6;
/** Samples of the voltage before the edge needed for its level. */
const MIN_LEVEL_SAMPLES = 8;
/** The current step and the voltage drop must stand this many noise levels (of their means) out. */
const SIGNAL_SIGMAS = 5;
/** A drop beyond this fraction of the whole voltage swing is the switch's fall, not L di/dt on a plateau. */
const MAX_DROP_FRACTION = 0.9;
/** GUM (JCGM 100:2008) 6.2-6.3: expanded uncertainty U = k u_c, k = 2 for about 95 % coverage. */
export const COVERAGE_FACTOR = 2;
/**
 * The instants are found on the current averaged over this fraction of the rise: on the raw samples noise makes the
 * last 10 % crossing late and the first 90 % crossing early, and the samples at the window's ends noise-selected.
 */
const SMOOTHING_FRACTION = 1 / 8;

/**
 * L from a turn-on edge (v = L di/dt). The interval is the current's rise from 10 % to 90 % of its step (IEEE Std 181
 * reference levels on the histogram-mode state levels, the instants found on the current averaged over an eighth of
 * the rise). With the switch voltage, V_L(t) is its drop below the level before the edge and i(t) - i(t10) =
 * (1 / L) x the integral of V_L from t10: the raw current is fitted by least squares against those volt-seconds, which
 * holds whatever the edge's shape (derived); di/dt is then the mean V_L over L. With the plateau given, di/dt is the
 * slope of a line fitted to the current over the interval. Uncertainties: the fits' residual scatter (widened for
 * correlated residuals, AR(1) effective sample size: common practice) and the level before the edge.
 * An edge that cannot give a slope throws CircuitInputError naming 'current', 'voltage' or 'plateau'.
 */
export function inductanceFromEdge(input: EdgeInductanceInput): EdgeInductance {
  const { current } = input;
  checkTrace('current', current);
  if ((input.voltage === undefined) === (input.plateau === undefined)) {
    throw new CircuitInputError('plateau', 'give either the voltage capture or the plateau voltage, not both and not neither');
  }
  const edge = currentEdge(current);
  const fitted = input.voltage ? fitAgainstVoltSeconds(current, input.voltage, edge) : fitGivenPlateau(current, givenPlateau(input.plateau as Quantity), edge);
  const notes = [
    input.voltage
      ? 'L from the edge: the current over its 10-90 % rise (IEEE 181 reference levels) fitted against the volt-seconds of the switch voltage\'s drop ' +
        '(i - i(t10) = (1 / L) x integral of V_L dt, from v = L di/dt); di/dt shown is the mean drop V_L over L.'
      : 'L from the edge = V_L / (di/dt) (v = L di/dt): di/dt is the slope of a line fitted to the current over its 10-90 % rise (IEEE 181 reference levels), V_L the plateau given.',
    'the voltage and current probes must be deskewed against each other: a delay between them moves the interval the drop is read over (common practice).',
  ];
  return { ...fitted, plateauSource: input.voltage ? 'voltage capture' : 'given', edge: { t10: edge.t10, t90: edge.t90, step: edge.step }, notes };
}

/** L from the edge against L_p from the ring, within COVERAGE_FACTOR combined standard uncertainties. */
export function crossCheckInductance(edge: EdgeInductance, ringL: Quantity): InductanceCrossCheck {
  const d = edge.L.value - ringL.value;
  const u = ringL.stderr === null || edge.L.stderr === null ? null : Math.hypot(ringL.stderr, edge.L.stderr);
  const difference = quantity(d, u, 'H');
  const verdict = u === null ? 'undetermined' : Math.abs(d) <= COVERAGE_FACTOR * u ? 'agree' : 'disagree';
  return { edge, difference, verdict, coverageFactor: COVERAGE_FACTOR };
}

/** The cross-check in one line: L from the edge, the comparison, and L_p from the ring. */
export function crossCheckLine(edgeL: Quantity, check: Omit<InductanceCrossCheck, 'edge'>, ringL: Quantity): string {
  const both = `L from the edge ${formatMeasured(edgeL)} against L_p ${formatMeasured(ringL)}`;
  if (check.verdict === 'undetermined') return `${both}: undetermined (L_p has no uncertainty)`;
  const within = `${check.coverageFactor} combined standard uncertainties`;
  return check.verdict === 'agree'
    ? `${both}: agree (difference ${formatMeasured(check.difference)}, within ${within})`
    : `${both}: disagree (difference ${formatMeasured(check.difference)}, beyond ${within}): one of them is wrong`;
}

interface CurrentEdge {
  t10: number;
  t90: number;
  step: number;
  /** Indices of the current samples inside [t10, t90]. */
  from: number;
  to: number;
}

function currentEdge(current: EdgeTrace): CurrentEdge {
  const { time, values } = current;
  const rough = transitionMetrics(time, values);
  const step = rough.amplitude;
  const noise = estimateNoise(values);
  const complete = (m: typeof rough) => m.instants.t10 !== null && m.instants.t90 !== null;
  if (!(Math.abs(step) > SIGNAL_SIGMAS * noise) || !complete(rough)) {
    throw new CircuitInputError('current', 'no complete edge: the current does not step clearly between two levels, crossing 10 % and 90 % of its step');
  }
  const roughInside = countBetween(time, rough.instants.t10 as number, rough.instants.t90 as number);
  const smoothed = movingAverage(values, Math.floor((roughInside * SMOOTHING_FRACTION) / 2));
  const m = transitionMetrics(time, smoothed, { initial: rough.levels.initial, final: rough.levels.final, method: 'given' });
  if (!complete(m)) throw new CircuitInputError('current', 'no complete edge once the noise is averaged: the current does not cross 10 % and 90 % of its step');
  const t10 = m.instants.t10 as number;
  const t90 = m.instants.t90 as number;
  const from = upperIndex(time, t10);
  const to = upperIndex(time, t90);
  if (to - from < MIN_EDGE_SAMPLES) {
    throw new CircuitInputError('current', `the rise spans only ${to - from} sample(s) between 10 % and 90 %; di/dt needs at least ${MIN_EDGE_SAMPLES}: sample faster`);
  }
  return { t10, t90, step, from, to };
}

/** The current against the volt-seconds of the drop: slope 1 / L (least squares, the current's noise in y). */
function fitAgainstVoltSeconds(current: EdgeTrace, voltage: EdgeTrace, edge: CurrentEdge): Pick<EdgeInductance, 'L' | 'didt' | 'plateau'> {
  checkTrace('voltage', voltage);
  const { time, values } = voltage;
  if (time[0] > edge.t10 || time[time.length - 1] < edge.t90) {
    throw new CircuitInputError('voltage', 'the voltage capture does not cover the current\'s rise (the two records must share one time axis)');
  }
  const T = edge.t90 - edge.t10;
  // The level before the edge, one rise time clear of it.
  const headEnd = countBetween(time, -Infinity, edge.t10 - T);
  if (headEnd < MIN_LEVEL_SAMPLES) {
    throw new CircuitInputError('voltage', `only ${headEnd} sample(s) before the edge: its level needs at least ${MIN_LEVEL_SAMPLES}`);
  }
  const head = headNoise(values, headEnd);
  const before = head.mean;
  const swing = before - transitionMetrics(time, values).levels.final;
  const direction = Math.sign(swing) || 1;
  const meanDrop = direction * (before - meanOver(time, values, edge.t10, edge.t90));
  // The head's noise, correlated as it is, on the mean of the head and on the mean over the rise.
  const uMean = (n: number) => (head.sd / Math.sqrt(Math.max(1, n))) * head.correlationFactor;
  const uDrop = Math.hypot(uMean(headEnd), uMean(countBetween(time, edge.t10, edge.t90)));
  if (!(meanDrop > SIGNAL_SIGMAS * uDrop)) {
    throw new CircuitInputError('voltage', `the switch voltage does not drop clearly while the current rises (${formatEngineering(meanDrop, 'V')}): no L di/dt to read`);
  }
  if (meanDrop > MAX_DROP_FRACTION * Math.abs(swing)) {
    throw new CircuitInputError(
      'voltage',
      'the switch voltage has all but finished its fall while the current rises: the drop is not L di/dt alone (soft switching, or the probes are skewed)',
    );
  }
  // Volt-seconds of the drop from t10 to each current sample, built up sample interval by sample interval.
  const dropArea = (a: number, b: number) => direction * (before - meanOver(time, values, a, b)) * (b - a);
  const x: number[] = [];
  const y: number[] = [];
  let area = 0;
  let last = edge.t10;
  for (let k = edge.from; k < edge.to; k++) {
    const t = current.time[k];
    area += dropArea(last, t);
    last = t;
    x.push(area);
    y.push(Math.sign(edge.step) * current.values[k]);
  }
  const line = fitStraightLine(x, y);
  if (!(line.slope > 0)) throw new CircuitInputError('voltage', 'the current does not rise with the volt-seconds of the drop: no L to read');
  const lValue = 1 / line.slope;
  // The level before the edge shifts every drop alike, and the voltage's noise the volt-seconds: L moves with the mean drop.
  const uL = lValue * Math.hypot(line.slopeStderr / line.slope, uDrop / meanDrop);
  const L = quantity(lValue, uL, 'H');
  const didtValue = meanDrop / lValue;
  return { L, didt: quantity(didtValue, didtValue * (line.slopeStderr / line.slope), 'A/s'), plateau: quantity(meanDrop, uDrop, 'V') };
}

/** di/dt as the slope of a line through the current over [t10, t90]; L = V_L / (di/dt). */
function fitGivenPlateau(current: EdgeTrace, plateau: Quantity, edge: CurrentEdge): Pick<EdgeInductance, 'L' | 'didt' | 'plateau'> {
  const x: number[] = [];
  const y: number[] = [];
  for (let k = edge.from; k < edge.to; k++) {
    x.push(current.time[k] - edge.t10);
    y.push(Math.sign(edge.step) * current.values[k]);
  }
  const line = fitStraightLine(x, y);
  if (!(line.slope > 0)) throw new CircuitInputError('current', 'the current does not rise over its 10-90 % interval');
  const didt = quantity(line.slope, line.slopeStderr, 'A/s');
  const lValue = plateau.value / line.slope;
  const L = quantity(lValue, lValue * Math.hypot((plateau.stderr ?? 0) / plateau.value, line.slopeStderr / line.slope), 'H');
  return { L, didt, plateau };
}

/**
 * Ordinary least squares y = a + b x with the slope's standard error from the residual scatter, widened by
 * sqrt((1 + rho) / (1 - rho)) for a positive lag-1 autocorrelation rho of the residuals (AR(1) effective sample size,
 * common practice).
 */
function fitStraightLine(x: number[], y: number[]): { slope: number; slopeStderr: number } {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i] - mx) ** 2;
    sxy += (x[i] - mx) * (y[i] - my);
  }
  const slope = sxy / sxx;
  const r = x.map((xi, i) => y[i] - my - slope * (xi - mx));
  const ss = r.reduce((a, v) => a + v * v, 0);
  let lag = 0;
  for (let i = 1; i < n; i++) lag += r[i] * r[i - 1];
  const rho = ss > 0 ? Math.max(0, Math.min(0.95, lag / ss)) : 0;
  const slopeStderr = Math.sqrt(ss / (n - 2) / sxx) * Math.sqrt((1 + rho) / (1 - rho));
  return { slope, slopeStderr };
}

/**
 * Mean, standard deviation and the AR(1) widening sqrt((1 + rho) / (1 - rho)) of a mean (common practice) of the
 * first n samples: the noise as the record shows it before the edge, band limit included.
 */
function headNoise(values: ArrayLike<number>, n: number): { mean: number; sd: number; correlationFactor: number } {
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i];
  const mean = sum / n;
  let ss = 0;
  let lag = 0;
  for (let i = 0; i < n; i++) {
    ss += (values[i] - mean) ** 2;
    if (i > 0) lag += (values[i] - mean) * (values[i - 1] - mean);
  }
  const rho = ss > 0 ? Math.max(0, Math.min(0.95, lag / ss)) : 0;
  return { mean, sd: Math.sqrt(ss / Math.max(1, n - 1)), correlationFactor: Math.sqrt((1 + rho) / (1 - rho)) };
}

/** Centred moving average over 2 half + 1 samples (fewer at the ends). */
function movingAverage(values: ArrayLike<number>, half: number): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  if (half < 1) {
    for (let i = 0; i < n; i++) out[i] = values[i];
    return out;
  }
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i] + values[i];
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - half);
    const b = Math.min(n, i + half + 1);
    out[i] = (prefix[b] - prefix[a]) / (b - a);
  }
  return out;
}

function givenPlateau(plateau: Quantity): Quantity {
  if (!Number.isFinite(plateau.value) || !(plateau.value > 0)) {
    throw new CircuitInputError('plateau', `must be a positive voltage across the loop inductance, got ${plateau.value}`);
  }
  return quantity(plateau.value, plateau.stderr ?? 0, 'V');
}

/** Mean of the linear interpolation of the samples over [a, b] (trapezoids). */
function meanOver(time: ArrayLike<number>, values: ArrayLike<number>, a: number, b: number): number {
  const knots = [a];
  for (let i = upperIndex(time, a); i < time.length && time[i] < b; i++) knots.push(time[i]);
  knots.push(b);
  let area = 0;
  for (let k = 1; k < knots.length; k++) area += ((interpolate(time, values, knots[k - 1]) + interpolate(time, values, knots[k])) / 2) * (knots[k] - knots[k - 1]);
  return area / (b - a);
}

function interpolate(time: ArrayLike<number>, values: ArrayLike<number>, t: number): number {
  const j = Math.max(1, Math.min(time.length - 1, upperIndex(time, t)));
  const f = (t - time[j - 1]) / (time[j] - time[j - 1]);
  return values[j - 1] + f * (values[j] - values[j - 1]);
}

/** First index whose time is above t (time increasing). */
function upperIndex(time: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (time[mid] <= t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Samples with a < time < b. */
function countBetween(time: ArrayLike<number>, a: number, b: number): number {
  let n = 0;
  for (let i = 0; i < time.length; i++) if (time[i] > a && time[i] < b) n++;
  return n;
}

function checkTrace(field: 'current' | 'voltage', trace: EdgeTrace): void {
  if (trace.time.length !== trace.values.length || trace.time.length < MIN_LEVEL_SAMPLES * 2) {
    throw new CircuitInputError(field, `needs at least ${MIN_LEVEL_SAMPLES * 2} samples with one time each`);
  }
  for (let i = 0; i < trace.values.length; i++) {
    if (!Number.isFinite(trace.values[i]) || !Number.isFinite(trace.time[i])) throw new CircuitInputError(field, `sample ${i + 1} is not a finite number`);
  }
}
