// The unit step response of a loop with known poles, by partial fractions, and its overshoot and settling time.
import type { Complex } from './cubicRoots';

/** The settling band, a fraction of the step: the same 2 % the transition metrics use. */
export const SETTLING_BAND = 0.02;
/** Grid points per shortest pole time constant 1 / |p| while scanning for the peak and the last band exit. */
const POINTS_PER_TIME_CONSTANT = 16;
/** Most grid points over the whole span: the grid never gets finer than span / this. */
const MAX_GRID_POINTS = 2_000_000;
/** A term below this share of all the terms no longer sets the grid step. */
const NEGLIGIBLE_TERM = 1e-9;
/** How low a sampled peak can read at POINTS_PER_TIME_CONSTANT, a share of the terms: (1/16)^2 / 2 = 0.002, doubled. */
const GRID_PEAK_ERROR = 4e-3;
/** Refinement steps of the peak (golden section) and of the band exit (bisection): far below the grid. */
const REFINE_STEPS = 60;
/** Relative split of a repeated pole: its residues stay finite, cancellation costs about eps / split = 1e-9. */
const REPEATED_POLE_SPLIT = 1e-7;

export interface StepMetrics {
  /** Largest excursion above the final value, a fraction of the step (0.24 = 24 %); 0 when it never exceeds it. */
  overshoot: number;
  /** Time of that peak after the step, s; null without overshoot. */
  peakTime: number | null;
  /** Time after the step from which the response stays within SETTLING_BAND of its final value, s; null when a pole does not decay. */
  settlingTime: number | null;
}

export interface LoopStepResponse {
  /** Response at time t >= 0 after a unit step, final value 1. */
  at(t: number): number;
  metrics: StepMetrics;
}

/**
 * y(t) = 1 + sum_k N(p_k) / (p_k D'(p_k)) e^(p_k t), the inverse Laplace transform of N(s) / (s D(s))
 * for distinct poles p_k (residue theorem; N(0) = D(0) so the final value is 1). `numerator` holds N's
 * coefficients from the constant term up, D = lead * prod (s - p_k). A repeated pole (the boundary between
 * real and complex roots) is split by REPEATED_POLE_SPLIT, which moves the response by about as much.
 */
export function loopStepResponse(numerator: readonly number[], givenPoles: readonly Complex[], lead: number): LoopStepResponse {
  const poles = splitRepeated(givenPoles);
  const residues = poles.map((p, k) => {
    let denominator: Complex = { re: lead * p.re, im: lead * p.im };
    poles.forEach((q, j) => {
      if (j !== k) denominator = mul(denominator, { re: p.re - q.re, im: p.im - q.im });
    });
    return div(polynomialAt(numerator, p), denominator);
  });
  const at = (t: number) => {
    let y = 1;
    poles.forEach((p, k) => {
      const decay = Math.exp(p.re * t);
      y += decay * (residues[k].re * Math.cos(p.im * t) - residues[k].im * Math.sin(p.im * t));
    });
    return y;
  };
  return { at, metrics: stepMetrics(at, poles, residues) };
}

function splitRepeated(poles: readonly Complex[]): Complex[] {
  return poles.map((p, k) => {
    const twin = poles.find((q, j) => j < k && Math.hypot(p.re - q.re, p.im - q.im) < REPEATED_POLE_SPLIT * Math.hypot(q.re, q.im));
    return twin ? { re: twin.re * (1 + 2 * REPEATED_POLE_SPLIT * k), im: twin.im } : p;
  });
}

