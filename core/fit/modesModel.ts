// The response with several ringing modes (and a slow first-order term): its basis, constraints at t0 and linear solve.
//
// y(t) = yPre before t0; after it, tau = t - t0,
//   y(t) = yFinal + sum_k e^(-alpha_k tau) (a_k C_k(tau) + b_k S_k(tau)) + c e^(-rate tau)
// with C_k, S_k those of core/response/secondOrder.ts for (alpha_k, omega0_k). The constraints at t0 are the
// one-mode layout's: continuous (y(t0+) = yPre, so a_1 = yPre - yFinal - sum_{k>1} a_k - c), smooth (also
// dy/dt(t0+) = 0, so b_1 = alpha_1 a_1 + sum_{k>1} (alpha_k a_k - b_k) + rate c), a free jump, or no samples
// before t0 at all. Each constraint removes one linear parameter by substitution: the basis seen by the
// solver is B T, with B the unconstrained basis and T the substitution.

import { fillDampedBasis, RunSteps } from '../response/secondOrder';
import type { FitSet } from './fitSet';
import { LAYOUTS, type ParameterLayout } from './responseModel';
import { gathered } from './indexVectors';
import { dotInOrder } from './vectorKernels';

/** How the response may start at t0, after the one-mode layout it extends. */
export type StartConstraint = 'smooth' | 'continuous' | 'jump' | 'no-pre-event';

/** Which model: how many rings, whether a slow term rides under them, and the start at t0. */
export interface ModeSpec {
  rings: number;
  slow: boolean;
  start: StartConstraint;
  /** Whether t0 is fitted (it is where the one-mode layout fits it). */
  fitsT0: boolean;
}

/** How a model starts at t0 and whether t0 is fitted: what every model extending one layout shares. */
export type ModeStart = Pick<ModeSpec, 'start' | 'fitsT0'>;

/** A model for a record with no samples before a t0 that is held (a residual's own fit). */
export const NO_PRE_EVENT: ModeStart = { start: 'no-pre-event', fitsT0: false };

/**
 * A model spec, always built here with its fields in one order: the solver's hot code then sees a single object
 * shape (specs spread from a shared base took several, and V8 discarded and recompiled solveModes hundreds of
 * times over a batch).
 */
export function modeSpec(base: ModeStart, rings: number, slow: boolean): ModeSpec {
  return { rings, slow, start: base.start, fitsT0: base.fitsT0 };
}

/** The nonlinear parameters of a model: each ring's rates, the slow term's rate, and t0. */
export interface ModeRates {
  rings: { alpha: number; omega0: number }[];
  /** 1 / tau of the slow term, s^-1 (ignored without one). */
  slowRate: number;
  t0: number;
}

/** The unconstrained linear parameters: the levels, each ring's a and b, and the slow term's amplitude. */
export interface ModeLinear {
  yPre: number;
  yFinal: number;
  a: number[];
  b: number[];
  slow: number;
}

/** The start constraint of the one-mode layout a model extends. */
export function startConstraintOf(layout: ParameterLayout): StartConstraint {
  if (layout === 'smooth') return 'smooth';
  if (layout === 'step' || layout === 'first-order') return 'continuous';
  return LAYOUTS[layout].preLevelColumn === null ? 'no-pre-event' : 'jump';
}

/** Linear parameters the solver sees (after the substitutions). */
export function linearCount(spec: ModeSpec): number {
  const unconstrained = (spec.start === 'no-pre-event' ? 1 : 2) + 2 * spec.rings + (spec.slow ? 1 : 0);
  return unconstrained - (spec.start === 'smooth' ? 2 : spec.start === 'continuous' ? 1 : 0);
}

/** Every fitted parameter: the rates (2 per ring, the slow rate), t0 where fitted, and the linear ones. */
export function parameterCount(spec: ModeSpec): number {
  return 2 * spec.rings + (spec.slow ? 1 : 0) + (spec.fitsT0 ? 1 : 0) + linearCount(spec);
}

/** Positions in the unconstrained vector [yPre?, yFinal, a_1..a_K, b_1..b_K, c?]. */
function positions(spec: ModeSpec) {
  const pre = spec.start === 'no-pre-event' ? -1 : 0;
  const final = pre + 1;
  const a = (k: number) => final + 1 + k;
  const b = (k: number) => final + 1 + spec.rings + k;
  const slow = spec.slow ? final + 1 + 2 * spec.rings : -1;
  return { pre, final, a, b, slow, size: final + 1 + 2 * spec.rings + (spec.slow ? 1 : 0) };
}

