// The event search's noise stops reading the record's stretches once their count decides it: the same noise, bit
// for bit, as the quantile of every stretch's spread, on records made to stop early either way and not at all.

import { describe, expect, it } from 'vitest';
import { findEventTrain } from '../../core/fit/eventTrain';
import { estimateNoise, robustSpread } from '../../core/fit/noise';
import { createRandom } from '../../core/random';

/** The noise from every stretch: max(difference estimate, min(head, quarter-quantile stretch spread, 4 x the estimate)). */
function noiseFromEveryStretch(values: Float64Array): number {
  const fromDifferences = estimateNoise(values);
  const stretch = Math.max(128, Math.floor(values.length / 32));
  if (stretch > values.length) return fromDifferences;
  const spreads: number[] = [];
  for (let from = 0; from + stretch <= values.length; from += stretch) spreads.push(robustSpread(values.subarray(from, from + stretch)));
  const head = robustSpread(values.subarray(0, Math.max(128, Math.floor(values.length * 0.02))));
  spreads.sort((a, b) => a - b);
  const quiet = Math.min(head, spreads[Math.floor(spreads.length * 0.25)]);
  return Math.max(fromDifferences, Math.min(quiet, 4 * fromDifferences));
}

/** n samples: white noise (rms `noise`, correlated `rho` from one sample to the next), rings starting at `rings` (indices), `step` the ADC step (0: none). */
function record(options: { n: number; noise: number; rho?: number; rings?: number[]; amplitude?: number; period?: number; step?: number; seed: number }): Float64Array {
  const { n, noise, rho = 0, rings = [], amplitude = 1, period = 50, step = 0, seed } = options;
  const random = createRandom(seed);
  const values = new Float64Array(n);
  let e = 0;
  for (let i = 0; i < n; i++) {
    e = rho * e + Math.sqrt(1 - rho * rho) * noise * random.normal();
    let y = e;
    for (const at of rings) if (i >= at) y += amplitude * Math.exp(-(i - at) / (3 * period)) * Math.sin((2 * Math.PI * (i - at)) / period);
    values[i] = step > 0 ? step * Math.round(y / step) : y;
  }
  return values;
}

const records: { label: string; values: Float64Array }[] = [
  { label: 'white noise alone', values: record({ n: 40000, noise: 0.01, seed: 1 }) },
  { label: 'white noise, another seed', values: record({ n: 40000, noise: 0.01, seed: 2 }) },
  { label: 'band-limited noise (the stretches read above the differences)', values: record({ n: 40000, noise: 0.01, rho: 0.9, seed: 3 }) },
  { label: 'band-limited noise with one ring', values: record({ n: 40000, noise: 0.01, rho: 0.8, rings: [4000], seed: 4 }) },
  { label: 'a train ringing throughout', values: record({ n: 40000, noise: 0.01, rho: 0.7, rings: [0, 1000, 2000, 3000, 5000, 9000, 13000, 20000, 30000], amplitude: 2, period: 400, seed: 5 }) },
  { label: 'a quantised record (spreads tie at multiples of the step)', values: record({ n: 40000, noise: 0.004, rho: 0.5, rings: [6000, 25000], step: 0.01, seed: 6 }) },
  { label: 'a record held at a rail (clipped) through its middle', values: record({ n: 40000, noise: 0.01, rho: 0.9, rings: [8000], amplitude: 50, seed: 7 }).map((y) => Math.min(y, 3)) },
  { label: 'a record with a run of held samples (a dropout)', values: record({ n: 40000, noise: 0.01, rho: 0.9, seed: 8 }).fill(0.2, 10000, 22000) },
  {
    // Stretches 2 to 9 quiet and white, the rest band-limited: the quarter-quantile stretch is the first of the rest.
    label: 'a quarter of the stretches, and not one more, under the difference estimate',
    values: record({ n: 32000, noise: 0.01, rho: 0.95, seed: 12 }).map((y, i) => (i >= 1000 && i < 9000 ? 0.05 * y : y)),
  },
  { label: 'a short record (one stretch)', values: record({ n: 200, noise: 0.01, rho: 0.9, seed: 9 }) },
  { label: 'a record just long enough for one stretch', values: record({ n: 128, noise: 0.01, rho: 0.9, seed: 10 }) },
  { label: 'a record too short for a stretch', values: record({ n: 100, noise: 0.01, seed: 11 }) },
  { label: 'a constant record', values: new Float64Array(5000).fill(1.5) },
];

describe('findEventTrain noise: the stretches read until their count decides', () => {
  it.each(records)('gives the noise of every stretch on $label', ({ values }) => {
    expect(findEventTrain(values).noise).toBe(noiseFromEveryStretch(values));
  });

  it('gives it on many seeds of band-limited noise and rings', () => {
    for (let seed = 20; seed < 60; seed++) {
      const random = createRandom(seed);
      const rings = Array.from({ length: Math.floor(4 * random.uniform()) }, () => Math.floor(40000 * random.uniform()));
      const values = record({ n: 40000, noise: 0.01, rho: 0.95 * random.uniform(), rings, amplitude: 0.05 + random.uniform(), seed });
      expect(findEventTrain(values).noise, `seed ${seed}`).toBe(noiseFromEveryStretch(values));
    }
  });
});
