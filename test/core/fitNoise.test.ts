// Noise level and code step of a record: white and band-limited noise, quantised samples and their block means.

import { describe, expect, it } from 'vitest';
import { estimateNoise, estimateNoiseOfMeans, quantisationStep, recordNoise } from '../../core/fit/noise';
import { createRandom } from '../../core/random';

/** 4000 samples: a flat first 30 %, then a slow swing; noise of rms 1 with neighbour correlation rho (first-order low-pass). */
function record(rho: number, seed: number): Float64Array {
  const random = createRandom(seed);
  let noise = random.normal();
  return Float64Array.from({ length: 4000 }, (_, i) => {
    if (i > 0) noise = rho * noise + Math.sqrt(1 - rho * rho) * random.normal();
    return (i < 1200 ? 0 : 40 * (1 - Math.cos((i - 1200) / 300))) + noise;
  });
}

describe('recordNoise', () => {
  it('is the first-difference estimate for white noise', () => {
    for (const seed of [1, 2, 3]) {
      const values = record(0, seed);
      expect(recordNoise(values)).toBe(estimateNoise(values));
      expect(recordNoise(values)).toBeGreaterThan(0.85);
      expect(recordNoise(values)).toBeLessThan(1.15);
    }
  });

  it('reads band-limited noise whole from a flat head, where first differences read it low', () => {
    // Neighbour correlation 0.8: differences see sqrt(1 - 0.8) = 0.45 of the rms (derived).
    for (const seed of [1, 2, 3]) {
      const values = record(0.8, seed);
      expect(estimateNoise(values)).toBeLessThan(0.6);
      expect(recordNoise(values)).toBeGreaterThan(0.75);
      expect(recordNoise(values)).toBeLessThan(1.3);
    }
  });

  it('does not take a head inside the response for noise beyond 4x the difference estimate', () => {
    const values = Float64Array.from({ length: 4000 }, (_, i) => 100 * Math.exp(-i / 50) + 0.01 * Math.sin(i * 2.1));
    expect(recordNoise(values)).toBeLessThanOrEqual(4 * estimateNoise(values));
  });
});

describe('estimateNoiseOfMeans', () => {
  // 1000 block means of a ring 25 points a period (40 periods, decaying over 10), white noise of rms 1 on them.
  const means = (amplitude: number, seed: number): Float64Array => {
    const random = createRandom(seed);
    return Float64Array.from({ length: 1000 }, (_, i) => amplitude * Math.exp(-i / 250) * Math.sin((2 * Math.PI * i) / 25) + random.normal());
  };

  it('reads white noise alone to within 10 %, as first differences do', () => {
    for (const seed of [1, 2, 3]) {
      expect(estimateNoiseOfMeans(means(0, seed))).toBeGreaterThan(0.9);
      expect(estimateNoiseOfMeans(means(0, seed))).toBeLessThan(1.1);
    }
  });

  it('stays within 15 % of the noise where a ring 40 times the noise makes first differences read 1.5x or more', () => {
    for (const seed of [1, 2, 3]) {
      const values = means(40, seed);
      expect(estimateNoise(values)).toBeGreaterThan(1.5);
      expect(estimateNoiseOfMeans(values)).toBeLessThan(1.15);
      expect(estimateNoiseOfMeans(values)).toBeGreaterThan(0.85);
    }
  });
});

describe('quantisationStep', () => {
  it('finds the code step of quantised samples', () => {
    expect(quantisationStep(Float64Array.from({ length: 500 }, (_, i) => Math.round(10 * Math.sin(i / 30)) * 0.25))).toBeCloseTo(0.25, 12);
  });

  it('does not take rounding differences between block means of equal codes for a step', () => {
    // Means of five equal codes differ from the code in the last bits; the grid is a fifth of a code.
    const codes = Float64Array.from({ length: 500 }, (_, i) => Math.round(40 * Math.sin(i / 60)) * 0.1088);
    const means = Float64Array.from({ length: 100 }, (_, k) => codes.subarray(5 * k, 5 * k + 5).reduce((a, b) => a + b) / 5);
    expect(quantisationStep(means)).toBeGreaterThan(0.1088 / 5 - 1e-9);
  });
});
