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

/**
 * e^(-alpha tau) C(tau) and e^(-alpha tau) S(tau) over a whole time axis (tau = t - t0; zero before t0),
 * without allocating per sample: the hot loop of every fit. A heavily overdamped response neither
 * overflows nor cancels: cosh and sinh are split into the two poles. With blockWidth > 0, the means
 * over blocks of that width centred on each sample.
 */
export function fillDampedBasis(
  alpha: number,
  omega0: number,
  t0: number,
  time: ArrayLike<number>,
  ec: Float64Array,
  es: Float64Array,
  blockWidth = 0,
): void {
  const q = omega0 * omega0 - alpha * alpha;
  const w = Math.sqrt(Math.abs(q));
  for (let i = 0; i < time.length; i++) {
    const tau = time[i] - t0;
    if (tau < 0) {
      ec[i] = 0;
      es[i] = 0;
      continue;
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
  if (blockWidth > 0) averageOverBlocks(alpha, omega0, t0, time, ec, es, blockWidth);
}

/**
 * Turns point values of the basis into means over a block of width h centred on each sample (what a
 * record averaged in blocks holds). Averaging e^(s tau) gives e^(s tau) G(s), G(s) = sinh(s h/2)/(s h/2);
 * with the poles s1, s2 of the circuit, Gm = (G(s1) + G(s2)) / 2 and D = (G(s1) - G(s2)) / (s1 - s2)
 * are real in every regime and smooth through critical damping, and
 *   mean(ec) = Gm ec - D q es,   mean(es) = Gm es + D ec   (q = omega0^2 - alpha^2).
 * Gm and D come from G's power series and the power sums of the poles (recurrences in s1 + s2 = -2 alpha
 * and s1 s2 = omega0^2). Samples whose block reaches back past t0 keep their point values.
 */
function averageOverBlocks(
  alpha: number,
  omega0: number,
  t0: number,
  time: ArrayLike<number>,
  ec: Float64Array,
  es: Float64Array,
  h: number,
): void {
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
  const q = product - alpha * alpha;
  for (let i = 0; i < time.length; i++) {
    if (time[i] - t0 < h / 2) continue;
    const c = ec[i];
    const s = es[i];
    ec[i] = gm * c - d * q * s;
    es[i] = gm * s + d * c;
  }
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
