// Event detection: a pre-trigger found despite a sample in the noise's tail, at low SNR, under band-limited noise, and
// none where the record starts moving or its level before the event is too short to fit.

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
    expect(detectEvent(values, 1, 0)).toMatchObject({ index: 0, hasPreEvent: false });
  });

  it('a level of 5 samples before the rise is too short to fit, and the response is taken from its clear departure on', () => {
    const event = detectEvent(record(5, 40, 4).subarray(0, 1000), 1, 0);
    expect(event.hasPreEvent).toBe(false);
    // 8 noise levels of a 40-sample rise of 40 are reached about 9 samples after the onset.
    expect(event.responseFrom).toBeGreaterThan(5);
    expect(event.responseFrom).toBeLessThan(20);
  });

  it('finds the onset under low-pass noise that wanders over a long flat stretch', () => {
    // White noise through a first-order low-pass of neighbour correlation 0.9 (rms 1); the noise estimate
    // from first differences reads it low, as a record's noise estimate does.
    const random = createRandom(5);
    const values = record(1200, 40, 6);
    let wander = 0;
    for (let i = 0; i < values.length; i++) {
      wander = 0.9 * wander + Math.sqrt(1 - 0.81) * random.normal();
      values[i] += wander - (values[i] - (i < 1200 ? 0 : 40 * (1 - Math.exp(-(i - 1200) / 40))));
    }
    const event = detectEvent(values, 0.4, 0);
    expect(event.hasPreEvent).toBe(true);
    expect(Math.abs(event.index - 1200)).toBeLessThan(20);
  });
});