/**
 * T, m x r: the unconstrained vector is T times the solver's. The solver's parameters are the unconstrained
 * ones without a_1 (continuous, smooth) and b_1 (smooth), in the same order.
 */
function substitution(spec: ModeSpec, rates: ModeRates): number[][] {
  const at = positions(spec);
  const removed = new Set<number>(spec.start === 'smooth' ? [at.a(0), at.b(0)] : spec.start === 'continuous' ? [at.a(0)] : []);
  const kept = Array.from({ length: at.size }, (_, i) => i).filter((i) => !removed.has(i));
  const T = Array.from({ length: at.size }, () => new Array<number>(kept.length).fill(0));
  kept.forEach((i, j) => (T[i][j] = 1));
  if (!removed.has(at.a(0))) return T;
  // a_1 = yPre - yFinal - sum_{k>1} a_k - c
  const col = (i: number) => kept.indexOf(i);
  const a1 = new Array<number>(kept.length).fill(0);
  a1[col(at.pre)] = 1;
  a1[col(at.final)] = -1;
  for (let k = 1; k < spec.rings; k++) a1[col(at.a(k))] = -1;
  if (spec.slow) a1[col(at.slow)] = -1;
  T[at.a(0)] = a1;
  if (!removed.has(at.b(0))) return T;
  // b_1 = alpha_1 a_1 + sum_{k>1} (alpha_k a_k - b_k) + rate c
  const b1 = a1.map((v) => rates.rings[0].alpha * v);
  for (let k = 1; k < spec.rings; k++) {
    b1[col(at.a(k))] += rates.rings[k].alpha;
    b1[col(at.b(k))] -= 1;
  }
  if (spec.slow) b1[col(at.slow)] += rates.slowRate;
  T[at.b(0)] = b1;
  return T;
}

/** The unconstrained linear parameters as named values. */
function namedLinear(spec: ModeSpec, theta: readonly number[]): ModeLinear {
  const at = positions(spec);
  const a = Array.from({ length: spec.rings }, (_, k) => theta[at.a(k)]);
  const b = Array.from({ length: spec.rings }, (_, k) => theta[at.b(k)]);
  const yFinal = theta[at.final];
  const slow = spec.slow ? theta[at.slow] : 0;
  // Without samples before t0 the level reported before the event is y(t0+).
  // A loop, not a.reduce: reduce inlined in solveModes deopted on every ring count's array kind (333 times a batch).
  let ringSum = 0;
  for (let k = 0; k < a.length; k++) ringSum += a[k];
  const yPre = at.pre >= 0 ? theta[at.pre] : yFinal + ringSum + slow;
  return { yPre, yFinal, a, b, slow };
}

/** Most rings a model holds (modeOrder.ts fits up to three). */
const MAX_RINGS = 3;
/** Most unconstrained linear parameters: two levels, a and b of each ring, the slow term. */
const MAX_COLUMNS = 3 + 2 * MAX_RINGS;

/** Scratch space for one time axis: the basis columns and the constrained ones, reused across solves. */
export class ModesWorkspace {
  readonly ec: Float64Array;
  readonly es: Float64Array;
  readonly after: Float64Array;
  /** Which values a fit without a level before t0 uses (see wholeAfter). */
  readonly use: Uint8Array;
  readonly basis: Float64Array[];
  readonly constrained: Float64Array[];
  /**
   * The damped basis of each term slot (ring k, then the slow term) for the rates it was last filled for: the
   * solver's difference steps move one rate at a time, so the other terms' bases are copied, not recomputed.
   */
  private readonly terms: { key: [number, number, number]; ec: Float64Array; es: Float64Array; after: Float64Array }[] = [];
  /** The even runs of the set's time axis, found once per axis. */
  private readonly runSteps = new RunSteps();
  constructor(readonly length: number) {
    this.ec = new Float64Array(length);
    this.es = new Float64Array(length);
    this.after = new Float64Array(length);
    this.use = new Uint8Array(length);
    this.basis = Array.from({ length: MAX_COLUMNS }, () => new Float64Array(length));
    this.constrained = Array.from({ length: MAX_COLUMNS }, () => new Float64Array(length));
  }

