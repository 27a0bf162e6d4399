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

/**
 * e^(-alpha tau) C(tau) and e^(-alpha tau) S(tau) for one tau >= 0, written so that a heavily
 * overdamped response neither overflows nor cancels (the cosh and sinh are split into the two poles).
 */
export function dampedBasis(alpha: number, omega0: number, tau: number): [number, number] {
  const q = omega0 * omega0 - alpha * alpha;
  const x = q * tau * tau;
  if (Math.abs(x) < SERIES_LIMIT) {
    // Series to order x^4: error below (1e-2)^5 / 10! relative.
    const c = 1 - x / 2 + (x * x) / 24 - (x * x * x) / 720 + (x * x * x * x) / 40320;
    const s = tau * (1 - x / 6 + (x * x) / 120 - (x * x * x) / 5040 + (x * x * x * x) / 362880);
    const e = Math.exp(-alpha * tau);
    return [e * c, e * s];
  }
  if (q > 0) {
    const w = Math.sqrt(q);
    const e = Math.exp(-alpha * tau);
    return [e * Math.cos(w * tau), (e * Math.sin(w * tau)) / w];
  }
  const beta = Math.sqrt(-q);
  const slow = Math.exp((beta - alpha) * tau);
  const fast = Math.exp(-(alpha + beta) * tau);
  return [(slow + fast) / 2, (slow - fast) / (2 * beta)];
}

/**
 * e^(-alpha tau) C(tau) and e^(-alpha tau) S(tau) over a whole time axis (tau = t - t0; zero before t0),
 * without allocating per sample: the hot loop of every fit.
 */
export function fillDampedBasis(
  alpha: number,
  omega0: number,
  t0: number,
  time: ArrayLike<number>,
  ec: Float64Array,
  es: Float64Array,
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
