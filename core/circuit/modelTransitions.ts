// Transition metrics of the fitted second-order model's step, with standard errors from alpha and omega0.
import { quantity, type Quantity } from '../quantity';
import { dampedBasis, type ResponseParams } from '../response/secondOrder';

/** The part of a response fit the model metrics need (a ResponseFit has all of it). */
export interface ModelFitInput {
  status: string;
  params: ResponseParams;
  alpha: Quantity;
  omega0: Quantity;
  preLevel: Quantity;
  finalValue: Quantity;
  correlation: { names: string[]; matrix: number[][] } | null;
  /** The fit's start was free (a jump at the event, or a finite edge: fitResponse): its model does not trace the rise. */
  jumpStart?: boolean;
}

export interface ModelTransitions {
  /** 10 % to 90 % of the step, s (the 10 % instant is the last before the 50 % one, as measured). */
  riseTime: Quantity | null;
  /** Largest excursion past the final level after it is first reached, % of |step|; 0 without one. */
  overshoot: Quantity;
  /** From t0 to the overshoot peak, s; null without overshoot. */
  peakTime: Quantity | null;
  /** From t0 until the model stays within 2 % / 5 % of |step| of the final level, s. */
  settlingTime2: Quantity;
  settlingTime5: Quantity;
  warnings: string[];
}

export type ModelTransitionsResult = { metrics: ModelTransitions; reason: null } | { metrics: null; reason: string };

/** A step under this many standard errors of (final - pre level) cannot be told from none. */
const STEP_SIGMAS = 3;
/** A step under this share of the natural part's largest excursion is a ringdown about one level. */
const STEP_SHARE = 0.01;
/** The search ends where the natural part is below this share of the step: far inside every band. */
const HORIZON_SHARE = 1e-3;
/** Relative step of the central differences in alpha and omega0 (metrics are smooth on this scale). */
const DIFF_STEP = 1e-6;
/** Bisection halvings: far below any timing that matters. */
const BISECTIONS = 100;
/**
 * Most turning points followed before the ring settles: a model that needs more (Q in the thousands,
 * often a fit of noise) gets no metrics, and the list never grows without bound on hostile input.
 */
const MAX_TURNING_POINTS = 20_000;

/** The model's step: natural part x(tau) = a C + b S about the final level, step A = final - pre. */
interface Shape {
  alpha: number;
  omega0: number;
  a: number;
  /** y'(t0+), held when alpha or omega0 is varied. */
  slope: number;
  step: number;
}

/** The settling times of a shape, s from t0: all a shape moved by a standard error is read for. */
interface Settling {
  settling2: number;
  settling5: number;
}

interface Metrics extends Settling {
  riseTime: number | null;
  overshoot: number;
  peakTime: number | null;
}

/**
 * Metrics of the fitted model's step. Each standard error propagates the alpha/omega0 covariance by
 * central differences, holding the model's value and slope just after t0 (the initial conditions).
 * A ringdown (final level equal to the starting one) has no transition: the result gives the reason.
 */
