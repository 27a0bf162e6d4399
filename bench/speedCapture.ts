// Seeded generator of the speed benchmark's captures: an LC input filter's 8-bit, noisy underdamped step, written row by row.

import { closeSync, existsSync, openSync, readFileSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { createRandom } from '../core/random';
import { coefficientsFromInitial, fillDampedBasis, ringFrequency, type ResponseParams } from '../core/response/secondOrder';

/** Everything the benchmark knows about a capture it wrote: the truth to compare against. */
export interface SpeedTruth {
  samples: number;
  seed: number;
  bytes: number;
  sampleInterval: number;
  params: ResponseParams;
  omegaD: number;
  /** Analog noise rms before conversion, V. */
  noiseRms: number;
  /** One code of the 8-bit converter, V. */
  codeStep: number;
}

/** A 12 V step into an LC input filter (zeta 0.05, 200 kHz ring); the record holds 40 ring periods after a 10 % pre-trigger. */
const RING_HZ = 200e3;
const ZETA = 0.05;
const STEP_FROM = 0.4;
const STEP_TO = 12.4;
const PERIODS = 40;
const PRE_TRIGGER = 0.1;
/** 8-bit converter, 256 codes over 10 divisions of 2.5 V centred on 11 V: the first overshoot stays on screen. */
const CODES = 256;
const VOLTS_FULL_SCALE = 25;
const CENTRE = 11;
const NOISE_RMS = 0.1;
const ROWS_PER_WRITE = 50_000;

export function speedParams(): ResponseParams {
  const omegaD = 2 * Math.PI * RING_HZ;
  const omega0 = omegaD / Math.sqrt(1 - ZETA * ZETA);
  const alpha = ZETA * omega0;
  const duration = (PERIODS / RING_HZ) / (1 - PRE_TRIGGER);
  const { a, b } = coefficientsFromInitial(STEP_FROM, 0, STEP_TO, alpha);
  return { t0: PRE_TRIGGER * duration, yPre: STEP_FROM, yFinal: STEP_TO, alpha, omega0, a, b };
}

function recordDuration(): number {
  return PERIODS / RING_HZ / (1 - PRE_TRIGGER);
}

/** Path of the truth file written beside a capture. */
export function truthPath(capturePath: string): string {
  return capturePath.replace(/\.csv$/, '.truth.json');
}

/**
 * Writes `samples` rows of 'Time (s),CH1 (V)' to `path` (about 22 bytes a row) without holding the text,
 * and the truth beside it. An existing file with the same size and seed is reused.
 */
export function writeSpeedCapture(path: string, samples: number, seed: number): SpeedTruth {
  const truthFile = truthPath(path);
  if (existsSync(path) && existsSync(truthFile)) {
    const known = JSON.parse(readFileSync(truthFile, 'utf8')) as SpeedTruth;
    if (known.samples === samples && known.seed === seed && statSync(path).size === known.bytes) return known;
  }
  const params = speedParams();
  const dt = recordDuration() / samples;
  const q = VOLTS_FULL_SCALE / CODES;
  const random = createRandom(seed);
  const fd = openSync(path, 'w');
  let bytes = writeSync(fd, 'Time (s),CH1 (V)\n');
  const time = new Float64Array(ROWS_PER_WRITE);
  const ec = new Float64Array(ROWS_PER_WRITE);
  const es = new Float64Array(ROWS_PER_WRITE);
  try {
    for (let from = 0; from < samples; from += ROWS_PER_WRITE) {
      const count = Math.min(ROWS_PER_WRITE, samples - from);
      for (let i = 0; i < count; i++) time[i] = (from + i) * dt;
      fillDampedBasis(params.alpha, params.omega0, params.t0, time.subarray(0, count), ec, es);
      const rows: string[] = new Array(count);
      for (let i = 0; i < count; i++) {
        const clean = time[i] < params.t0 ? params.yPre : params.yFinal + params.a * ec[i] + params.b * es[i];
        const code = Math.min(CODES - 1, Math.max(0, Math.round((clean + NOISE_RMS * random.normal() - CENTRE) / q) + CODES / 2));
        const value = CENTRE + (code - CODES / 2) * q;
        rows[i] = `${time[i].toExponential(8)},${value.toPrecision(6)}\n`;
      }
      bytes += writeSync(fd, rows.join(''));
    }
  } finally {
    closeSync(fd);
  }
  const truth: SpeedTruth = {
    samples,
    seed,
    bytes,
    sampleInterval: dt,
    params,
    omegaD: ringFrequency(params.alpha, params.omega0) as number,
    noiseRms: NOISE_RMS,
    codeStep: q,
  };
  writeFileSync(truthFile, `${JSON.stringify(truth, null, 2)}\n`);
  return truth;
}
