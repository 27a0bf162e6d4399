// The response of a second-order circuit after an event, one formula for all three damping regimes.
//
// y(t) = yPre                                        for t < t0
// y(t) = yFinal + e^(-alpha tau) (a C(tau) + b S(tau))   for t >= t0, tau = t - t0
// with q = omega0^2 - alpha^2 and
//   C(tau) = cos(sqrt(q) tau)          S(tau) = sin(sqrt(q) tau) / sqrt(q)      (q > 0, underdamped)
//   C(tau) = cosh(sqrt(-q) tau)        S(tau) = sinh(sqrt(-q) tau) / sqrt(-q)   (q < 0, overdamped)
// Both are entire functions of q (C = sum (-q tau^2)^k / (2k)!, S = tau sum (-q tau^2)^k / (2k+1)!),
// so the model is smooth through critical damping (q = 0, S = tau) with no switch and no 0/0.
// At t0+: y = yFinal + a and dy/dt = b - alpha a.

export interface ResponseParams {
  /** Event time, s. */
  t0: number;
  /** Level held before the event. */
  yPre: number;
  /** Level the response settles to (0 for a ringdown to zero). */
  yFinal: number;
  /** Neper frequency alpha, s^-1 (> 0 for a decaying response). */
  alpha: number;
  /** Undamped natural frequency omega0, rad/s. */
  omega0: number;
  /** Natural part at t0+: y(t0+) - yFinal. */
  a: number;
  /** Slope term: dy/dt(t0+) + alpha a. */
  b: number;
}

/** Below this |q tau^2| the power series is used instead of the trig/hyperbolic form. */
const SERIES_LIMIT = 1e-2;

const oneTau = new Float64Array(1);
const oneC = new Float64Array(1);
const oneS = new Float64Array(1);

/** e^(-alpha tau) C(tau) and e^(-alpha tau) S(tau) for one tau >= 0 (see fillDampedBasis). */
export function dampedBasis(alpha: number, omega0: number, tau: number): [number, number] {
  oneTau[0] = tau;
  fillDampedBasis(alpha, omega0, 0, oneTau, oneC, oneS);
  return [oneC[0], oneS[0]];
}

/** A record averaged in blocks: each value is the mean of `samples` consecutive samples `spacing` apart, centred on its time. */
export interface BlockAverage {
  samples: number;
  spacing: number;
}

/**
 * e^(-alpha tau) C(tau) and e^(-alpha tau) S(tau) over a whole time axis (tau = t - t0; zero before t0),
 * without allocating per sample: the hot loop of every fit. A heavily overdamped response neither
 * overflows nor cancels: cosh and sinh are split into the two poles. With a block average, the means
 * over each block's samples at or after t0, and in `after` the fraction of the block's samples that
 * is (1 after the event, 0 before it, in between for the block the event falls in; 0 or 1 without blocks).
 * `steps`, when given, are evenRunSteps(time), kept by a caller that fills the same axis many times.
 * Returns one past the last value whose share in `after` is not 1 (0 when every share is 1, or without `after`).
 */
export function fillDampedBasis(
  alpha: number,
  omega0: number,
  t0: number,
  time: ArrayLike<number>,
  ec: Float64Array,
  es: Float64Array,
  block: BlockAverage | null = null,
  after?: Float64Array,
  steps?: Float64Array,
): number {
  fillPointBasis(alpha, omega0, t0, time, ec, es, steps);
  if (block && block.samples > 1) return averageOverBlocks(alpha, omega0, t0, time, ec, es, block, after);
  let eventEnd = 0;
  if (after) {
    for (let i = 0; i < time.length; i++) {
      if (time[i] < t0) {
        after[i] = 0;
        eventEnd = i + 1;
      } else after[i] = 1;
    }
  }
  return eventEnd;
}

/**
 * Samples taken in one run of the recurrence below: its rounding grows by a few ulps a step, so 16 steps keep
 * it near 1e-15 while 15 of every 16 samples skip exp, cos and sin.
 */
