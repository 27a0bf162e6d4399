// Starting values of (alpha, omega0) for the response fit from the data alone: matrix pencils and crossings.

import { blockMeans } from './blockMeans';
import { median, stretchOf } from './noise';
import { matrixPencil, type Pole } from './pencil';

export interface RateCandidate {
  alpha: number;
  omega0: number;
  source: string;
}

/** First differences: the constant mode drops out, so the pencil needs one pole fewer. */
function differences(y: Float64Array): Float64Array {
  const d = new Float64Array(Math.max(0, y.length - 1));
  for (let i = 0; i < d.length; i++) d[i] = y[i + 1] - y[i];
  return d;
}

/** (alpha, omega0) from a pair of poles in s (1/s), when the pair is physical. */
function rateFromPair(p: Pole, q: Pole, dt: number, source: string): RateCandidate | null {
  if (Math.abs(p.im) > 1e-9 && Math.abs(p.im + q.im) < 1e-6 * Math.max(1, Math.abs(p.im))) {
    const alpha = -p.re / dt;
    const omegaD = Math.abs(p.im) / dt;
    return alpha > 0 ? { alpha, omega0: Math.hypot(alpha, omegaD), source } : null;
  }
  if (Math.abs(p.im) > 1e-9 || Math.abs(q.im) > 1e-9) return null;
  const s1 = p.re / dt;
  const s2 = q.re / dt;
  if (!(s1 < 0 && s2 < 0)) return null;
  return { alpha: -(s1 + s2) / 2, omega0: Math.sqrt(s1 * s2), source };
}

function pairsOf(poles: Pole[], dt: number, source: string): RateCandidate[] {
  const out: RateCandidate[] = [];
  for (let i = 0; i < poles.length; i++)
    for (let j = i + 1; j < poles.length; j++) {
      const c = rateFromPair(poles[i], poles[j], dt, source);
      if (c) out.push(c);
    }
  return out;
}

/** Ring frequency from crossings of the late-time level, and decay from successive extremes. */
function crossingEstimate(values: ArrayLike<number>, start: number, end: number, dt: number): RateCandidate | null {
  const level = median(stretchOf(values, Math.floor(end - (end - start) * 0.1), end));
  const crossings: number[] = [];
  const extremes: number[] = [];
  let extreme = 0;
  for (let i = start + 1; i < end; i++) {
    const a = values[i - 1] - level;
    const b = values[i] - level;
    if (Math.abs(b) > Math.abs(extreme)) extreme = b;
    if (a < 0 !== b < 0 && a !== 0) {
      crossings.push(i - 1 + a / (a - b));
      if (extreme !== 0) extremes.push(Math.abs(extreme));
      extreme = 0;
    }
  }
  if (crossings.length < 3 || extremes.length < 3) return null;
  const halfPeriod = ((crossings[crossings.length - 1] - crossings[0]) / (crossings.length - 1)) * dt;
  const omegaD = Math.PI / halfPeriod;
  const ratio = extremes[1] / extremes[extremes.length - 1];
  const alpha = ratio > 1 ? Math.log(ratio) / ((extremes.length - 2) * halfPeriod) : omegaD / 50;
  return { alpha, omega0: Math.hypot(alpha, omegaD), source: 'crossings and log decrement' };
}

/** Block means one matrix pencil looks at: enough for a few ring periods, few enough for a quick SVD. */
const PENCIL_POINTS = 120;
/** A coarser block size is tried while the response still spans this many blocks of it. */
const PENCIL_MIN_SPAN = 40;
/** Below this many points a pencil of three poles has too little to go on. */
const PENCIL_MIN_POINTS = 12;

/**
 * Candidate rates from the response samples [start, end) of a uniform record with interval dt:
 * matrix pencils of the block-averaged record at several block sizes (raw with a constant mode,
 * and differenced without it), and the crossing estimate as a fallback.
 */
export function rateCandidates(values: ArrayLike<number>, start: number, end: number, dt: number): RateCandidate[] {
  const out: RateCandidate[] = [];
  for (let size = 1; size === 1 || (end - start) / size >= PENCIL_MIN_SPAN; size *= 4) {
    const y = blockMeans(values, start, end, size, PENCIL_POINTS);
    if (y.length < PENCIL_MIN_POINTS) break;
    const blockDt = dt * size;
    out.push(...pairsOf(matrixPencil(y, 3), blockDt, `matrix pencil, blocks of ${size}`));
    out.push(...pairsOf(matrixPencil(differences(y), 2), blockDt, `matrix pencil of differences, blocks of ${size}`));
    if ((end - start) / size < PENCIL_POINTS) break;
  }
  const crossing = crossingEstimate(values, start, end, dt);
  if (crossing) out.push(crossing);
  const nyquist = Math.PI / dt;
  return out.filter((c) => Number.isFinite(c.alpha) && Number.isFinite(c.omega0) && c.alpha > 0 && c.omega0 > 0 && c.omega0 < 2 * nyquist);
}
