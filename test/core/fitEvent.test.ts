// Event detection: a pre-trigger found despite a sample in the noise's tail, at low SNR, and none where the record starts moving.

import { describe, expect, it } from 'vitest';
import { detectEvent } from '../../core/fit/eventDetection';
import { createRandom } from '../../core/random';

/** 2000 samples: flat until `onset`, then a rise of `height` with time constant 40 samples; unit white noise. */
function record(onset: number, height: number, seed: number): Float64Array {
  const random = createRandom(seed);
  return Float64Array.from({ length: 2000 }, (_, i) => (i < onset ? 0 : height * (1 - Math.exp(-(i - onset) / 40))) + random.normal());
}

describe('detectEvent', () => {
  it('finds the pre-trigger when one of its first samples lies in the noise tail', () => {
    const values = record(200, 40, 1);
    values[3] = 4.5; // beyond 4 noise levels
    const event = detectEvent(values, 1, 0);
    expect(event.hasPreEvent).toBe(true);
    expect(Math.abs(event.index - 200)).toBeLessThan(10);
  });

  it('finds a pre-trigger that stands only 4 noise levels clear, on block means', () => {
    const event = detectEvent(record(600, 4, 2), 1, 0);
    expect(event.hasPreEvent).toBe(true);
    expect(Math.abs(event.index - 600)).toBeLessThan(60);
  });

  it('finds none in a record that starts inside its response', () => {
    const random = createRandom(3);
    const values = Float64Array.from({ length: 2000 }, (_, i) => 40 * Math.exp(-i / 300) + random.normal());
    expect(detectEvent(values, 1, 0)).toEqual({ index: 0, hasPreEvent: false });
  });
});
