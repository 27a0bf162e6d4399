// A misfit's residual in a few samples standing apart (glitches) is told from one spread along the window (a second
// ring): the event's failure then names the glitches rather than blaming the window.
import { describe, expect, it } from 'vitest';
import { residualBursts } from '../../core/workflow/residualBursts';
import { evaluateResponse, type ResponseParams } from '../../core/response/secondOrder';
import { createRandom } from '../../core/random';
import { measureCapture } from '../../core/workflow/measure';
import type { Channel } from '../../core/capture/types';

const DT = 2e-9;
const N = 3000;
const TIME = Float64Array.from({ length: N }, (_, i) => i * DT);
const RING: ResponseParams = { t0: 0, yPre: 0, yFinal: 0, alpha: 2e5, omega0: 2 * Math.PI * 5e6, a: 10, b: 0 };
const FIT = { params: RING, window: { start: 0, end: TIME[N - 1] } };

function noisy(values: Float64Array, seed: number): Float64Array {
  const random = createRandom(seed);
  return values.map((v) => v + 0.05 * random.normal());
}

describe('residual bursts', () => {
  it('finds two-sample glitches carrying nearly all of a misfit', () => {
    const values = noisy(evaluateResponse(RING, TIME), 1);
    for (const at of [500, 1400, 2300]) {
      values[at] += 30;
      values[at + 1] += 20;
    }
    const bursts = residualBursts(FIT, TIME, values);
    expect(bursts?.samples).toBe(6);
    expect(bursts!.share).toBeGreaterThan(0.99);
  });

  it('finds none where a second ring the model lacks spreads the residual along the window', () => {
    const second = evaluateResponse({ ...RING, omega0: 2 * Math.PI * 7e6, a: 2 }, TIME);
    const values = noisy(evaluateResponse(RING, TIME).map((v, i) => v + second[i]), 2);
    expect(residualBursts(FIT, TIME, values)).toBeNull();
  });

  it("an event's failure names them: two-sample glitches on a ring and its pre-trigger baseline", () => {
    const n = 5000;
    const time = Float64Array.from({ length: n }, (_, i) => (i - 500) * DT);
    const values = noisy(evaluateResponse(RING, time), 3);
    const random = createRandom(4);
    for (let k = 0; k < 25; k++) {
      const at = Math.floor(random.uniform() * (n - 1));
      const height = (random.uniform() < 0.5 ? -1 : 1) * (20 + 20 * random.uniform());
      values[at] += height;
      values[at + 1] += height * (0.3 + 0.7 * random.uniform());
    }
    const channel: Channel = { name: 'CH1', unit: 'V', time, values, clipped: new Uint8Array(n), dropped: 0 };
    const { summary } = measureCapture({ file: 'glitches.csv', channel });
    expect(summary.status).toBe('failed');
    const messages = summary.events!.list.map((e) => e.message);
    expect(messages.some((m) => /^the residual is [\d.]+ times the noise: \d+ % of it in \d+ samples standing apart \(glitches or pickup/.test(m)), messages.join('\n')).toBe(true);
  });
});