function stepMetrics(at: (t: number) => number, poles: readonly Complex[], residues: readonly Complex[]): StepMetrics {
  if (poles.some((p) => !(p.re < 0))) {
    // Only a lossless LC pair has a pole that does not decay here: y = 1 - cos, peak 2, never settled (derived).
    return { overshoot: 1, peakTime: Math.PI / Math.max(...poles.map((p) => Math.abs(p.im))), settlingTime: null };
  }
  const sizes = residues.map((r) => Math.hypot(r.re, r.im));
  const total = sizes.reduce((a, b) => a + b, 0);
  /** Bound on |y(t) - 1|: the sum of the terms' envelopes, falling for ever. */
  const envelope = (t: number) => poles.reduce((sum, p, k) => sum + sizes[k] * Math.exp(p.re * t), 0);
  /** Grid step at t: resolves the fastest pole whose term still matters, so a fast pole that died out costs nothing. */
  const stepAt = (t: number) => {
    const fastest = poles.reduce((f, p, k) => (sizes[k] * Math.exp(p.re * t) > NEGLIGIBLE_TERM * total ? Math.max(f, Math.hypot(p.re, p.im)) : f), 0);
    return fastest > 0 ? 1 / (fastest * POINTS_PER_TIME_CONSTANT) : Infinity;
  };
  // Past `end` every term is below band / n, so the response cannot leave the band again.
  const end = Math.max(...poles.map((p, k) => Math.log((poles.length * sizes[k]) / SETTLING_BAND) / -p.re), 0);
  const slowest = Math.min(...poles.map((p) => Math.hypot(p.re, p.im)));
  const stepFloor = Math.min(end / MAX_GRID_POINTS, 1 / (slowest * POINTS_PER_TIME_CONSTANT));
  const nextStep = (t: number) => Math.max(stepFloor, Math.min(stepAt(t), 1 / (slowest * POINTS_PER_TIME_CONSTANT)));

  // The peak: every local maximum on the grid that may hold it is refined (a sampled peak reads low by up
  // to GRID_PEAK_ERROR of the terms), until the envelope shows nothing later can rise above the best.
  let best = { value: at(0), time: 0 };
  let [before, here, t] = [-Infinity, best.value, 0];
  while (t < end && 1 + envelope(t) > Math.max(best.value, 1)) {
    const h = nextStep(t);
    const after = at(t + h);
    if (here >= before && here > after && here > best.value - GRID_PEAK_ERROR * total) {
      const time = goldenMaximum(at, Math.max(0, t - h), t + h);
      if (at(time) > best.value) best = { value: at(time), time };
    }
    [before, here, t] = [here, after, t + h];
  }
  const overshoot = Math.max(0, best.value - 1);

  // The last exit from the band: scan back from `end` to the first instant outside it.
  let outside = end;
  let inside = end;
  while (outside > 0 && Math.abs(at(outside) - 1) <= SETTLING_BAND) {
    inside = outside;
    outside = Math.max(0, outside - nextStep(outside));
  }
  return { overshoot, peakTime: overshoot > 0 ? best.time : null, settlingTime: bandExit(at, outside, inside) };
}

function goldenMaximum(f: (t: number) => number, lo: number, hi: number): number {
  const ratio = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < REFINE_STEPS; i++) {
    const a = hi - ratio * (hi - lo);
    const b = lo + ratio * (hi - lo);
    if (f(a) < f(b)) lo = a;
    else hi = b;
  }
  return (lo + hi) / 2;
}

/** The instant in [outside, inside] where |y - 1| falls to the band for the last time. */
function bandExit(at: (t: number) => number, outside: number, inside: number): number {
  for (let i = 0; i < REFINE_STEPS; i++) {
    const mid = (outside + inside) / 2;
    if (Math.abs(at(mid) - 1) > SETTLING_BAND) outside = mid;
    else inside = mid;
  }
  return (outside + inside) / 2;
}

function polynomialAt(coefficients: readonly number[], z: Complex): Complex {
  let value: Complex = { re: 0, im: 0 };
  for (let i = coefficients.length - 1; i >= 0; i--) value = { re: mul(value, z).re + coefficients[i], im: mul(value, z).im };
  return value;
}

function mul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

function div(a: Complex, b: Complex): Complex {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}