export const RECURRENCE_RUN = 16;
/**
 * A run counts as evenly spaced when no time strays from its line by more than this share of a step: the
 * rounding of times printed to 10 significant digits in a record of 1000 samples is about 5e-7 of a step. The
 * model on the line then differs from the model at the printed times by at most omega_d h 1e-6 (under 4e-6 of
 * the ring's amplitude), far under the noise of any record; an axis with real jitter is computed point by point.
 */
const EVEN_SPACING = 1e-6;

/**
 * The basis at each instant of the time axis (zero before t0), written in place. On an evenly spaced run
 * past the series range the first instant is computed directly and the rest by multiplying by the step's
 * own factor (a rotation by omega_d h with decay e^(-alpha h), or the two poles' e^(s h)): the values are
 * those of the instants on the run's line, within EVEN_SPACING of a step of the recorded ones.
 */
function fillPointBasis(
  alpha: number,
  omega0: number,
  t0: number,
  time: ArrayLike<number>,
  ec: Float64Array,
  es: Float64Array,
  steps?: Float64Array,
): void {
  const q = omega0 * omega0 - alpha * alpha;
  const w = Math.sqrt(Math.abs(q));
  for (let first = 0; first < time.length; first += RECURRENCE_RUN) {
    const end = Math.min(time.length, first + RECURRENCE_RUN);
    const tau = time[first] - t0;
    const step = steps ? steps[first / RECURRENCE_RUN] : evenStep(time, first, end);
    if (!(step > 0) || !(tau >= 0) || !(Math.abs(q) * tau * tau >= SERIES_LIMIT)) {
      for (let i = first; i < end; i++) pointBasis(alpha, q, w, time[i] - t0, ec, es, i);
    } else if (q > 0) {
      const e = Math.exp(-alpha * tau);
      let c = e * Math.cos(w * tau);
      let s = e * Math.sin(w * tau);
      const decay = Math.exp(-alpha * step);
      const cosStep = decay * Math.cos(w * step);
      const sinStep = decay * Math.sin(w * step);
      ec[first] = c;
      es[first] = s / w;
      for (let i = first + 1; i < end; i++) {
        const rotated = c * cosStep - s * sinStep;
        s = c * sinStep + s * cosStep;
        c = rotated;
        ec[i] = c;
        es[i] = s / w;
      }
    } else {
      let slow = Math.exp((w - alpha) * tau);
      let fast = Math.exp(-(alpha + w) * tau);
      const slowStep = Math.exp((w - alpha) * step);
      const fastStep = Math.exp(-(alpha + w) * step);
      for (let i = first; i < end; i++) {
        if (i > first) {
          slow *= slowStep;
          fast *= fastStep;
        }
        ec[i] = (slow + fast) / 2;
        es[i] = (slow - fast) / (2 * w);
      }
    }
  }
}

/**
 * The step of each run of RECURRENCE_RUN times of the axis (the last run may be shorter) when its times rise
 * evenly, else NaN: what fillPointBasis asks of the axis, for a caller to keep (a record of 1000 values has 63 runs).
 */
function evenRunSteps(time: ArrayLike<number>): Float64Array {
  const steps = new Float64Array(Math.ceil(time.length / RECURRENCE_RUN));
  for (let run = 0; run < steps.length; run++) {
    const first = run * RECURRENCE_RUN;
    steps[run] = evenStep(time, first, Math.min(time.length, first + RECURRENCE_RUN));
  }
  return steps;
}

/** evenRunSteps of the last time axis asked about, kept: a fit fills the basis on one axis for all its solves. */
export class RunSteps {
  private time: ArrayLike<number> | null = null;
  private steps: Float64Array = new Float64Array(0);

  of(time: ArrayLike<number>): Float64Array {
    if (this.time !== time) {
      this.steps = evenRunSteps(time);
      this.time = time;
    }
    return this.steps;
  }
}

/**
 * The step of times [first, end) when they rise evenly (each within EVEN_SPACING of a step of its line), else NaN
 * (so too for a run of 2 times or fewer).
 */
function evenStep(time: ArrayLike<number>, first: number, end: number): number {
  if (end - first <= 2) return NaN;
  const step = (time[end - 1] - time[first]) / (end - 1 - first);
  if (!(step > 0)) return NaN;
  const allowed = EVEN_SPACING * step;
  for (let i = first + 1; i < end - 1; i++) if (!(Math.abs(time[i] - time[first] - (i - first) * step) <= allowed)) return NaN;
  return step;
}

