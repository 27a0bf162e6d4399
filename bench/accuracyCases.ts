// The Monte Carlo cases of the accuracy benchmark and the seeded synthesis of one record of each: a gate-drive loop's step.

import { createRandom } from '../core/random';
import { coefficientsFromInitial, evaluateResponse, type ResponseParams } from '../core/response/secondOrder';
import type { Trace } from '../core/fit/fitResponse';

export interface AccuracyCase {
  id: number;
  zeta: number;
  /** 20 log10(step height / noise rms). */
  snrDb: number;
  quantized: boolean;
  /** 'low-pass': the noise passed through a first-order low-pass with neighbour correlation LOW_PASS_RHO. */
  noise: 'white' | 'low-pass';
}

/** Neighbour correlation of the filtered noise: a corner at -ln(0.8) / (2 pi) = 3.6 % of the sample rate. */
export const LOW_PASS_RHO = 0.8;
/** The step: 0 V to 1 V, omega0 = 2 pi 1 MHz, 10 % of the record before the event, record 6 decay times of the slowest root after it. */
const OMEGA0 = 2 * Math.PI * 1e6;
const STEP = 1;
const PRE_TRIGGER = 0.1;
/** 8-bit converter, 256 codes over 10 divisions of 0.3 V centred on 1 V: the largest overshoot stays on screen. */
const CODES = 256;
const FULL_SCALE = 3;
const CENTRE = 1;

export function accuracyCases(): AccuracyCase[] {
  const cases: Omit<AccuracyCase, 'id'>[] = [];
  for (const quantized of [false, true])
    for (const zeta of [0.02, 0.1, 0.3, 0.7]) for (const snrDb of [20, 30, 40]) cases.push({ zeta, snrDb, quantized, noise: 'white' });
  for (const zeta of [0.1, 0.3]) cases.push({ zeta, snrDb: 30, quantized: false, noise: 'low-pass' });
  // Heavily overdamped steps, where the fast root is barely in the record (appended: earlier ids stay).
  for (const zeta of OVERDAMPED_ZETAS) cases.push({ zeta, snrDb: 30, quantized: false, noise: 'white' });
  return cases.map((c, id) => ({ id, ...c }));
}

/** The overdamped cases' damping ratios: the fast root 14 and 98 times the slow one. */
const OVERDAMPED_ZETAS = [2, 5];

export function isOverdamped(c: AccuracyCase): boolean {
  return c.zeta > 1;
}

/** Decay rate of the slowest root: alpha below critical damping, alpha - sqrt(alpha^2 - omega0^2) above it. */
export function slowestRate(alpha: number, omega0: number): number {
  return alpha <= omega0 ? alpha : alpha - Math.sqrt(alpha * alpha - omega0 * omega0);
}

export function caseLabel(c: AccuracyCase): string {
  return `zeta ${c.zeta}, ${c.snrDb} dB${c.quantized ? ', 8-bit' : ''}${c.noise === 'low-pass' ? ', low-pass noise' : ''}`;
}

export interface SyntheticRecord {
  trace: Trace;
  truth: ResponseParams;
  noiseRms: number;
}

/** The record's time axis and true parameters (the same for every run of a case). */
export function caseTruth(c: AccuracyCase, samples: number): { time: Float64Array; truth: ResponseParams; noiseRms: number } {
  const alpha = c.zeta * OMEGA0;
  const duration = 6 / slowestRate(alpha, OMEGA0) / (1 - PRE_TRIGGER);
  const dt = duration / samples;
  const time = Float64Array.from({ length: samples }, (_, i) => i * dt);
  // Off the sample grid, as a real trigger is.
  const t0 = PRE_TRIGGER * duration + 0.37 * dt;
  const { a, b } = coefficientsFromInitial(0, 0, STEP, alpha);
  return { time, truth: { t0, yPre: 0, yFinal: STEP, alpha, omega0: OMEGA0, a, b }, noiseRms: STEP * 10 ** (-c.snrDb / 20) };
}

/** Run `run` of case `c`: the clean step plus seeded noise, quantized when the case says so. */
export function synthesize(c: AccuracyCase, samples: number, run: number, seed: number): SyntheticRecord {
  const { time, truth, noiseRms } = caseTruth(c, samples);
  const random = createRandom(seed * 1_000_003 + c.id * 10_007 + run);
  const values = evaluateResponse(truth, time);
  const rho = c.noise === 'low-pass' ? LOW_PASS_RHO : 0;
  const innovation = noiseRms * Math.sqrt(1 - rho * rho);
  let n = noiseRms * random.normal();
  const q = FULL_SCALE / CODES;
  for (let i = 0; i < samples; i++) {
    if (i > 0) n = rho * n + innovation * random.normal();
    const analog = values[i] + n;
    values[i] = c.quantized ? CENTRE + (Math.min(CODES - 1, Math.max(0, Math.round((analog - CENTRE) / q) + CODES / 2)) - CODES / 2) * q : analog;
  }
  return { trace: { time, values, unit: 'V' }, truth, noiseRms };
}

/** Rms of the 8-bit quantization error, q / sqrt(12) (trade-facts.md, "Quantization"). */
export function quantizationRms(): number {
  return FULL_SCALE / CODES / Math.sqrt(12);
}
