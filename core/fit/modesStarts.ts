// Starting rates for one more ring or a slow term: matrix pencils of what a fitted model leaves, and a few fallbacks.

import { blockMeans } from './blockMeans';
import { matrixPencils, type Pole } from './pencil';
import type { FitSet } from './fitSet';

/** Block means one pencil looks at: a few ring periods, few enough for a quick SVD (as startingRates.ts). */
const PENCIL_POINTS = 120;
/** Below this many points a pencil of three poles has too little to go on. */
const PENCIL_MIN_POINTS = 12;
/** Coarser block sizes are tried while the residual after t0 still spans this many blocks. */
const PENCIL_MIN_SPAN = 40;
/** Fallback rings, in units of the first ring's omega0, at a light damping: when no pencil pole is usable. */
const FALLBACK_RING_RATIOS = [0.4, 2.5, 6];
const FALLBACK_ZETA = 0.05;
/** Fallback slow rates, in units of the first ring's alpha: a decay several times slower than the ring's envelope. */
const FALLBACK_SLOW_RATIOS = [0.3, 0.1];

/**
 * A ring is looked for below this share of the Nyquist rate of the values fitted (block means where the record
 * is long): a pole near it is the alternating pattern any residual holds some of, not a mode (a long two-mode
 * record found one at 0.9999 of it, zeta 0.002).
 */
export const GRID_NYQUIST_SHARE = 0.8;

/** The Nyquist rate of the values fitted, rad/s: of the block means where the record is long (above it a ring is not seen). */
export function gridNyquist(set: FitSet): number {
  return Math.PI / set.dt;
}

export interface RingStart {
  alpha: number;
  omega0: number;
}

/** The residual after t0 on the set's grid: data minus model over the values wholly after t0. */
export function residualAfter(set: FitSet, model: ArrayLike<number>, t0: number): Float64Array {
  const reach = set.block ? ((set.block.samples - 1) / 2) * set.block.spacing : 0;
  let first = 0;
  while (first < set.time.length && set.time[first] - reach < t0) first++;
  return Float64Array.from({ length: set.time.length - first }, (_, i) => set.values[first + i] - model[first + i]);
}

/** The poles found in each residual, kept while the residual is: the gate and every richer model ask for them. */
const polesOf = new WeakMap<Float64Array, { decay: number; omega: number }[]>();

/**
 * Poles of the residual from pencils of 2 poles (a ring alone) and 3 (a ring and a decay, or three decays) at
 * block sizes 1, 4, 16...: each as (rate s^-1, angular frequency rad/s).
 */
function residualPoles(residual: Float64Array, dt: number): { decay: number; omega: number }[] {
  const known = polesOf.get(residual);
  if (known) return known;
  const out: { decay: number; omega: number }[] = [];
  polesOf.set(residual, out);
  const n = residual.length;
  for (let size = 1; size === 1 || n / size >= PENCIL_MIN_SPAN; size *= 4) {
    const y = blockMeans(residual, 0, n, size, PENCIL_POINTS);
    if (y.length < PENCIL_MIN_POINTS) break;
    const add = (poles: Pole[]) => poles.forEach((p) => out.push({ decay: -p.re / (dt * size), omega: Math.abs(p.im) / (dt * size) }));
    for (const poles of matrixPencils(y, [2, 3])) add(poles);
  }
  return out;
}

/**
 * Starting rates for another ring: the damped complex poles the pencils find in the residual (alpha > 0,
 * below the Nyquist rate), then fallbacks around the first ring.
 */
export function ringStarts(set: FitSet, residual: Float64Array, first: RingStart): RingStart[] {
  const nyquist = GRID_NYQUIST_SHARE * gridNyquist(set);
  const poles = residualPoles(residual, set.dt).filter((p) => p.omega > 0 && p.decay > 0 && p.omega < nyquist);
  const found = poles.map((p) => ({ alpha: p.decay, omega0: Math.hypot(p.decay, p.omega) }));
  const fallback = FALLBACK_RING_RATIOS.map((r) => ({ alpha: FALLBACK_ZETA * r * first.omega0, omega0: r * first.omega0 })).filter((s) => s.omega0 < nyquist);
  return [...found, ...fallback];
}

/** Starting rates of a slow term: the real decaying poles of the residual, then fallbacks slower than the ring's envelope. */
export function slowStarts(set: FitSet, residual: Float64Array, first: RingStart): number[] {
  const real = residualPoles(residual, set.dt).filter((p) => p.omega === 0 && p.decay > 0).map((p) => p.decay);
  return [...real, ...FALLBACK_SLOW_RATIOS.map((r) => r * first.alpha)];
}
