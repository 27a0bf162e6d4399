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
  /** Mean slope of the current between its 10 % and 90 % instants, A/s (magnitude). */
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

/** Fewer samples than this between the 10 % and 90 % instants leave the slope to the interpolation: refused. */
const MIN_EDGE_SAMPLES = 4;
/** Samples of the voltage before the edge needed for its level. */
const MIN_LEVEL_SAMPLES = 8;
/** The current step and the voltage drop must stand this many noise levels (of their means) out. */
const SIGNAL_SIGMAS = 5;
/** A drop beyond this fraction of the whole voltage swing is the switch's fall, not L di/dt on a plateau. */
const MAX_DROP_FRACTION = 0.9;
/** GUM (JCGM 100:2008) 6.2-6.3: expanded uncertainty U = k u_c, k = 2 for about 95 % coverage. */
export const COVERAGE_FACTOR = 2;
/** The 10-90 % slope spans 80 % of the step. */
const SPAN = 0.8;

/**
 * L = V_L / (di/dt) (v = L di/dt). di/dt is the 10-90 % slope of the current, 0.8 x step / (t90 - t10), with the
 * instants and state levels of IEEE Std 181 (histogram mode: transitionMetrics); V_L is the mean drop of the switch
 * voltage below its level before the edge over [t10, t90], or the plateau given. The mean drop times the interval over
 * the current change is the volt-seconds over the ampere change, exact for a constant L whatever the edge's shape
 * (derived). Uncertainty is first order: the noise of each record (first differences), the crossing instants
 * (noise over the local slope, and the sample interval as a rectangular interpolation error) and the level means.
 * An edge that cannot give a slope throws CircuitInputError naming 'current', 'voltage' or 'plateau'.
 */
export function inductanceFromEdge(input: EdgeInductanceInput): EdgeInductance {
  const { current } = input;
  checkTrace('current', current);
  if ((input.voltage === undefined) === (input.plateau === undefined)) {
    throw new CircuitInputError('plateau', 'give either the voltage capture or the plateau voltage, not both and not neither');
  }
  const edge = currentEdge(current);
  const T = edge.t90 - edge.t10;
  const uT = Math.hypot(edge.u10, edge.u90);
  const didtValue = (SPAN * Math.abs(edge.step)) / T;
  const didt = quantity(didtValue, didtValue * Math.hypot(edge.uStep / Math.abs(edge.step), uT / T), 'A/s');
  const plateau = input.voltage ? voltageDrop(input.voltage, edge) : givenPlateau(input.plateau as Quantity);
  const lValue = plateau.value / didt.value;
  const L = quantity(lValue, lValue * Math.hypot((plateau.stderr ?? 0) / plateau.value, (didt.stderr ?? 0) / didt.value), 'H');
  const notes = [
    'L from the edge = V_L / (di/dt) (v = L di/dt): di/dt is the 10-90 % slope of the current (IEEE 181 reference levels), V_L ' +
      (input.voltage ? 'the mean drop of the switch voltage below its level before the edge over the same interval.' : 'the plateau voltage given.'),
    'the voltage and current probes must be deskewed against each other: a delay between them moves the interval the drop is read over (common practice).',
  ];
  return { L, didt, plateau, plateauSource: input.voltage ? 'voltage capture' : 'given', edge: { t10: edge.t10, t90: edge.t90, step: edge.step }, notes };
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
  u10: number;
  u90: number;
  step: number;
  uStep: number;
}

function currentEdge(current: EdgeTrace): CurrentEdge {
  const { time, values } = current;
  const metrics = transitionMetrics(time, values);
  const step = metrics.amplitude;
  const noise = estimateNoise(values);
  const { t10, t90 } = metrics.instants;
  if (!(Math.abs(step) > SIGNAL_SIGMAS * noise) || t10 === null || t90 === null) {
    throw new CircuitInputError('current', 'no complete edge: the current does not step clearly between two levels, crossing 10 % and 90 % of its step');
  }
  const inside = countBetween(time, t10, t90);
  if (inside < MIN_EDGE_SAMPLES) {
    throw new CircuitInputError('current', `the rise spans only ${inside} sample(s) between 10 % and 90 %; di/dt needs at least ${MIN_EDGE_SAMPLES}: sample faster`);
  }
  const before = countBetween(time, -Infinity, t10);
  const after = countBetween(time, t90, Infinity);
  const uStep = Math.hypot(noise / Math.sqrt(Math.max(1, before)), noise / Math.sqrt(Math.max(1, after)));
  return { t10, t90, u10: crossingUncertainty(time, values, t10, noise), u90: crossingUncertainty(time, values, t90, noise), step, uStep };
}

/** Noise over the local slope, and the sample interval as a rectangular interpolation error (GUM 4.3.7). */
function crossingUncertainty(time: ArrayLike<number>, values: ArrayLike<number>, t: number, noise: number): number {
  const k = Math.max(0, Math.min(time.length - 2, upperIndex(time, t) - 1));
  const dt = time[k + 1] - time[k];
  const slope = Math.abs((values[k + 1] - values[k]) / dt);
  return Math.hypot(slope > 0 ? noise / slope : dt, dt / Math.sqrt(12));
}

/** The drop of the switch voltage below its level before the edge, averaged over [t10, t90]. */
function voltageDrop(voltage: EdgeTrace, edge: CurrentEdge): Quantity {
  checkTrace('voltage', voltage);
  const { time, values } = voltage;
  const T = edge.t90 - edge.t10;
  if (time[0] > edge.t10 || time[time.length - 1] < edge.t90) {
    throw new CircuitInputError('voltage', 'the voltage capture does not cover the current\'s rise (the two records must share one time axis)');
  }
  const noise = estimateNoise(values);
  // The level before the edge, one rise time clear of it.
  const headEnd = countBetween(time, -Infinity, edge.t10 - T);
  if (headEnd < MIN_LEVEL_SAMPLES) {
    throw new CircuitInputError('voltage', `only ${headEnd} sample(s) before the edge: its level needs at least ${MIN_LEVEL_SAMPLES}`);
  }
  let sum = 0;
  for (let i = 0; i < headEnd; i++) sum += values[i];
  const before = sum / headEnd;
  const swing = before - transitionMetrics(time, values).levels.final;
  const direction = Math.sign(swing) || 1;
  const drop = (t: number) => direction * (before - interpolate(time, values, t));
  const meanDrop = direction * (before - meanOver(time, values, edge.t10, edge.t90));
  const inside = Math.max(1, countBetween(time, edge.t10, edge.t90));
  const u = Math.hypot(
    noise / Math.sqrt(headEnd),
    noise / Math.sqrt(inside),
    ((drop(edge.t10) - meanDrop) * edge.u10) / T,
    ((drop(edge.t90) - meanDrop) * edge.u90) / T,
  );
  if (!(meanDrop > SIGNAL_SIGMAS * u)) {
    throw new CircuitInputError('voltage', `the switch voltage does not drop clearly while the current rises (${formatEngineering(meanDrop, 'V')}): no L di/dt to read`);
  }
  if (meanDrop > MAX_DROP_FRACTION * Math.abs(swing)) {
    throw new CircuitInputError(
      'voltage',
      'the switch voltage has all but finished its fall while the current rises: the drop is not L di/dt alone (soft switching, or the probes are skewed)',
    );
  }
  return quantity(meanDrop, u, 'V');
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
