// Generated records for the trust rows about where a response starts: a step or a ringdown with seeded noise
// (white or low-pass filtered), optionally read through a converter with rails, and the sample captures' channels.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { createRandom } from '../../../core/random';
import { coefficientsFromInitial, evaluateResponse, type ResponseParams } from '../../../core/response/secondOrder';
import { parseCapture } from '../../../core/capture/parseCapture';
import { selectChannel } from '../../../core/capture/selectChannel';
import { readSampleManifest, SAMPLE_DIR } from '../../../sample-captures/sampleManifest';
import type { Trace } from '../../../core/fit/trace';

/** How the noise is coloured: white, or white through a one-pole or two equal poles of neighbour correlation `rho`. */
export type NoiseShape = { kind: 'white' } | { kind: 'one-pole' | 'two-pole'; rho: number };

export interface RecordSpec {
  zeta: number;
  omega0: number;
  samples: number;
  /** Samples per ring period (2 pi / omega0). */
  perPeriod: number;
  /** Index of the event on the sample grid (fractional: off the grid, as a real trigger is; negative: before the record). */
  eventAt: number;
  kind: 'step' | 'ringdown';
  /** 20 log10(step height or initial ringdown amplitude / noise rms). */
  snrDb: number;
  noise: NoiseShape;
  seed: number;
  /** Read through a converter: `codes` levels from `bottom` to `top` (samples beyond are held at the rail). */
  converter?: { codes: number; bottom: number; top: number };
  /** Level before the event (default 0) and the step's height (default 1). */
  preLevel?: number;
  height?: number;
}

/** The record of a spec and its true parameters. */
export function makeRecord(spec: RecordSpec): { trace: Trace; truth: ResponseParams } {
  const dt = (2 * Math.PI) / spec.omega0 / spec.perPeriod;
  const alpha = spec.zeta * spec.omega0;
  const yPre = spec.preLevel ?? 0;
  const height = spec.height ?? 1;
  const time = Float64Array.from({ length: spec.samples }, (_, i) => i * dt);
  const t0 = spec.eventAt * dt;
  // A step rises from rest; a ringdown starts at yPre + height and falls back to yPre with no initial slope.
  const { a, b } =
    spec.kind === 'step' ? coefficientsFromInitial(yPre, 0, yPre + height, alpha) : coefficientsFromInitial(yPre + height, 0, yPre, alpha);
  const truth: ResponseParams =
    spec.kind === 'step'
      ? { t0, yPre, yFinal: yPre + height, alpha, omega0: spec.omega0, a, b }
      : { t0, yPre: yPre + height, yFinal: yPre, alpha, omega0: spec.omega0, a, b };
  const values = evaluateResponse(truth, time);
  const noise = colouredNoise(spec.samples, Math.abs(height) * 10 ** (-spec.snrDb / 20), spec.noise, spec.seed);
  for (let i = 0; i < values.length; i++) values[i] += noise[i];
  if (spec.converter) {
    const { codes, bottom, top } = spec.converter;
    const q = (top - bottom) / (codes - 1);
    for (let i = 0; i < values.length; i++) values[i] = bottom + Math.min(codes - 1, Math.max(0, Math.round((values[i] - bottom) / q))) * q;
  }
  return { trace: { time, values, unit: 'V' }, truth };
}

/** Noise of stationary rms `rms`: white, or white through one or two first-order low-passes (each an AR(1) of `rho`). */
function colouredNoise(n: number, rms: number, shape: NoiseShape, seed: number): Float64Array {
  const random = createRandom(seed);
  // A run-in of 20 correlation lengths, dropped, so that the record's start is stationary.
  const runIn = shape.kind === 'white' ? 0 : Math.ceil(20 / (1 - shape.rho));
  const raw = Float64Array.from({ length: n + runIn }, () => random.normal());
  for (let pass = 0; shape.kind !== 'white' && pass < (shape.kind === 'one-pole' ? 1 : 2); pass++) {
    for (let i = 1; i < raw.length; i++) raw[i] = shape.rho * raw[i - 1] + (1 - shape.rho) * raw[i];
  }
  const out = raw.subarray(runIn);
  let sum = 0;
  for (const v of out) sum += v * v;
  const scale = rms / Math.sqrt(sum / n);
  return out.map((v) => v * scale);
}

/** The channel of one bundled sample capture, read by the capture importer, and its stated circuit's alpha and omega0. */
export function sampleCaptureTrace(file: string): { trace: Trace; alpha: number; omega0: number } {
  const entry = readSampleManifest().captures.find((c) => c.file === file);
  if (!entry) throw new Error(`${file} is not in the sample captures' manifest`);
  const channel = selectChannel(parseCapture(readFileSync(path.join(SAMPLE_DIR, file), 'utf8')), entry.channel);
  const trace = { time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit };
  // Series RLC: alpha = R / 2L, omega0 = 1 / sqrt(LC) (common practice).
  return { trace, alpha: entry.R / (2 * entry.L), omega0: 1 / Math.sqrt(entry.L * entry.C) };
}
