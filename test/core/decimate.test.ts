// Tests of the per-column min/max reduction the window draws long captures with (core/report/decimate.ts).

import { describe, expect, it } from 'vitest';
import { decimateMinMax, lowerBound, reduceMinMax, upperBound } from '../../core/report/decimate';
import { createRandom } from '../../core/random';

/** The project's seeded source, as a uniform generator on [0, 1). */
const seeded = (seed: number): (() => number) => {
  const random = createRandom(seed);
  return () => random.uniform();
};

function ramp(n: number, dt = 1e-9): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => i * dt);
}

describe('reduceMinMax', () => {
  it('returns a short range unchanged', () => {
    const time = ramp(10);
    const values = Float64Array.from(time, (t) => Math.sin(t * 1e9));
    const reduced = reduceMinMax(time, values, -1, 1, 100);
    expect(Array.from(reduced.x)).toEqual(Array.from(time));
    expect(Array.from(reduced.y)).toEqual(Array.from(values));
  });

  it.each([
    { n: 100_000, columns: 800, seed: 1 },
    { n: 1_000_000, columns: 1200, seed: 2 },
    { n: 5_000, columns: 7, seed: 3 },
  ])('keeps at most 2 points per column and every extreme ($n samples, $columns columns)', ({ n, columns, seed }) => {
    const random = seeded(seed);
    const time = ramp(n);
    const values = Float64Array.from(time, () => random() * 2 - 1);
    const spikeAt = Math.floor(n * 0.37);
    values[spikeAt] = 5;
    values[spikeAt + 11] = -5;
    const reduced = reduceMinMax(time, values, time[0], time[n - 1], columns);
    expect(reduced.x.length).toBeLessThanOrEqual(2 * columns);
    expect(Math.max(...reduced.y)).toBe(5);
    expect(Math.min(...reduced.y)).toBe(-5);
    for (let i = 1; i < reduced.x.length; i++) expect(reduced.x[i]).toBeGreaterThan(reduced.x[i - 1]);
    // every kept point is a real sample
    for (let i = 0; i < reduced.x.length; i += 97) {
      const index = Math.round(reduced.x[i] / 1e-9);
      expect(reduced.y[i]).toBe(values[index]);
    }
  });

  it('reduces only the visible range, plus one neighbour on each side', () => {
    const time = ramp(1000, 1);
    const values = Float64Array.from(time, (_, i) => i);
    const reduced = reduceMinMax(time, values, 100, 199, 1000);
    expect(reduced.x.length).toBe(102);
    expect(reduced.y[0]).toBe(99);
    expect(reduced.y[reduced.y.length - 1]).toBe(200);
  });

  it('handles a range with no samples and uneven spacing', () => {
    const time = Float64Array.from([0, 1, 2, 50, 51, 100]);
    const values = Float64Array.from([0, 1, 0, 3, -3, 1]);
    expect(reduceMinMax(time, values, 200, 300, 4).x.length).toBe(1); // only the left neighbour
    const reduced = reduceMinMax(time, values, 0, 100, 2);
    expect(Array.from(reduced.y).sort()).toEqual([-3, 0, 1, 3].sort());
  });

  it('refuses mismatched arrays and a zero column count', () => {
    expect(() => reduceMinMax(ramp(3), ramp(4), 0, 1, 10)).toThrow(/time has 3 samples/);
    expect(() => reduceMinMax(ramp(3), ramp(3), 0, 1, 0)).toThrow(/columns/);
  });

  it('reduces a 10^6-sample trace to at most two points a column plus the edges, keeping its extremes (its speed: npm run bench)', () => {
    const time = ramp(1_000_000);
    const values = Float64Array.from(time, (t) => Math.exp(-t * 2e5) * Math.cos(t * 6e7));
    const reduced = reduceMinMax(time, values, time[0], time[time.length - 1], 1500);
    expect(reduced.x.length).toBeLessThanOrEqual(2 * 1500 + 2);
    const extremes = (y: Float64Array) => y.reduce(([lo, hi], v) => [Math.min(lo, v), Math.max(hi, v)], [Infinity, -Infinity]);
    expect(extremes(reduced.y)).toEqual(extremes(values));
  });
});

describe('decimateMinMax and reduceMinMax', () => {
  it('find the same extremes: the report envelope and the window trace come from one scan', () => {
    const random = seeded(4);
    const time = ramp(50_000);
    const values = Float64Array.from(time, () => random() * 2 - 1);
    values[12_345] = 7;
    values[40_000] = -7;
    const envelope = decimateMinMax(time, values, time[0], time[time.length - 1], 300);
    const reduced = reduceMinMax(time, values, time[0], time[time.length - 1], 300);
    expect(Math.max(...envelope.max)).toBe(Math.max(...reduced.y));
    expect(Math.min(...envelope.min)).toBe(Math.min(...reduced.y));
    expect(reduced.y.length).toBe(2 * envelope.x.length);
  });
});

describe('bounds', () => {
  it.each([
    [-1, 0, 0],
    [0, 0, 1],
    [2.5, 3, 3],
    [9, 9, 10],
    [20, 10, 10],
  ])('at %d: lower %d, upper %d', (value, lower, upper) => {
    const time = Float64Array.from({ length: 10 }, (_, i) => i);
    expect(lowerBound(time, value)).toBe(lower);
    expect(upperBound(time, value)).toBe(upper);
  });
});
