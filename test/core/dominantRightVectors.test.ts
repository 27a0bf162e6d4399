// dominantRightVectors against boundedSvd (one-sided Jacobi): the same singular values and dominant right subspaces on random, Hankel, rank-deficient and scaled matrices; null for non-finite input.

import { describe, expect, it } from 'vitest';
import { boundedSvd } from '../../core/fit/boundedSvd';
import { dominantRightVectors } from '../../core/fit/dominantRightVectors';
import { createRandom } from '../../core/random';

function ringHankel(seed: number, noise: number, rows = 80, columns = 41): number[][] {
  const random = createRandom(seed);
  const y = Array.from({ length: rows + columns - 1 }, (_, i) => 0.7 + Math.exp(-0.02 * i) * Math.cos(0.35 * i + 0.4) + noise * random.normal());
  return Array.from({ length: rows }, (_, i) => y.slice(i, i + columns));
}

function randomMatrix(seed: number, m: number, n: number, scale = 1): number[][] {
  const random = createRandom(seed);
  return Array.from({ length: m }, () => Array.from({ length: n }, () => scale * random.normal()));
}

const CASES: [string, number[][]][] = [
  ['ring Hankel 80 x 41, noise 1e-3', ringHankel(1, 1e-3)],
  ['ring Hankel 80 x 41, no noise', ringHankel(2, 0)],
  ['random 17 x 9', randomMatrix(3, 17, 9)],
  ['random 9 x 9', randomMatrix(4, 9, 9)],
  ['random 40 x 3 times 1e-200', randomMatrix(5, 40, 3, 1e-200)],
  ['random 12 x 5 times 1e200', randomMatrix(6, 12, 5, 1e200)],
  ['rank two 30 x 10', randomMatrix(7, 30, 2).map((row) => Array.from({ length: 10 }, (_, j) => row[0] * j + row[1] * (j % 3)))],
  ['one column', randomMatrix(8, 6, 1)],
  ['zeros 5 x 3', randomMatrix(9, 5, 3, 0)],
];

describe('dominantRightVectors', () => {
  it.each(CASES)('%s: the values and the top right singular vectors of boundedSvd', (_name, a) => {
    const reference = boundedSvd(a);
    const count = Math.min(3, a[0].length);
    const result = dominantRightVectors(a, count);
    expect(reference?.converged).toBe(true);
    if (!reference || !result) throw new Error('no decomposition');
    const largest = reference.values[0];
    result.values.forEach((s, k) => expect(Math.abs(s - reference.values[k])).toBeLessThanOrEqual(1e-13 * largest));
    for (let c = 0; c < count; c++) {
      // A vector is determined (up to sign) where its value stands apart from its neighbours.
      const gap = Math.min(c > 0 ? reference.values[c - 1] - reference.values[c] : Infinity, c + 1 < a[0].length ? reference.values[c] - reference.values[c + 1] : Infinity);
      if (!(gap > 1e-6 * largest)) continue;
      const cosine = reference.V.reduce((sum, row, i) => sum + row[c] * result.V[i][c], 0);
      expect(1 - Math.abs(cosine)).toBeLessThan(1e-12);
      expect(result.V.reduce((sum, row) => sum + row[c] * row[c], 0)).toBeCloseTo(1, 14);
    }
  });

  it('returns null for NaN or Infinity and refuses wide matrices', () => {
    const a = randomMatrix(10, 8, 4);
    a[3][2] = Number.NaN;
    expect(dominantRightVectors(a, 2)).toBeNull();
    a[3][2] = -Infinity;
    expect(dominantRightVectors(a, 2)).toBeNull();
    expect(() => dominantRightVectors(randomMatrix(11, 3, 4), 1)).toThrow(RangeError);
  });
});