  /** e^(-alpha tau) C and e^(-alpha tau) S of term slot `slot` into ec and es (and the shares after t0 into this.after). */
  fillTerm(slot: number, set: FitSet, alpha: number, omega0: number, t0: number, ec: Float64Array, es: Float64Array): void {
    while (this.terms.length <= slot) {
      this.terms.push({ key: [NaN, NaN, NaN], ec: new Float64Array(this.length), es: new Float64Array(this.length), after: new Float64Array(this.length) });
    }
    const term = this.terms[slot];
    if (term.key[0] !== alpha || term.key[1] !== omega0 || term.key[2] !== t0) {
      fillDampedBasis(alpha, omega0, t0, set.time, term.ec, term.es, set.block, term.after, this.runSteps.of(set.time));
      term.key = [alpha, omega0, t0];
    }
    ec.set(term.ec);
    es.set(term.es);
    this.after.set(term.after);
  }
}

export interface ModesSolution {
  linear: ModeLinear;
  /** Residual sum of squares over the values fitted. */
  sse: number;
  /** Model values over the set (zero where a value is not fitted). */
  model: Float64Array;
}

/**
 * The unconstrained basis columns over the set for given rates (in the workspace): the level before t0,
 * yFinal, each ring's e^(-alpha tau) C and e^(-alpha tau) S, the slow term; each weighted by the share of the
 * value's samples at or after t0 (block averages as the set's values are), the level before by the share before.
 */
function unconstrainedBasis(set: FitSet, spec: ModeSpec, rates: ModeRates, ws: ModesWorkspace): Float64Array[] {
  const n = set.time.length;
  const at = positions(spec);
  const columns = ws.basis.slice(0, at.size);
  const { after } = ws;
  rates.rings.forEach((ring, k) => ws.fillTerm(k, set, ring.alpha, ring.omega0, rates.t0, columns[at.a(k)], columns[at.b(k)]));
  if (spec.slow) ws.fillTerm(MAX_RINGS, set, rates.slowRate, rates.slowRate, rates.t0, columns[at.slow], ws.es);
  for (let i = 0; i < n; i++) {
    const w = after[i];
    if (w !== 1) for (let j = at.final + 1; j < at.size; j++) columns[j][i] *= w;
    columns[at.final][i] = w;
    if (at.pre >= 0) columns[at.pre][i] = 1 - w;
  }
  return columns;
}

/** Whether value i enters the fit: without samples before t0, only values wholly after it. */
function fitted(spec: ModeSpec, after: Float64Array, i: number): boolean {
  return spec.start !== 'no-pre-event' || after[i] >= 1;
}

/** The constrained basis B T (in the workspace; B itself where nothing is substituted). */
function constrainedBasis(B: Float64Array[], T: number[][], ws: ModesWorkspace): Float64Array[] {
  const r = T[0].length;
  if (r === B.length) return B;
  const n = B[0].length;
  return Array.from({ length: r }, (_, j) => {
    const column = ws.constrained[j];
    column.fill(0);
    for (let m = 0; m < B.length; m++) {
      const t = T[m][j];
      if (t === 0) continue;
      const source = B[m];
      for (let i = 0; i < n; i++) column[i] += t * source[i];
    }
    return column;
  });
}

/** The linear parameters minimising the squared error for given rates (normal equations; a QR where they are ill-conditioned). */
export function solveModes(set: FitSet, spec: ModeSpec, rates: ModeRates, ws: ModesWorkspace = new ModesWorkspace(set.time.length)): ModesSolution {
  const n = set.time.length;
  const B = unconstrainedBasis(set, spec, rates, ws);
  const T = substitution(spec, rates);
  const A = constrainedBasis(B, T, ws);
  const use = spec.start === 'no-pre-event' ? wholeAfter(ws.after, ws.use) : null;
  const phi = normalSolve(A, set.values, use) ?? qrSolve(A, set.values, use);
  const theta = T.map((row) => row.reduce((s, v, j) => s + v * phi[j], 0));
  const model = new Float64Array(n);
  let sse = 0;
  for (let i = 0; i < n; i++) {
    if (use && !use[i]) continue;
    let v = 0;
    for (let j = 0; j < A.length; j++) v += A[j][i] * phi[j];
    model[i] = v;
    const d = set.values[i] - v;
    sse += d * d;
  }
  return { linear: namedLinear(spec, theta), sse: Number.isFinite(sse) ? sse : Infinity, model };
}

