// What a scope's first-order front end at a stated bandwidth does to a fitted ring: alpha refitted through it.
//
// The relation: a single-pole front end H(s) = wb / (s + wb), wb = 2 pi f_bw (the first-order low-pass
// transfer function), driven by a ring c e^(p t), p = -alpha + j omega_d, answers
//   c H(p) e^(p t) - c H(p) e^(-wb t),   H(p) = wb / (wb - alpha + j omega_d)
// (the convolution of e^(p t) with wb e^(-wb t), from rest). A linear front end cannot move the ring's pole:
// it scales and delays the ring by H(p) and adds its own term e^(-wb t), about 1 / wb long, at the event.
// The damping it seems to add is what a second-order fit makes of that unmodelled term (and of the event
// seen through it), so it is found by fitting the fitted response again, before and after the filter, with
// the same noise: the difference is the bias the stated bandwidth puts on alpha for this record.

import { createRandom } from '../random';
import { evaluateResponse, type ResponseParams } from '../response/secondOrder';
import { fitResponse } from '../fit/fitResponse';
import type { Continuity, ResponseFitOptions } from '../fit/responseFit';

/** Fine steps per shortest time scale of the signal (1 / omega0, 1 / wb) when filtering: linear interpolation between them errs by under 1e-3 of the signal. */
const STEPS_PER_SCALE = 16;
/** The most fine steps filtered: a record holding more of the ring's time scales than this gets no bias estimate (memory). */
const MAX_FINE_STEPS = 4_000_000;
/** Seed of the noise added to both refits: the same noise cancels from their difference. */
const NOISE_SEED = 0x5e7;

export interface FrontEndBias {
  /** alpha fitted through the front end minus alpha fitted without it, s^-1. */
  alphaBias: number;
  /** The same for omega0, rad/s. */
  omega0Bias: number;
  /** |H(p)|: how much the front end scales the ring's amplitude. */
  ringGain: number;
}

/**
 * The one-pole output of `x` sampled on a uniform fine grid of step h (state at rest at x[0]): exact for x
 * linear between grid points (the exponential integrator of y' = wb (x - y)).
 */
export function onePoleFilter(x: ArrayLike<number>, h: number, bandwidthHz: number): Float64Array {
  const wb = 2 * Math.PI * bandwidthHz;
  const decay = Math.exp(-wb * h);
  const ramp = (1 - decay) / (wb * h);
  const y = new Float64Array(x.length);
  y[0] = x[0];
  for (let k = 1; k < x.length; k++) {
    y[k] = x[k] + (y[k - 1] - x[k - 1]) * decay - (x[k] - x[k - 1]) * ramp;
  }
  return y;
}

/** The fitted response seen through a one-pole front end at `bandwidthHz`, at the capture's sample times. */
export function filteredResponse(params: ResponseParams, time: ArrayLike<number>, bandwidthHz: number): Float64Array | null {
  const n = time.length;
  const span = time[n - 1] - time[0];
  const frontEndScale = 1 / (2 * Math.PI * bandwidthHz);
  const h = Math.min(params.omega0 > 0 ? 1 / params.omega0 : frontEndScale, frontEndScale) / STEPS_PER_SCALE;
  // Start at rest a few front-end time constants before the first sample, on the level held before the event.
  const lead = 8 * frontEndScale;
  const start = time[0] - lead;
  const steps = Math.ceil((span + lead) / h) + 1;
  if (steps > MAX_FINE_STEPS) return null;
  const fineTime = new Float64Array(steps);
  for (let k = 0; k < steps; k++) fineTime[k] = start + k * h;
  const fine = onePoleFilter(evaluateResponse(params, fineTime), h, bandwidthHz);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const at = (time[i] - start) / h;
    const k = Math.min(steps - 2, Math.floor(at));
    const w = at - k;
    out[i] = fine[k] * (1 - w) + fine[k + 1] * w;
  }
  return out;
}

/** |H(p)| for the ring's pole p = -alpha + j omega_d (see the header). */
export function ringGain(alpha: number, omegaD: number, bandwidthHz: number): number {
  const wb = 2 * Math.PI * bandwidthHz;
  return wb / Math.hypot(wb - alpha, omegaD);
}

/**
 * The bias a one-pole front end at `bandwidthHz` puts on the fitted alpha and omega0 of this record: the
 * fitted response refitted over the same window and sample times, with and without the front end, the same
 * seeded noise of the record's level on both, and the start's continuity the original fit chose (so both refits
 * take the same layout and only the front end differs). Null when either refit does not converge or the record is too
 * long to filter finely (no bias is claimed).
 */
export function frontEndBias(
  params: ResponseParams,
  trace: { time: ArrayLike<number>; unit: string },
  window: NonNullable<ResponseFitOptions['window']>,
  noiseRms: number,
  bandwidthHz: number,
  continuity: Continuity,
): FrontEndBias | null {
  const time = Float64Array.from(trace.time);
  const clean = evaluateResponse(params, time);
  const filtered = filteredResponse(params, time, bandwidthHz);
  if (!filtered) return null;
  const random = createRandom(NOISE_SEED);
  const noise = Float64Array.from(time, () => noiseRms * random.normal());
  const refit = (values: Float64Array) =>
    fitResponse({ time, values: values.map((v, i) => v + noise[i]), clipped: new Uint8Array(time.length), unit: trace.unit, name: 'front-end' }, { window, continuity });
  const plain = refit(clean);
  const through = refit(filtered);
  if (plain.status !== 'converged' || through.status !== 'converged') return null;
  const omegaD = Math.sqrt(Math.max(0, params.omega0 ** 2 - params.alpha ** 2));
  return {
    alphaBias: through.alpha.value - plain.alpha.value,
    omega0Bias: through.omega0.value - plain.omega0.value,
    ringGain: ringGain(params.alpha, omegaD, bandwidthHz),
  };
}