export function modelTransitions(fit: ModelFitInput): ModelTransitionsResult {
  const p = fit.params;
  if (fit.status === 'failed') return { metrics: null, reason: 'the fit failed, so there is no model to measure' };
  if (![p.alpha, p.omega0, p.a, p.b, p.yPre, p.yFinal].every(Number.isFinite) || !(p.alpha > 0) || !(p.omega0 > 0)) {
    return { metrics: null, reason: 'the fitted model is not a decaying response' };
  }
  const shape: Shape = { alpha: p.alpha, omega0: p.omega0, a: p.a, slope: p.b - p.alpha * p.a, step: p.yFinal - p.yPre };
  if (turningPointCount(shape) > MAX_TURNING_POINTS) {
    return { metrics: null, reason: `the model rings for more than ${MAX_TURNING_POINTS} half periods before it settles, so its step metrics are not computed` };
  }
  const noStep = stepAbsence(fit, shape);
  if (noStep) return { metrics: null, reason: noStep };

  const base = shapeMetrics(shape);
  const sa = fit.alpha.stderr;
  const sw = fit.omega0.stderr;
  const rho = correlationOf(fit.correlation, 'alpha', 'omega0');
  const warnings: string[] = [];
  // Each metric reads the same four moved shapes: their metrics are found once.
  const nudged = sa === null || sw === null ? null : moved(shape, DIFF_STEP * shape.alpha, DIFF_STEP * shape.omega0, shapeMetrics);
  // The shapes a standard error away are read for their settling times only: their crossings are not searched.
  const spread = sa === null || sw === null ? null : moved(shape, sa, sw, shapeSettling);
  const errors = (pick: (m: Metrics) => number | null): number | null => {
    if (sa === null || sw === null || nudged === null) return null;
    const ga = difference(pick, nudged.alphaUp, nudged.alphaDown, DIFF_STEP * shape.alpha);
    const gw = difference(pick, nudged.omega0Up, nudged.omega0Down, DIFF_STEP * shape.omega0);
    if (ga === null || gw === null) return null;
    return Math.sqrt(Math.max(0, ga * ga * sa * sa + gw * gw * sw * sw + 2 * rho * ga * gw * sa * sw));
  };
  /**
   * Settling jumps by about half a ring period where a peak crosses the band edge: a jump within one
   * standard error of alpha or omega0 makes the linear standard error an understatement, so the
   * standard error is widened to the largest move seen within one standard error (never a tight wrong number).
   */
  const settlingError = (pick: (m: Settling) => number, band: string, se: number | null): number | null => {
    if (spread === null || se === null) return se;
    const largest = Math.max(...[spread.alphaUp, spread.alphaDown, spread.omega0Up, spread.omega0Down].map((m) => Math.abs(pick(m) - pick(base))));
    if (!(largest > 3 * se + 1e-12 * pick(base))) return se;
    warnings.push(
      `the model's ${band} settling time sits near a jump (a peak grazing the band edge): within one standard error of alpha or omega0 it moves by ${largest.toPrecision(2)} s, so its standard error is widened to that.`,
    );
    return largest;
  };
  const se2 = settlingError((m) => m.settling2, '2 %', errors((m) => m.settling2));
  const se5 = settlingError((m) => m.settling5, '5 %', errors((m) => m.settling5));
  if (sa === null || sw === null) warnings.push('alpha or omega0 has no standard error: the model metrics carry none either.');
  // A free start sets the model's value and slope after t0 to fit the ring, not the first samples: a finite edge's
  // rise is not the model's (a 20 ns edge rose in 36.3 ns where the model's read 35.67 ns +- 8 ps).
  const freeStart = fit.jumpStart === true && base.riseTime !== null;
  if (freeStart) warnings.push("the start was fitted freely (a jump at the event or a finite edge), so the model's rise time is not the record's: the measured one stands.");
  return {
    reason: null,
    metrics: {
      riseTime: base.riseTime === null || freeStart ? null : quantity(base.riseTime, errors((m) => m.riseTime), 's'),
      overshoot: quantity(base.overshoot, errors((m) => m.overshoot), '%'),
      peakTime: base.peakTime === null ? null : quantity(base.peakTime, errors((m) => m.peakTime), 's'),
      settlingTime2: quantity(base.settling2, se2, 's'),
      settlingTime5: quantity(base.settling5, se5, 's'),
      warnings,
    },
  };
}

/** Why the fit holds no step to measure, or null when it does. */
function stepAbsence(fit: ModelFitInput, shape: Shape): string | null {
  const sp = fit.preLevel.stderr;
  const sf = fit.finalValue.stderr;
  const A = Math.abs(shape.step);
  if (sp !== null && sf !== null) {
    const rho = correlationOf(fit.correlation, 'yPre', 'yFinal');
    const sigma = Math.sqrt(Math.max(0, sp * sp + sf * sf - 2 * rho * sp * sf));
    if (A <= STEP_SIGMAS * sigma) {
      return `the final level equals the starting level within ${STEP_SIGMAS} standard errors: a ringdown about one level, with no step to measure`;
    }
  }
  const largest = Math.max(...criticalPoints(shape).map((t) => Math.abs(natural(shape, t))));
  if (!(A > STEP_SHARE * largest)) {
    return `the step is under ${100 * STEP_SHARE} % of the ringing about the final level: a ringdown, with no step to measure`;
  }
  return null;
}

