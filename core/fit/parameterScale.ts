// Typical magnitude of each parameter, the unit the optimiser measures it in.

import type { NormalizedFitOptions } from './normalizeFitInput';
import { sumOfSquares, weightedModel, type WeightedProblem } from './weightedProblem';

/** Probe steps for a parameter that starts at zero: 1e20 down to 1e-20 (SI values live well inside). */
const PROBE_DECADES = { from: 20, to: -20 };
/** A probe is trusted when the step is this small against the scale it implies... */
const PROBE_SMALLNESS = 1e-3;
/** ...and two probes a decade apart agree on the derivative within this fraction. */
const PROBE_AGREEMENT = 0.1;

/**
 * |initial_j| when it is nonzero. A parameter that starts at zero has no magnitude to go by, so its
 * scale is the change that would move the model by the spread of the data, from the model's
 * derivative there (found by probing decades of step size, inside the bounds, until two agree);
 * 1 if nothing moves it.
 */
export function chooseScales(problem: WeightedProblem, initial: readonly number[], options: NormalizedFitOptions): number[] {
  return initial.map((v, j) => (v !== 0 ? Math.abs(v) : sensitivityScale(problem, initial, j, options)));
}

function sensitivityScale(problem: WeightedProblem, initial: readonly number[], j: number, options: NormalizedFitOptions): number {
  const target = dataSpread(problem);
  let previous: Float64Array | null = null;
  for (let k = PROBE_DECADES.from; k >= PROBE_DECADES.to; k--) {
    const h = 10 ** k;
    const derivative = secantDerivative(problem, initial, j, h, options);
    const size = derivative === null ? NaN : Math.sqrt(sumOfSquares(derivative));
    if (derivative !== null && previous !== null && size > 0 && agree(derivative, previous, size)) {
      const scale = target / size;
      if (10 * h <= PROBE_SMALLNESS * scale) return scale;
    }
    previous = Number.isFinite(size) ? derivative : null;
  }
  return 1;
}

/** (f(p_j + h) - f(p_j - h)) / 2h, both points clipped to the bounds; null if the model fails there (a probe may go far). */
function secantDerivative(problem: WeightedProblem, p: readonly number[], j: number, h: number, options: NormalizedFitOptions): Float64Array | null {
  const hi = [...p];
  const lo = [...p];
  hi[j] = Math.min(p[j] + h, options.max[j]);
  lo[j] = Math.max(p[j] - h, options.min[j]);
  const span = hi[j] - lo[j];
  if (!(span > 0)) return null;
  try {
    const up = weightedModel(problem, hi);
    const down = weightedModel(problem, lo);
    for (let i = 0; i < up.length; i++) up[i] = (up[i] - down[i]) / span;
    return up;
  } catch {
    return null;
  }
}

function agree(a: Float64Array, b: Float64Array, size: number): boolean {
  const diff = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) diff[i] = a[i] - b[i];
  return Math.sqrt(sumOfSquares(diff)) <= PROBE_AGREEMENT * size;
}

/** sqrt(sum w_i (y_i - weighted mean)^2); falls back to the size of y, then to 1. */
function dataSpread(problem: WeightedProblem): number {
  const { y, sqrtWeight } = problem;
  let sw = 0;
  let swy = 0;
  for (let i = 0; i < y.length; i++) {
    sw += sqrtWeight[i] * sqrtWeight[i];
    swy += sqrtWeight[i] * y[i];
  }
  const mean = swy / sw;
  const centred = Float64Array.from(y, (v, i) => v - sqrtWeight[i] * mean);
  const spread = Math.sqrt(sumOfSquares(centred));
  if (spread > 0) return spread;
  const size = Math.sqrt(sumOfSquares(y));
  return size > 0 ? size : 1;
}
