// The median by selection gives exactly the sorted median, on ordered, repeated, signed-zero and hostile inputs.

import { describe, expect, it } from 'vitest';
import { median, robustSpread } from '../../core/fit/noise';
import { createRandom } from '../../core/random';

/** The definition: sort a copy, take the middle (the mean of the two middles for an even count). */
function sortedMedian(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  if (n === 0) return NaN;
  return n % 2 ? sorted[(n - 1) >> 1] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
}

describe('median by selection', () => {
  const random = createRandom(11);
  const shapes: Record<string, (n: number) => number[]> = {
    'normal noise': (n) => Array.from({ length: n }, () => random.normal()),
    'three codes': (n) => Array.from({ length: n }, () => Math.floor(3 * random.uniform())),
    'rising ramp': (n) => Array.from({ length: n }, (_, i) => i),
    'falling ramp': (n) => Array.from({ length: n }, (_, i) => n - i),
    'organ pipe': (n) => Array.from({ length: n }, (_, i) => Math.min(i, n - i)),
    'one value': (n) => new Array<number>(n).fill(4.5),
    'signed zeros and extremes': (n) => Array.from({ length: n }, (_, i) => (i % 3 === 0 ? -0 : i % 3 === 1 ? 1e300 : -1e-300)),
    'a NaN among them': (n) => Array.from({ length: n }, (_, i) => (i === 1 ? NaN : i)),
  };
  for (const [name, make] of Object.entries(shapes)) {
    it(`equals the sorted median: ${name}`, () => {
      for (const n of [1, 2, 3, 4, 5, 16, 17, 1000, 1001, 65536]) {
        const values = make(n);
        expect(Object.is(median(values), sortedMedian(values)) || median(values) === sortedMedian(values)).toBe(true);
      }
    });
  }

  it('is NaN for no values and leaves its input untouched', () => {
    expect(median([])).toBeNaN();
    const values = [5, 1, 4, 2, 3];
    median(values);
    expect(values).toEqual([5, 1, 4, 2, 3]);
  });

  it('robustSpread is 1.4826 times the median absolute deviation', () => {
    const values = [1, 2, 3, 4, 100];
    // median 3, deviations 2 1 0 1 97: their median is 1.
    expect(robustSpread(values)).toBeCloseTo(1.4826, 12);
  });

  it('robustSpread gives exactly the sorted definition, in a room of its own or one shared by longer stretches before', () => {
    const room = new Float64Array(5_000).fill(7);
    for (const [name, make] of Object.entries(shapes)) {
      for (const n of [1, 2, 5, 16, 1001, 4096]) {
        const values = Float64Array.from(make(n));
        const untouched = Float64Array.from(values);
        const centre = sortedMedian(values);
        const definition = 1.4826 * sortedMedian(values.map((v) => Math.abs(v - centre)));
        const same = (x: number) => Object.is(x, definition) || x === definition;
        expect(same(robustSpread(values)), name).toBe(true);
        expect(same(robustSpread(values, room)), name).toBe(true);
        expect(values).toEqual(untouched);
      }
    }
  });
});
