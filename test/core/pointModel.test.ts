// The fitted response read a chunk at a time over a long record: the same values as the whole axis computed at once, and
// every chunk inside the range the model is said to stay in (which lets the rail test pass over chunks far from a rail).

import { describe, expect, it } from 'vitest';
import { PointModel, type ModelRange } from '../../core/fit/pointModel';
import { evaluateResponse, type ResponseParams } from '../../core/response/secondOrder';
import { createRandom } from '../../core/random';

const SAMPLES = 40_000;

/** An axis of SAMPLES times dt apart starting at `start`: exact, printed to 9 significant digits as scopes do, or jittered. */
function axis(kind: 'even' | 'printed' | 'jittered', start: number, dt: number): Float64Array {
  const random = createRandom(7);
  return Float64Array.from({ length: SAMPLES }, (_, i) => {
    const t = start + i * dt;
    if (kind === 'printed') return Number(t.toPrecision(9));
    return kind === 'jittered' ? t + (random.uniform() - 0.5) * 0.2 * dt : t;
  });
}

const REGIMES: Array<[string, ResponseParams]> = [
  ['underdamped', { t0: 0, yPre: 0.2, yFinal: 12, alpha: 4e4, omega0: 2 * Math.PI * 2e5, a: -11.8, b: 3e5 }],
  ['overdamped', { t0: 0, yPre: -3, yFinal: 1, alpha: 9e5, omega0: 2e5, a: 4, b: -2e6 }],
  ['near critical', { t0: 0, yPre: 5, yFinal: 0, alpha: 2e5, omega0: 2e5 * (1 + 1e-9), a: -5, b: 1e6 }],
  ['growing', { t0: 0, yPre: 0, yFinal: 0, alpha: -2e3, omega0: 2 * Math.PI * 5e4, a: 1, b: 0 }],
];

/** The free-pre layout's parameter vector (t0 held) for the params. */
function freePre(p: ResponseParams): number[] {
  return [p.alpha, p.omega0, p.yPre, p.yFinal, p.a, p.b];
}

describe('PointModel', () => {
  describe.each(REGIMES)('%s', (_name, params) => {
    it.each(['even', 'printed', 'jittered'] as const)('on an axis %s: the values of the whole span to the bit, within each chunk range', (kind) => {
      const time = axis(kind, -2e-5, 2.5e-9);
      const from = 1234;
      const to = SAMPLES - 321;
      const whole = evaluateResponse(params, time.subarray(from, to));
      const model = new PointModel('free-pre', freePre(params), params.t0, time);
      let visited = 0;
      let differing = 0;
      let outside = 0;
      let range: ModelRange = { lo: NaN, hi: NaN };
      model.forEachChunk(
        from,
        to,
        (first, y) => {
          for (let k = 0; k < y.length; k++) {
            if (!Object.is(y[k], whole[first - from + k])) differing++;
            if (!(y[k] >= range.lo && y[k] <= range.hi)) outside++;
          }
          visited += y.length;
        },
        (r) => {
          range = r;
          return false;
        },
      );
      expect({ visited, differing, outside }).toEqual({ visited: to - from, differing: 0, outside: 0 });
    });
  });

  it('skips the chunks the caller turns down, computing none of them', () => {
    const [, params] = REGIMES[0];
    const time = axis('even', -2e-5, 2.5e-9);
    const model = new PointModel('free-pre', freePre(params), params.t0, time);
    const firsts: number[] = [];
    // Only chunks that may reach above 20 V: the first overshoot, none of the pre-event chunks or of the late ring.
    model.forEachChunk(0, SAMPLES, (first) => firsts.push(first), ({ hi }) => hi < 20);
    const peak = evaluateResponse(params, time).reduce((m, v, i) => (v > 20 ? i : m), -1);
    expect(firsts.length).toBeGreaterThan(0);
    expect(firsts.length).toBeLessThan(SAMPLES / 8192);
    expect(firsts.some((first) => first <= peak && peak < first + 8192)).toBe(true);
  });
});