/** 1 where a value's samples all lie at or after t0 (its share after t0 is 1), else 0; into `use`. */
function wholeAfter(after: Float64Array, use: Uint8Array): Uint8Array {
  for (let i = 0; i < after.length; i++) use[i] = after[i] >= 1 ? 1 : 0;
  return use;
}

/** Below this pivot of the unit-diagonal Gram matrix the normal equations lose too many digits: the QR is used. */
const NORMAL_PIVOT = 1e-9;
/** Below this fraction of its own norm a column left after the earlier reflections counts as dependent (coefficient 0). */
const RANK_TOLERANCE = 1e-12;

/** min |A x - y| over the rows in use by Cholesky on the column-scaled normal equations; null when a pivot is too small. */
function normalSolve(A: Float64Array[], y: ArrayLike<number>, use: Uint8Array | null): number[] | null {
  const r = A.length;
  const n = y.length;
  const g = new Float64Array(r * r);
  const rhs = new Float64Array(r);
  for (let p = 0; p < r; p++) {
    for (let q = p; q < r; q++) g[p * r + q] = dotInOrder(A[p], A[q], n, use);
    rhs[p] = dotInOrder(A[p], y, n, use);
  }
  const d = Array.from({ length: r }, (_, p) => Math.sqrt(g[p * r + p]));
  if (!d.every((v) => v > 0 && Number.isFinite(v))) return null;
  const l = new Float64Array(r * r);
  for (let j = 0; j < r; j++) {
    let s = g[j * r + j] / (d[j] * d[j]);
    for (let k = 0; k < j; k++) s -= l[j * r + k] * l[j * r + k];
    if (!(s > NORMAL_PIVOT)) return null;
    const pivot = Math.sqrt(s);
    l[j * r + j] = pivot;
    for (let i = j + 1; i < r; i++) {
      let t = g[j * r + i] / (d[i] * d[j]);
      for (let k = 0; k < j; k++) t -= l[i * r + k] * l[j * r + k];
      l[i * r + j] = t / pivot;
    }
  }
  const z = new Float64Array(r);
  for (let i = 0; i < r; i++) {
    let s = rhs[i] / d[i];
    for (let k = 0; k < i; k++) s -= l[i * r + k] * z[k];
    z[i] = s / l[i * r + i];
  }
  const x = new Array<number>(r).fill(0);
  for (let i = r - 1; i >= 0; i--) {
    let s = z[i];
    for (let k = i + 1; k < r; k++) s -= l[k * r + i] * x[k];
    x[i] = s / l[i * r + i];
  }
  return x.map((v, i) => v / d[i]);
}

/** min |A x - y| over the rows in use by Householder QR with columns scaled to unit norm; a dependent column gets a zero coefficient. */
function qrSolve(columns: Float64Array[], y: ArrayLike<number>, use: Uint8Array | null): number[] {
  const rows: number[] = [];
  for (let i = 0; i < y.length; i++) if (!use || use[i]) rows.push(i);
  const r = columns.length;
  const m = rows.length;
  const A = columns.map((c) => gathered(rows, (i) => c[i]));
  const scale = A.map((c) => Math.sqrt(c.reduce((s, v) => s + v * v, 0)) || 1);
  A.forEach((c, j) => c.forEach((v, i) => (c[i] = v / scale[j])));
  const b = gathered(rows, (i) => y[i]);
  const diagonal = new Array<number>(r).fill(0);
  const dead = new Array<boolean>(r).fill(false);
  for (let j = 0; j < r && j < m; j++) {
    const col = A[j];
    let norm = 0;
    for (let i = j; i < m; i++) norm += col[i] * col[i];
    norm = Math.sqrt(norm);
    if (!(norm > RANK_TOLERANCE)) {
      dead[j] = true;
      continue;
    }
    const alpha = col[j] > 0 ? -norm : norm;
    // v = x - alpha e_j, kept in col[j..]; H = I - 2 v v^T / v^T v.
    col[j] -= alpha;
    let vv = 0;
    for (let i = j; i < m; i++) vv += col[i] * col[i];
    const reflect = (target: Float64Array) => {
      let dot = 0;
      for (let i = j; i < m; i++) dot += col[i] * target[i];
      const f = (2 * dot) / vv;
      for (let i = j; i < m; i++) target[i] -= f * col[i];
    };
    for (let k = j + 1; k < r; k++) reflect(A[k]);
    reflect(b);
    diagonal[j] = alpha;
  }
  const x = new Array<number>(r).fill(0);
  for (let j = Math.min(r, m) - 1; j >= 0; j--) {
    if (dead[j]) continue;
    let s = b[j];
    for (let k = j + 1; k < r; k++) s -= A[k][j] * x[k];
    x[j] = s / diagonal[j];
  }
  return x.map((v, j) => v / scale[j]);
}

