// Seeded generator of the robustness corpus: varied series and parallel RLC captures as 8-bit scope CSV text, with the truth.

import { createRandom, type Random } from '../core/random';
import { coefficientsFromInitial, evaluateResponse, type ResponseParams } from '../core/response/secondOrder';

export type Measured = 'capacitor voltage' | 'loop current' | 'inductor current' | 'tank voltage';

/** The circumstances of one capture, drawn from the seed. */
export interface CorpusSpec {
  index: number;
  zeta: number;
  /** 20 log10(peak-to-peak of the clean waveform / noise rms). */
  snrDb: number;
  samples: number;
  /** Fraction of the record before the event (exactly 0: the record starts at the event). */
  preTrigger: number;
  topology: 'series' | 'parallel';
  measured: Measured;
  /** 'step': the source steps; 'natural': a charged capacitor or fluxed inductor rings down through the switch. */
  response: 'step' | 'natural';
  inverted: boolean;
  /** DC offset added to the waveform, as a fraction of its peak-to-peak swing. */
  offset: number;
  /** True when the screen was set for the settled levels and the outer excursions clip at the converter's rails. */
  clipping: boolean;
  /** Ring frequency (zeta < 1) or omega0 / 2 pi, Hz. */
  f0: number;
  unit: 'V' | 'A';
}

export interface CorpusTruth {
  R: number;
  L: number;
  C: number;
  alpha: number;
  omega0: number;
}

export interface CorpusCapture {
  spec: CorpusSpec;
  truth: CorpusTruth;
  /** The response as written to the file (polarity and offset applied), before noise and the converter. */
  written: ResponseParams;
  text: string;
}

export interface CorpusRange {
  /** Record lengths are drawn log-uniformly from [minSamples, maxSamples]. */
  minSamples: number;
  maxSamples: number;
}

export const FULL_CORPUS: CorpusRange = { minSamples: 1e3, maxSamples: 2e5 };

const CODES = 256;

function logUniform(random: Random, lo: number, hi: number): number {
  return lo * (hi / lo) ** random.uniform();
}

function pick<T>(random: Random, items: readonly T[]): T {
  return items[Math.floor(random.uniform() * items.length)];
}

/** The circumstances of capture `index` of the corpus with seed `seed`. */
export function corpusSpec(index: number, seed: number, range: CorpusRange = FULL_CORPUS): CorpusSpec {
  const random = createRandom(seed * 7_919 + index);
  const topology = pick(random, ['series', 'parallel'] as const);
  const stateVariable = random.uniform() < 0.5;
  const measured: Measured = topology === 'series' ? (stateVariable ? 'capacitor voltage' : 'loop current') : stateVariable ? 'inductor current' : 'tank voltage';
  const preTrigger = random.uniform() < 0.15 ? 0 : 0.4 * random.uniform();
  return {
    index,
    zeta: logUniform(random, 0.01, 5),
    snrDb: 10 + 50 * random.uniform(),
    samples: Math.round(logUniform(random, range.minSamples, range.maxSamples)),
    preTrigger,
    topology,
    measured,
    response: random.uniform() < 0.5 ? 'step' : 'natural',
    inverted: random.uniform() < 0.2,
    offset: random.uniform() < 0.5 ? random.uniform() - 0.5 : 0,
    clipping: random.uniform() < 0.1,
    f0: logUniform(random, 10e3, 50e6),
    unit: measured === 'capacitor voltage' || measured === 'tank voltage' ? 'V' : 'A',
  };
}

/** Components for the spec: characteristic impedance drawn log-uniformly from 0.5 to 200 ohm. */
function components(spec: CorpusSpec, random: Random): CorpusTruth {
  const omega0 = 2 * Math.PI * spec.f0;
  const z0 = logUniform(random, 0.5, 200);
  const L = z0 / omega0;
  const C = 1 / (z0 * omega0);
  // Series: alpha = R / (2 L); parallel: alpha = 1 / (2 R C); zeta = alpha / omega0.
  const R = spec.topology === 'series' ? 2 * spec.zeta * z0 : z0 / (2 * spec.zeta);
  const alpha = spec.topology === 'series' ? R / (2 * L) : 1 / (2 * R * C);
  return { R, L, C, alpha, omega0: 1 / Math.sqrt(L * C) };
}