/** The basis at one instant tau = t - t0 into ec[i], es[i] (q = omega0^2 - alpha^2, w = sqrt|q|). */
function pointBasis(alpha: number, q: number, w: number, tau: number, ec: Float64Array, es: Float64Array, i: number): void {
  if (tau < 0) {
    ec[i] = 0;
    es[i] = 0;
    return;
  }
  const x = q * tau * tau;
  if (Math.abs(x) < SERIES_LIMIT) {
    const e = Math.exp(-alpha * tau);
    ec[i] = e * (1 - x / 2 + (x * x) / 24 - (x * x * x) / 720 + (x * x * x * x) / 40320);
    es[i] = e * tau * (1 - x / 6 + (x * x) / 120 - (x * x * x) / 5040 + (x * x * x * x) / 362880);
  } else if (q > 0) {
    const e = Math.exp(-alpha * tau);
    ec[i] = e * Math.cos(w * tau);
    es[i] = (e * Math.sin(w * tau)) / w;
  } else {
    const slow = Math.exp((w - alpha) * tau);
    const fast = Math.exp(-(alpha + w) * tau);
    ec[i] = (slow + fast) / 2;
    es[i] = (slow - fast) / (2 * w);
  }
}

/**
 * Gm = (G(s1) + G(s2)) / 2 and D = (G(s1) - G(s2)) / (s1 - s2) for G(s) = sinh(s h/2) / (s h/2), the
 * mean of e^(s tau) over a window of width h around tau, and s1, s2 the poles of the circuit; both are
 * real in every regime and smooth through critical damping. From G's power series and the power sums
 * of the poles (recurrences in s1 + s2 = -2 alpha and s1 s2 = omega0^2).
 */
function windowGain(alpha: number, omega0: number, h: number): [number, number] {
  const sum = -2 * alpha;
  const product = omega0 * omega0;
  let pPrev = 2; // s1^0 + s2^0
  let p = sum; // s1 + s2
  let uPrev = 0; // (s1^0 - s2^0) / (s1 - s2)
  let u = 1;
  let gm = 1;
  let d = 0;
  let coefficient = 1;
  const half2 = (h / 2) * (h / 2);
  for (let k = 1; k <= 40; k++) {
    // Advance the power sums by two orders: index 2k-1 -> 2k and 2k -> 2k+1.
    const p2 = sum * p - product * pPrev;
    const u2 = sum * u - product * uPrev;
    coefficient *= half2 / ((2 * k) * (2 * k + 1));
    const termG = (coefficient * p2) / 2;
    const termD = coefficient * u2;
    gm += termG;
    d += termD;
    pPrev = p2;
    p = sum * p2 - product * p;
    uPrev = u2;
    u = sum * u2 - product * u;
    if (Math.abs(termG) < 1e-16 * Math.abs(gm) && Math.abs(termD) < 1e-16 * Math.abs(d) + 1e-300) break;
  }
  return [gm, d];
}

/**
 * Turns point values of the basis into means over each block's samples (what a record averaged in
 * blocks holds). Averaging e^(s tau) over m samples dt apart gives e^(s tau) G_m(s) with
 * G_m(s) = sinh(s m dt/2) / (m sinh(s dt/2)) = G(s; m dt) / G(s; dt), whose pole-pair form (Gm, D) follows
 * from those of the two windows (q = omega0^2 - alpha^2 = -((s1 - s2)/2)^2):
 *   Gm = (Gm_h Gm_dt + D_h D_dt q) / n,  D = (D_h Gm_dt - Gm_h D_dt) / n,  n = Gm_dt^2 + D_dt^2 q,
 * and then mean(ec) = Gm ec - D q es, mean(es) = Gm es + D ec. A block the event falls in is averaged
 * sample by sample over its samples at or after t0. Returns one past the last value whose share is not 1.
 */
