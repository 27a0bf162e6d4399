// Trust table rows for case 8: pulse-train records (several ringdowns in one capture), generated with the truth stated.

import type { Channel } from '../../../../core/capture/types';
import { createRandom } from '../../../../core/random';
import { evaluateResponse } from '../../../../core/response/secondOrder';
import { fitEvents } from '../../../../core/workflow/events';
import { outcomeOfFit, type TrustCase, type TrustOutcome } from '../trustCase';

/** A generated record of a linear second-order circuit driven by a train of edges or kicks. */
export interface PulseTrainSpec {
  seed: number;
  alpha: number;
  omega0: number;
  /** Sample interval and count. */
  dt: number;
  samples: number;
  /** Event times, s. */
  events: number[];
  /**
   * 'square': edges of a square wave (alternately +amplitude and -amplitude steps, a capacitor voltage from rest);
   * 'kicks': short kicks about one level (the ring starts at the level with a slope).
   */
  drive: 'square' | 'kicks';
  amplitude: number;
  /** Standard deviation of the white noise added. */
  noise: number;
}

/**
 * The record as the sum of one response per event (the circuit is linear, so each event's response adds
 * to what is left of the ones before), plus seeded white noise.
 */
export function pulseTrainChannel(spec: PulseTrainSpec): Channel {
  const time = Float64Array.from({ length: spec.samples }, (_, i) => i * spec.dt);
  const values = new Float64Array(spec.samples);
  const omegaD = Math.sqrt(spec.omega0 ** 2 - spec.alpha ** 2);
  spec.events.forEach((t0, k) => {
    const size = spec.drive === 'square' ? (k % 2 === 0 ? 1 : -1) * spec.amplitude : spec.amplitude;
    const p =
      spec.drive === 'square'
        ? { t0, yPre: 0, yFinal: size, a: -size, b: -spec.alpha * size, alpha: spec.alpha, omega0: spec.omega0 }
        : { t0, yPre: 0, yFinal: 0, a: 0, b: size * omegaD, alpha: spec.alpha, omega0: spec.omega0 };
    const one = evaluateResponse(p, time);
    for (let i = 0; i < values.length; i++) values[i] += one[i];
  });
  const random = createRandom(spec.seed);
  for (let i = 0; i < values.length; i++) values[i] += spec.noise * random.normal();
  return { name: 'generated', unit: 'V', time, values, clipped: new Uint8Array(spec.samples), dropped: 0 };
}

/** A ring of 1 MHz sampled 50 times a period, the bench's usual oversampling. */
const F0 = 1e6;
const SAMPLES_PER_PERIOD = 50;

interface TrainRow {
  name: string;
  seed: number;
  zeta: number;
  drive: PulseTrainSpec['drive'];
  /** Events, each this many time constants (1 / alpha) after the one before. */
  count: number;
  spacingTaus: number;
  /** Time constants the record runs on after its last event (under 3: that event is incomplete). */
  tailTaus: number;
  /** Noise standard deviation as a share of the amplitude. */
  noiseShare: number;
  /** The record starts half a spacing after the first event, inside its ring. */
  startsInside?: boolean;
  /** 'right' where every event stands apart; 'right-or-failed' where the events crowd each other. */
  expect: TrustCase['expect'];
}

const ROWS: TrainRow[] = [
  { name: 'square wave, 4 edges 4 tau apart, 40 dB', seed: 801, zeta: 0.05, drive: 'square', count: 4, spacingTaus: 4, tailTaus: 6, noiseShare: 0.01, expect: 'right' },
  { name: 'pulse train, 5 kicks 2.5 tau apart, 34 dB', seed: 802, zeta: 0.05, drive: 'kicks', count: 5, spacingTaus: 2.5, tailTaus: 8, noiseShare: 0.02, expect: 'right' },
  { name: 'square wave, 6 edges, the last cut off after 1 tau, 26 dB', seed: 803, zeta: 0.1, drive: 'square', count: 6, spacingTaus: 5, tailTaus: 1, noiseShare: 0.05, expect: 'right' },
  { name: 'pulse train, 2 kicks, 46 dB', seed: 804, zeta: 0.02, drive: 'kicks', count: 2, spacingTaus: 5, tailTaus: 5, noiseShare: 0.005, expect: 'right' },
  { name: 'pulse train, 3 kicks, the last cut off after half a tau, 20 dB', seed: 805, zeta: 0.03, drive: 'kicks', count: 3, spacingTaus: 4, tailTaus: 0.5, noiseShare: 0.1, expect: 'right' },
  { name: 'square wave, 6 edges crowding each other 1.3 tau apart', seed: 806, zeta: 0.05, drive: 'square', count: 6, spacingTaus: 1.3, tailTaus: 6, noiseShare: 0.01, expect: 'right-or-failed' },
  { name: 'pulse train caught inside a ring, then 3 more kicks 4 tau apart, 34 dB', seed: 807, zeta: 0.04, drive: 'kicks', count: 4, spacingTaus: 4, tailTaus: 5, noiseShare: 0.02, startsInside: true, expect: 'right' },
];

/** The record of a row, with its truth. */
export function trainOf(row: TrainRow): { channel: Channel; alpha: number; omega0: number } {
  const omega0 = 2 * Math.PI * F0;
  const alpha = row.zeta * omega0;
  const dt = 1 / (F0 * SAMPLES_PER_PERIOD);
  const lead = row.startsInside ? -row.spacingTaus / (2 * alpha) : 2 / F0;
  const events = Array.from({ length: row.count }, (_, k) => lead + (k * row.spacingTaus) / alpha);
  const samples = Math.round((events[events.length - 1] + row.tailTaus / alpha) / dt);
  const spec = { seed: row.seed, alpha, omega0, dt, samples, events, drive: row.drive, amplitude: 1, noise: row.noiseShare };
  return { channel: pulseTrainChannel(spec), alpha, omega0 };
}

/** The combination as an outcome: 'not combined' (fewer than two complete events) is no answer either. */
function combinedOutcome(summary: ReturnType<typeof fitEvents>['summary']): TrustOutcome {
  const combined = summary.events?.combined;
  if (!combined) return { status: summary.events ? 'not combined' : 'no events found', values: {} };
  return { status: combined.status, values: { alpha: combined.alpha, omega0: combined.omega0 } };
}

/** Each record fitted once for both of its rows. */
function measured(row: TrainRow): () => ReturnType<typeof fitEvents> {
  let result: ReturnType<typeof fitEvents> | null = null;
  return () => (result ??= fitEvents({ file: `${row.seed}.csv`, channel: trainOf(row).channel }));
}

export const severalEventsCases: TrustCase[] = ROWS.flatMap((row) => {
  const { alpha, omega0 } = trainOf(row);
  const run = measured(row);
  return [
    { issueCase: 8, name: `${row.name}: the chosen event`, expect: row.expect, truth: { alpha, omega0 }, run: () => outcomeOfFit(run().fit) },
    // The combination may fairly be declared inconsistent or absent; a converged one must be right.
    { issueCase: 8, name: `${row.name}: the combination`, expect: 'right-or-failed' as const, truth: { alpha, omega0 }, run: () => combinedOutcome(run().summary) },
  ];
});
