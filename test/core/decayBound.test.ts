// The least misfit of a rise-then-fall (or fall-then-rise) sequence, against brute force, and the ring-versus-decay skip it allows.

import { describe, expect, it } from 'vitest';
import { unimodalMisfit } from '../../core/fit/decayBound';

/** Least squared distance to a monotone sequence by brute force over small integer grids is too coarse; use the exact recursion instead. */
function bruteMonotone(y: number[], direction: 1 | -1): number {
  // Isotonic regression by the minimum-lower-set definition: fitted value at i = max over a <= i of min over b >= i of mean(y[a..b]).
  const v = y.map((x) => direction * x);
  const fitted = v.map((_, i) => {
    let best = -Infinity;
    for (let a = 0; a <= i; a++) {
      let low = Infinity;
      for (let b = i; b < v.length; b++) {
        const slice = v.slice(a, b + 1);
        low = Math.min(low, slice.reduce((s, x) => s + x, 0) / slice.length);
      }
      best = Math.max(best, low);
    }
    return best;
  });
  return v.reduce((s, x, i) => s + (x - fitted[i]) ** 2, 0);
}

function bruteUnimodal(y: number[]): number {
  let best = Infinity;
  for (let k = 0; k <= y.length; k++) {
    const head = y.slice(0, k);
    const tail = y.slice(k);
    for (const d of [1, -1] as const) best = Math.min(best, (head.length ? bruteMonotone(head, d) : 0) + (tail.length ? bruteMonotone(tail, d === 1 ? -1 : 1) : 0));
  }
  return best;
}

/** Small seeded generator (a linear congruential one) so the cases are the same on every run. */
function seeded(seed: number): () => number {
  let state = seed;
  return () => ((state = (state * 1664525 + 1013904223) >>> 0) / 2 ** 32);
}

describe('unimodalMisfit', () => {
  it('is zero for a single decay, a jump then a decay, and a rise then a fall', () => {
    expect(unimodalMisfit([0, 0, 5, 4, 3.2, 2.9, 2.8])).toBe(0);
    expect(unimodalMisfit([1, 2, 3, 2, 1])).toBe(0);
    expect(unimodalMisfit([3, 2, 1, 2, 3])).toBe(0);
  });

  it('matches the brute-force least squares on random sequences (isotonic regression by its max-min formula)', () => {
    const random = seeded(7);
    for (let trial = 0; trial < 40; trial++) {
      const y = Array.from({ length: 3 + Math.floor(random() * 9) }, () => Math.round(10 * random()) - 5);
      expect(unimodalMisfit(y)).toBeCloseTo(bruteUnimodal(y), 9);
    }
  });

  it('grows with the swings of a damped ring that a single decay cannot follow', () => {
    const t = Array.from({ length: 400 }, (_, i) => i * 0.05);
    const ring = t.map((x) => 1 - Math.exp(-0.05 * x) * Math.cos(x));
    const overdamped = t.map((x) => 1 - 1.1 * Math.exp(-0.3 * x) + 0.1 * Math.exp(-3 * x));
    expect(unimodalMisfit(ring)).toBeGreaterThan(20);
    expect(unimodalMisfit(overdamped)).toBe(0);
  });
});
