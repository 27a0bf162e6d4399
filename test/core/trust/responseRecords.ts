// Generated records for the trust table's response-model rows: a closed form on a uniform time axis plus seeded white noise.

import { createRandom } from '../../../core/random';
import { evaluateResponse, type ResponseParams } from '../../../core/response/secondOrder';
import type { Trace } from '../../../core/fit/trace';

export interface RecordSpec {
  seed: number;
  samples: number;
  dt: number;
  /** Standard deviation of the white noise added. */
  noise: number;
}

/** A trace of `shape` at t = 0, dt, 2 dt..., each sample plus a seeded normal deviate of `noise`. */
export function generatedTrace(spec: RecordSpec, shape: (time: Float64Array) => Float64Array, unit = 'V'): Trace {
  const time = Float64Array.from({ length: spec.samples }, (_, i) => i * spec.dt);
  const clean = shape(time);
  const random = createRandom(spec.seed);
  return { time, values: clean.map((v) => v + spec.noise * random.normal()), unit };
}

/** The second-order closed form (core/response/secondOrder.ts, checked against the textbook forms in test/core/secondOrder.test.ts). */
export function secondOrderShape(p: ResponseParams): (time: Float64Array) => Float64Array {
  return (time) => evaluateResponse(p, time);
}

/**
 * A first-order circuit: yPre before t0, then y = yFinal + (yStart - yFinal) e^(-(t - t0) / tau), with
 * yStart = yPre for a continuous quantity (an RC capacitor's voltage) and yStart != yPre for one that jumps
 * (the RC charging current, V/R e^(-t / RC)); the textbook relation of a single-pole circuit.
 */
export function firstOrderShape(p: { t0: number; yPre: number; yStart: number; yFinal: number; tau: number }): (time: Float64Array) => Float64Array {
  return (time) => time.map((t) => (t < p.t0 ? p.yPre : p.yFinal + (p.yStart - p.yFinal) * Math.exp(-(t - p.t0) / p.tau)));
}
