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

/** MAD of the first differences / (0.6745 sqrt 2), written out: what the estimate reads before it looks for the signal's slope. */
function firstDifferenceNoise(values: Float64Array): number {
  const differences = Array.from(values.subarray(1), (v, i) => Math.abs(v - values[i])).sort((a, b) => a - b);
  const n = differences.length;
  return (n % 2 ? differences[(n - 1) / 2] : (differences[n / 2 - 1] + differences[n / 2]) / 2) / (0.6745 * Math.SQRT2);
}

describe('estimateNoise', () => {
  /** A ring 200 times the noise (rms 1), n samples of `perPeriod` a period, decaying over the record; quantised to `step` when given. */
  const ring = (perPeriod: number, seed: number, step = 0): Float64Array => {
    const random = createRandom(seed);
    return Float64Array.from({ length: 2500 }, (_, i) => {
      const v = 200 * Math.exp(-i / 1200) * Math.sin((2 * Math.PI * i) / perPeriod) + random.normal();
      return step > 0 ? step * Math.round(v / step) : v;
    });
  };

  it('reads the noise of a finely sampled ring from third differences, where its slope fills the first', () => {
    // 50 samples a period at 200:1: the slope puts first differences near 6x the noise (the case of a scope export
    // whose preamble gives the channel 400 V and noise of 2 V).
    for (const seed of [1, 2, 3]) {
      const values = ring(50, seed);
      expect(firstDifferenceNoise(values)).toBeGreaterThan(4);
      expect(estimateNoise(values)).toBeGreaterThan(0.9);
      expect(estimateNoise(values)).toBeLessThan(1.1);
    }
  });

  it('keeps the first-difference estimate for white noise alone, and for noise near the quantisation step', () => {
    for (const seed of [1, 2, 3]) {
      const white = ring(50, seed).map((v, i) => v - 200 * Math.exp(-i / 1200) * Math.sin((2 * Math.PI * i) / 50));
      expect(estimateNoise(white)).toBe(Math.max(firstDifferenceNoise(white), 0));
      // A step of 1.5 noise levels: differences are whole steps, and a third-difference median under 2 steps is not compared.
      const coarse = record(0, seed).map((v) => 1.5 * Math.round(v / 1.5));
      expect(estimateNoise(coarse)).toBe(Math.max(firstDifferenceNoise(coarse), 1.5 / Math.sqrt(12)));
    }
  });
});

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

  it('does not take a head whose samples climb for noise: a record that starts inside the response', () => {
    // A ring whose record starts on its slope: the first 1 % climbs through 40 noise levels (white noise of rms 1).
    for (const seed of [1, 2, 3]) {
      const random = createRandom(seed);
      const values = Float64Array.from({ length: 4000 }, (_, i) => 400 * Math.sin((2 * Math.PI * i) / 400 + 0.1) * Math.exp(-i / 2000) + random.normal());
      expect(recordNoise(values)).toBe(estimateNoise(values));
      expect(recordNoise(values)).toBeLessThan(1.15);
    }
  });

  it('does not take a head that holds a peak for noise: it rises, then falls, and seldom turns', () => {
    // The record starts just before a crest of a ring 40 000 times the noise: the first 1 % rises and falls by 2000 noise levels.
    for (const seed of [1, 2, 3]) {
      const random = createRandom(seed);
      const values = Float64Array.from({ length: 4000 }, (_, i) => 40000 * Math.cos((2 * Math.PI * (i - 20)) / 400) * Math.exp(-i / 2000) + random.normal());
      expect(recordNoise(values)).toBe(estimateNoise(values));
      expect(recordNoise(values)).toBeLessThan(1.15);
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
      expect(firstDifferenceNoise(values)).toBeGreaterThan(1.5);
      expect(estimateNoiseOfMeans(values)).toBeLessThan(1.15);
      expect(estimateNoiseOfMeans(values)).toBeGreaterThan(0.85);
    }
  });

  /** MAD of the second differences / (0.6745 sqrt 6), written out: what the estimate read before it looked for curvature. */
  const secondDifferenceNoise = (values: Float64Array): number => {
    const differences = Array.from(values.subarray(2), (v, i) => Math.abs(v - 2 * values[i + 1] + values[i])).sort((a, b) => a - b);
    const n = differences.length;
    return (n % 2 ? differences[(n - 1) / 2] : (differences[n / 2 - 1] + differences[n / 2]) / 2) / (0.6745 * Math.sqrt(6));
  };

  it('reads the noise from fourth differences where a ring 1000 times it fills the second differences (a strong ring on means 25 a period)', () => {
    for (const seed of [1, 2, 3]) {
      const values = means(1000, seed);
      expect(secondDifferenceNoise(values)).toBeGreaterThan(2);
      expect(estimateNoiseOfMeans(values)).toBeLessThan(1.2);
      expect(estimateNoiseOfMeans(values)).toBeGreaterThan(0.85);
    }
  });

  it('keeps the second-difference reading of means whose noise is correlated from one to the next (it reads such noise higher than the fourth)', () => {
    for (const seed of [1, 2, 3]) {
      const random = createRandom(seed);
      let noise = random.normal();
      const values = Float64Array.from({ length: 1000 }, () => (noise = 0.8 * noise + 0.6 * random.normal()));
      expect(estimateNoiseOfMeans(values)).toBeCloseTo(secondDifferenceNoise(values), 12);
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