function averageOverBlocks(
  alpha: number,
  omega0: number,
  t0: number,
  time: ArrayLike<number>,
  ec: Float64Array,
  es: Float64Array,
  block: BlockAverage,
  after?: Float64Array,
): number {
  const { samples, spacing } = block;
  const q = omega0 * omega0 - alpha * alpha;
  const [gmBlock, dBlock] = windowGain(alpha, omega0, samples * spacing);
  const [gmSample, dSample] = windowGain(alpha, omega0, spacing);
  const norm = gmSample * gmSample + dSample * dSample * q;
  const gm = (gmBlock * gmSample + dBlock * dSample * q) / norm;
  const d = (dBlock * gmSample - gmBlock * dSample) / norm;
  const reach = ((samples - 1) / 2) * spacing;
  const dq = d * q;
  let eventEnd = 0;
  for (let i = 0; i < time.length; i++) {
    const first = time[i] - reach;
    if (first >= t0) {
      const c = ec[i];
      const s = es[i];
      ec[i] = gm * c - dq * s;
      es[i] = gm * s + d * c;
      if (after) after[i] = 1;
    } else if (time[i] + reach < t0) {
      if (after) {
        after[i] = 0;
        eventEnd = i + 1;
      }
    } else {
      // The event falls inside this block: the mean over its samples at or after t0, and their share.
      const scratch = eventBlockScratch(samples);
      let count = 0;
      for (let j = 0; j < samples; j++) {
        const t = first + j * spacing;
        if (t >= t0) scratch.times[count++] = t;
      }
      const c = scratch.c.subarray(0, count);
      const s = scratch.s.subarray(0, count);
      fillPointBasis(alpha, omega0, t0, scratch.times.subarray(0, count), c, s);
      let sumC = 0;
      let sumS = 0;
      for (let j = 0; j < count; j++) {
        sumC += c[j];
        sumS += s[j];
      }
      ec[i] = count ? sumC / count : 0;
      es[i] = count ? sumS / count : 0;
      if (after) {
        after[i] = count / samples;
        if (after[i] !== 1) eventEnd = i + 1;
      }
    }
  }
  return eventEnd;
}

/** Times and basis values of the samples of the block the event falls in, reused across solves (grown as needed). */
let eventBlock = { times: new Float64Array(0), c: new Float64Array(0), s: new Float64Array(0) };

function eventBlockScratch(samples: number): typeof eventBlock {
  if (eventBlock.times.length < samples) eventBlock = { times: new Float64Array(samples), c: new Float64Array(samples), s: new Float64Array(samples) };
  return eventBlock;
}

/** The model at one instant. */
export function responseAt(p: ResponseParams, t: number): number {
  if (t < p.t0) return p.yPre;
  const [ec, es] = dampedBasis(p.alpha, p.omega0, t - p.t0);
  return p.yFinal + p.a * ec + p.b * es;
}

/** The model over a time axis, written into `out` when given. */
export function evaluateResponse(p: ResponseParams, time: ArrayLike<number>, out?: Float64Array): Float64Array {
  const y = out ?? new Float64Array(time.length);
  const ec = new Float64Array(time.length);
  const es = new Float64Array(time.length);
  fillDampedBasis(p.alpha, p.omega0, p.t0, time, ec, es);
  for (let i = 0; i < time.length; i++) y[i] = time[i] < p.t0 ? p.yPre : p.yFinal + p.a * ec[i] + p.b * es[i];
  return y;
}

/** Damped (ring) angular frequency omega_d, or null when not underdamped. */
export function ringFrequency(alpha: number, omega0: number): number | null {
  const q = omega0 * omega0 - alpha * alpha;
  return q > 0 ? Math.sqrt(q) : null;
}

/** The response's slowest decay rate: alpha for a ring, the slow root alpha - sqrt(alpha^2 - omega0^2) past critical damping. */
export function slowestDecayRate(alpha: number, omega0: number): number {
  return omega0 > alpha ? alpha : alpha - Math.sqrt(alpha * alpha - omega0 * omega0);
}

/** a and b from the value and slope of the response just after the event. */
export function coefficientsFromInitial(
  yAtStart: number,
  slopeAtStart: number,
  yFinal: number,
  alpha: number,
): { a: number; b: number } {
  const a = yAtStart - yFinal;
  return { a, b: slopeAtStart + alpha * a };
}