function correlationOf(c: ModelFitInput['correlation'], first: string, second: string): number {
  if (!c) return 0;
  const i = c.names.indexOf(first);
  const j = c.names.indexOf(second);
  const r = i >= 0 && j >= 0 ? c.matrix[i][j] : 0;
  return Number.isFinite(r) ? Math.max(-1, Math.min(1, r)) : 0;
}

/** What `measure` finds of the shape with alpha, then omega0, moved up and down. */
interface Moved<T> {
  alphaUp: T;
  alphaDown: T;
  omega0Up: T;
  omega0Down: T;
}

function moved<T>(s: Shape, byAlpha: number, byOmega0: number, measure: (s: Shape) => T): Moved<T> {
  return {
    alphaUp: measure({ ...s, alpha: s.alpha + byAlpha }),
    alphaDown: measure({ ...s, alpha: s.alpha - byAlpha }),
    omega0Up: measure({ ...s, omega0: s.omega0 + byOmega0 }),
    omega0Down: measure({ ...s, omega0: s.omega0 - byOmega0 }),
  };
}

/** Central difference of a metric; null when it is undefined on either side. */
function difference(pick: (m: Metrics) => number | null, up: Metrics, down: Metrics, h: number): number | null {
  const u = pick(up);
  const d = pick(down);
  return u === null || d === null ? null : (u - d) / (2 * h);
}

/** The natural part x(tau) = y - final at tau >= 0 after t0. */
function natural(s: Shape, tau: number): number {
  const [ec, es] = dampedBasis(s.alpha, s.omega0, tau);
  return s.a * ec + (s.slope + s.alpha * s.a) * es;
}

/** Normalised step d(tau): 0 at the starting level, 1 at the final level. */
function level(s: Shape, tau: number): number {
  return 1 + natural(s, tau) / s.step;
}

/**
 * 0, every zero of x'(tau) (x is monotone between them) up to the horizon, and the horizon. x' obeys
 * the same equation as x, with x'(0) = slope and x''(0) = -2 alpha slope - omega0^2 a, so it is
 * a1 C + b1 S with a1 = slope, b1 = x''(0) + alpha a1; its zeros follow in closed form per regime.
 */
/** Turning points of a ring before its natural part falls below the horizon floor (0 without a ring). */
function turningPointCount(s: Shape): number {
  const q = s.omega0 * s.omega0 - s.alpha * s.alpha;
  if (!(q > 0)) return 0;
  const w = Math.sqrt(q);
  const b = s.slope + s.alpha * s.a;
  const horizon = Math.max(0, Math.log(Math.hypot(s.a, b / w) / (HORIZON_SHARE * Math.abs(s.step)))) / s.alpha;
  return (horizon * w) / Math.PI;
}

function criticalPoints(s: Shape): number[] {
  const a1 = s.slope;
  const b1 = -s.alpha * s.slope - s.omega0 * s.omega0 * s.a;
  const q = s.omega0 * s.omega0 - s.alpha * s.alpha;
  const w = Math.sqrt(Math.abs(q));
  const floor = HORIZON_SHARE * Math.abs(s.step);
  const points = [0];
  if (q > 0) {
    // x = e^(-alpha tau) (a cos + (b / w) sin) is bounded by e^(-alpha tau) sqrt(a^2 + (b / w)^2).
    const b = s.slope + s.alpha * s.a;
    const horizon = Math.max(0, Math.log(Math.hypot(s.a, b / w) / floor)) / s.alpha;
    // a1 cos(w tau) + (b1 / w) sin(w tau) = R cos(w tau - phi): zeros at w tau = phi + pi/2 + k pi.
    const phi = Math.atan2(b1 / w, a1);
    let theta = (((phi + Math.PI / 2) % Math.PI) + Math.PI) % Math.PI;
    if (theta === 0) theta = Math.PI;
    // The cap only bites for a perturbed shape near the limit checked in modelTransitions.
    for (; theta / w < horizon && points.length < MAX_TURNING_POINTS; theta += Math.PI) points.push(theta / w);
    points.push(Math.max(horizon, points[points.length - 1]));
    return points;
  }
  const r = q < 0 ? (-a1 * w) / b1 : NaN;
  const turn = q < 0 ? (r > 0 && r < 1 ? Math.atanh(r) / w : NaN) : -a1 / b1;
  if (turn > 0 && Number.isFinite(turn)) points.push(turn);
  // Monotone decay after the last turn: go out until the natural part is below the floor.
  const slowest = s.alpha - w;
  let horizon = points[points.length - 1] + 1 / Math.max(slowest, 1e-300);
  while (Math.abs(natural(s, horizon)) > floor) horizon *= 2;
  points.push(horizon);
  return points;
}

