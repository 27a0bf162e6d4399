// The fit's internal form of its data: zero-weight rows dropped, the rest scaled by the square root of their weight.

import { describe, expect, it } from 'vitest';
import { normalizeFitInput } from '../../core/fit/normalizeFitInput';
import type { CurveModel } from '../../core/fit/types';

const line: CurveModel = { names: ['a', 'b'], evaluate: (p, x) => p[0] + p[1] * x };

describe('normalizeFitInput', () => {
  it('keeps every row unchanged, at weight 1, when no weights are given', () => {
    const x = Float64Array.from([0, 1, 2, 3]);
    const y = [-0, 0.1, 1e-300, -7.25];
    const { problem } = normalizeFitInput(line, { x, y }, [0, 1]);
    expect(Array.from(problem.x)).toEqual([0, 1, 2, 3]);
    expect(Array.from(problem.y)).toEqual(y);
    expect(Object.is(problem.y[0], -0)).toBe(true);
    expect(Array.from(problem.sqrtWeight)).toEqual([1, 1, 1, 1]);
  });

  it('drops the rows of zero weight and scales the others by the square root of theirs', () => {
    const x = [0, 1, 2, 3, 4];
    const y = [1, 2, 3, 4, 5];
    const weights = [4, 0, 2, 0, 0.25];
    const { problem } = normalizeFitInput(line, { x, y, weights }, [0, 1]);
    expect(Array.from(problem.x)).toEqual([0, 2, 4]);
    expect(Array.from(problem.sqrtWeight)).toEqual([2, Math.sqrt(2), 0.5]);
    expect(Array.from(problem.y)).toEqual([2 * 1, Math.sqrt(2) * 3, 0.5 * 5]);
  });
});