/** Positions of the unconstrained vector the solver keeps (the rest follow by substitution). */
function keptPositions(spec: ModeSpec): number[] {
  const at = positions(spec);
  const removed = spec.start === 'smooth' ? [at.a(0), at.b(0)] : spec.start === 'continuous' ? [at.a(0)] : [];
  return Array.from({ length: at.size }, (_, i) => i).filter((i) => !removed.includes(i));
}

/** Names of the solver's linear parameters: 'yPre', 'yFinal', 'a1', 'b1', 'a2'..., 'slow' (ring numbers as fitted). */
export function linearNames(spec: ModeSpec): string[] {
  const at = positions(spec);
  const name = (i: number): string => {
    if (i === at.pre) return 'yPre';
    if (i === at.final) return 'yFinal';
    if (i === at.slow) return 'slow';
    const k = i - at.final - 1;
    return k < spec.rings ? `a${k + 1}` : `b${k - spec.rings + 1}`;
  };
  return keptPositions(spec).map(name);
}

/** The solver's linear parameters from the named ones (the substituted ones dropped). */
export function solverLinear(spec: ModeSpec, linear: ModeLinear): number[] {
  const at = positions(spec);
  const theta = new Array<number>(at.size).fill(0);
  if (at.pre >= 0) theta[at.pre] = linear.yPre;
  theta[at.final] = linear.yFinal;
  linear.a.forEach((v, k) => (theta[at.a(k)] = v));
  linear.b.forEach((v, k) => (theta[at.b(k)] = v));
  if (spec.slow) theta[at.slow] = linear.slow;
  return keptPositions(spec).map((i) => theta[i]);
}

/** The named linear parameters from the solver's, for given rates (the substitutions applied). */
export function expandLinear(spec: ModeSpec, rates: ModeRates, phi: readonly number[]): ModeLinear {
  const T = substitution(spec, rates);
  return namedLinear(spec, T.map((row) => row.reduce((s, v, j) => s + v * phi[j], 0)));
}

/** Model values over the set for given rates and solver linear parameters (the covariance's model). */
export function modesValues(set: FitSet, spec: ModeSpec, rates: ModeRates, phi: readonly number[], ws: ModesWorkspace = new ModesWorkspace(set.time.length)): Float64Array {
  const A = constrainedBasis(unconstrainedBasis(set, spec, rates, ws), substitution(spec, rates), ws);
  const out = new Float64Array(set.time.length);
  for (let i = 0; i < out.length; i++) {
    if (!fitted(spec, ws.after, i)) continue;
    let v = 0;
    for (let j = 0; j < A.length; j++) v += A[j][i] * phi[j];
    out[i] = v;
  }
  return out;
}

/** Each ring's and the slow term's contribution over the set (zero before t0, block-averaged as the values). */
export function termValues(set: FitSet, spec: ModeSpec, rates: ModeRates, linear: ModeLinear): Float64Array[] {
  const ws = new ModesWorkspace(set.time.length);
  const terms = rates.rings.map((ring, k) => {
    fillDampedBasis(ring.alpha, ring.omega0, rates.t0, set.time, ws.ec, ws.es, set.block, ws.after);
    return Float64Array.from(ws.ec, (c, i) => ws.after[i] * (linear.a[k] * c + linear.b[k] * ws.es[i]));
  });
  if (spec.slow) {
    fillDampedBasis(rates.slowRate, rates.slowRate, rates.t0, set.time, ws.ec, ws.es, set.block, ws.after);
    terms.push(Float64Array.from(ws.ec, (c, i) => ws.after[i] * linear.slow * c));
  }
  return terms;
}
