// Matrix pencil starting values: poles of a known damped ring, and no poles (rather than no answer) for a constant.

import { describe, expect, it } from 'vitest';
import { matrixPencil } from '../../core/fit/pencil';

describe('matrixPencil', () => {
  it('recovers the poles of a damped ring on a level', () => {
    const decay = -0.02;
    const turn = 0.3;
    const y = Array.from({ length: 120 }, (_, i) => 2 + Math.exp(decay * i) * Math.cos(turn * i + 0.4));
    const ring = matrixPencil(y, 3).filter((p) => Math.abs(p.im) > 1e-6);
    expect(ring).toHaveLength(2);
    for (const p of ring) {
      expect(p.re).toBeCloseTo(decay, 8);
      expect(Math.abs(p.im)).toBeCloseTo(turn, 8);
    }
  });

  it.each([12.4, 1 / 3])('returns no poles for 63 samples of %d, where the SVD of the Hankel matrix never ends', (level) => {
    expect(matrixPencil(new Array(63).fill(level), 3)).toEqual([]);
    expect(matrixPencil(new Array(63).fill(level), 2)).toEqual([]);
  });
});