/** The instant in [lo, hi] where the monotone f crosses zero. */
function bisect(f: (t: number) => number, lo: number, hi: number): number {
  let flo = f(lo);
  for (let i = 0; i < BISECTIONS && hi - lo > 1e-15 * hi; i++) {
    const mid = (lo + hi) / 2;
    const fm = f(mid);
    if (fm === 0) return mid;
    if (fm > 0 === flo > 0) {
      lo = mid;
      flo = fm;
    } else hi = mid;
  }
  return (lo + hi) / 2;
}

/** The settling times of a shape alone. */
function shapeSettling(s: Shape): Settling {
  const points = criticalPoints(s);
  return settlingAt(s, points, points.map((t) => natural(s, t)));
}

/** Both settling times from the critical points and the natural part at each (`atPoints`), found by the caller once. */
function settlingAt(s: Shape, points: number[], atPoints: number[]): Settling {
  return { settling2: settling(s, points, atPoints, 0.02), settling5: settling(s, points, atPoints, 0.05) };
}

function shapeMetrics(s: Shape): Metrics {
  const points = criticalPoints(s);
  // The natural part at each critical point, found once for the levels and both settling bands.
  const x = points.map((t) => natural(s, t));
  const d = x.map((v) => 1 + v / s.step);
  /**
   * Rising crossings of a level in time order (one per monotone segment at most, each inside its segment), found
   * one at a time: the caller stops at the one it needs, and a ring crosses 0.9 and 1 again every period.
   */
  function* rising(target: number): Generator<number> {
    for (let i = 0; i + 1 < points.length; i++) {
      if (d[i] < target && d[i + 1] >= target) yield bisect((t) => level(s, t) - target, points[i], points[i + 1]);
    }
  }
  const t50 = firstOf(rising(0.5), () => true);
  const t10 = t50 === null ? null : lastBefore(rising(0.1), t50);
  const t90 = t50 === null ? null : firstOf(rising(0.9), (t) => t >= t50);
  const t100 = firstOf(rising(1), () => true);
  let overshoot = 0;
  let peakTime: number | null = null;
  if (t100 !== null) {
    points.forEach((t, i) => {
      if (t > t100 && d[i] - 1 > overshoot / 100) {
        overshoot = 100 * (d[i] - 1);
        peakTime = t;
      }
    });
  }
  return {
    riseTime: t10 !== null && t90 !== null ? t90 - t10 : null,
    overshoot,
    peakTime,
    ...settlingAt(s, points, x),
  };
}

function firstOf(times: Iterable<number>, wanted: (t: number) => boolean): number | null {
  for (const t of times) if (wanted(t)) return t;
  return null;
}

/** The last of ascending times at or before `limit`. */
function lastBefore(times: Iterable<number>, limit: number): number | null {
  let last: number | null = null;
  for (const t of times) {
    if (t > limit) break;
    last = t;
  }
  return last;
}

/** The last instant where |x| equals band |step|: x (`atPoints` at the critical points) is monotone between them. */
function settling(s: Shape, points: number[], atPoints: number[], band: number): number {
  const edge = band * Math.abs(s.step);
  for (let i = points.length - 2; i >= 0; i--) {
    if (Math.abs(atPoints[i]) > edge) return bisect((t) => Math.abs(natural(s, t)) - edge, points[i], points[i + 1]);
  }
  return 0;
}