/** Level before the event, value and slope just after it, and the final level of the measured quantity. */
function initialState(spec: CorpusSpec, truth: CorpusTruth, random: Random): { yPre: number; slope: number; yFinal: number } {
  const step = spec.response === 'step';
  if (spec.topology === 'series') {
    const from = step ? 5 * random.uniform() : logUniform(random, 5, 400);
    const to = step ? logUniform(random, 5, 48) : 0;
    // L di/dt = V - v_C - R i with i = 0 at the event.
    if (spec.measured === 'capacitor voltage') return { yPre: from, slope: 0, yFinal: to };
    return { yPre: 0, slope: step ? (to - from) / truth.L : -from / truth.L, yFinal: 0 };
  }
  const from = step ? 2 * random.uniform() : logUniform(random, 0.1, 20);
  const to = step ? logUniform(random, 0.1, 20) : 0;
  // C dv/dt = I - i_L - v / R with v = 0 at the event.
  if (spec.measured === 'inductor current') return { yPre: from, slope: 0, yFinal: to };
  return { yPre: 0, slope: step ? (to - from) / truth.C : -from / truth.C, yFinal: 0 };
}

/** The decay rate of the slowest pole, 1/s. */
function slowestRate(alpha: number, omega0: number): number {
  return alpha < omega0 ? alpha : alpha - Math.sqrt(alpha * alpha - omega0 * omega0);
}

export function corpusCapture(spec: CorpusSpec, seed: number): CorpusCapture {
  const random = createRandom(seed * 104_729 + spec.index);
  const truth = components(spec, random);
  const { alpha, omega0 } = truth;
  const { yPre, slope, yFinal } = initialState(spec, truth, random);
  const { a, b } = coefficientsFromInitial(yPre, slope, yFinal, alpha);
  // The record after the event spans 3 to 8 decay times, but at least 12 samples per ring period.
  let after = (3 + 5 * random.uniform()) / slowestRate(alpha, omega0);
  const afterSamples = spec.samples * (1 - spec.preTrigger);
  if (alpha < omega0) after = Math.min(after, (afterSamples * 2 * Math.PI) / (12 * Math.sqrt(omega0 * omega0 - alpha * alpha)));
  const dt = after / afterSamples;
  const start = -spec.preTrigger * spec.samples * dt;
  const t0 = spec.preTrigger === 0 ? start : random.uniform() * dt;
  const time = Float64Array.from({ length: spec.samples }, (_, i) => start + i * dt);
  const params: ResponseParams = { t0, yPre, yFinal, alpha, omega0, a, b };
  const clean = evaluateResponse(params, time);
  const sign = spec.inverted ? -1 : 1;
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of clean) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const swing = hi - lo;
  const offset = spec.offset * swing;
  const sigma = swing * 10 ** (-spec.snrDb / 20);
  // The screen holds the noisy trace with room to spare; or (clipping) it holds both levels but cuts off
  // the outer 10 to 40 % of the excursions beyond them, as a screen set for the settled trace does.
  let bottom: number;
  let top: number;
  if (spec.clipping) {
    const keep = 0.6 + 0.3 * random.uniform();
    const levelLo = Math.min(sign * yPre, sign * yFinal);
    const levelHi = Math.max(sign * yPre, sign * yFinal);
    const [traceLo, traceHi] = sign > 0 ? [lo, hi] : [-hi, -lo];
    bottom = levelLo - keep * (levelLo - traceLo) - 3 * sigma + offset;
    top = levelHi + keep * (traceHi - levelHi) + 3 * sigma + offset;
  } else {
    const margin = ((swing + 8 * sigma) / (0.6 + 0.35 * random.uniform()) - swing) / 2;
    const shift = 0.2 * (random.uniform() - 0.5) * margin;
    bottom = sign > 0 ? lo - margin + shift + offset : -hi - margin + shift + offset;
    top = bottom + swing + 2 * margin;
  }
  const span = top - bottom;
  const mid = (top + bottom) / 2;
  const q = span / CODES;
  const rows: string[] = [`Time (s),${channelName(spec.measured)} (${spec.unit})`];
  for (let i = 0; i < spec.samples; i++) {
    const analog = sign * clean[i] + offset + sigma * random.normal();
    const code = Math.min(CODES - 1, Math.max(0, Math.round((analog - mid) / q) + CODES / 2));
    rows.push(`${time[i].toExponential(9)},${(mid + (code - CODES / 2) * q).toPrecision(7)}`);
  }
  const written = { ...params, yPre: sign * yPre + offset, yFinal: sign * yFinal + offset, a: sign * a, b: sign * b };
  return { spec, truth, written, text: `${rows.join('\n')}\n` };
}

function channelName(measured: Measured): string {
  return { 'capacitor voltage': 'V_C', 'loop current': 'I_loop', 'inductor current': 'I_L', 'tank voltage': 'V_tank' }[measured];
}
