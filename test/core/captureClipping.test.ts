// Clipping: flat runs at an ADC rail are marked; peaks that merely repeat a code and settled levels are not.

import { describe, expect, it } from 'vitest';
import { detectClipping } from '../../core/capture/detectClipping';
import { parseCapture } from '../../core/capture/parseCapture';
import { createRandom } from '../../core/random';

/** An 8-bit style grid: 256 codes over ±10 V would be 0.078 V; any fixed step will do. */
const LSB = 0.08;
const quantise = (v: number): number => Math.round(v / LSB) * LSB;

/** Ring decaying over `decay` periods, sampled `perPeriod` times per period; `phase` (samples) moves the peaks. */
function ringdown(n: number, perPeriod: number, amplitude: number, phase = 0, decay = 6): Float64Array {
  return Float64Array.from(
    { length: n },
    (_, i) => amplitude * Math.exp(-i / (decay * perPeriod)) * Math.cos((2 * Math.PI * (i - phase)) / perPeriod),
  );
}

function longestRunAtMax(values: Float64Array): number {
  const max = Math.max(...values);
  let best = 0;
  let run = 0;
  for (const v of values) {
    run = v === max ? run + 1 : 0;
    best = Math.max(best, run);
  }
  return best;
}

function count(mask: Uint8Array): number {
  return mask.reduce((sum, m) => sum + m, 0);
}

describe('detectClipping', () => {
  it('does not flag a clean ringdown whose peak repeats once on an 8-bit grid', () => {
    // Samples at ±0.5 sample around the first peak: the top code appears exactly twice in a row.
    const values = ringdown(400, 20, 8, 0.5, 50).map(quantise);
    expect(longestRunAtMax(values)).toBe(2);
    const clipping = detectClipping(values);
    expect(count(clipping.clipped)).toBe(0);
  });

  it('does not flag a finely sampled peak that sits on its top code for several samples', () => {
    const values = ringdown(4000, 200, 8, 37).map(quantise);
    expect(longestRunAtMax(values)).toBeGreaterThanOrEqual(3);
    expect(count(detectClipping(values).clipped)).toBe(0);
  });

  it.each([
    ['finely sampled, 1.5x over the rail', 200, 12],
    ['coarsely sampled, 3x over the rail', 20, 24],
  ])('marks exactly the samples held at the rails: %s', (_, perPeriod, amplitude) => {
    const rail = 8;
    const raw = ringdown(40 * perPeriod, perPeriod, amplitude, 3).map(quantise);
    const values = raw.map((v) => Math.min(rail, Math.max(-rail, v)));
    const clipping = detectClipping(values);
    const expected = raw.map((v) => (v >= rail || v <= -rail ? 1 : 0));
    expect(Array.from(clipping.clipped)).toEqual(Array.from(expected));
    expect(clipping.high).toBeGreaterThan(0);
    expect(clipping.low).toBeGreaterThan(0);
    expect(clipping.highLevel).toBe(rail);
    expect(clipping.lowLevel).toBe(-rail);
  });

  it('marks a rail in a record so finely sampled that the signal enters it by less than one code per sample', () => {
    // 2000 samples a period: at the rail the ring moves about 0.35 code a sample.
    const rail = 8;
    const raw = ringdown(40000, 2000, 12, 3).map(quantise);
    const values = raw.map((v) => Math.min(rail, Math.max(-rail, v)));
    const clipping = detectClipping(values);
    expect(Array.from(clipping.clipped)).toEqual(Array.from(raw.map((v) => (v >= rail || v <= -rail ? 1 : 0))));
  });

  it('marks a rail in noisy unquantised data', () => {
    const random = createRandom(11);
    const rail = 2.5;
    const raw = ringdown(2000, 50, 4, 0).map((v) => v + 0.01 * random.normal());
    const values = raw.map((v) => Math.min(rail, v));
    const clipping = detectClipping(values);
    const atRail = Uint8Array.from(raw, (v) => (v >= rail ? 1 : 0));
    expect(Array.from(clipping.clipped)).toEqual(Array.from(atRail));
    expect(clipping.low).toBe(0);
  });

  // A finely sampled ring whose first peak stands about 3 codes over the rail, with noise of 1.5 codes rms: noise
  // carries single samples back under the rail, breaking its flat run. Over 20 seeded records each way.
  const noisyPeak = (amplitude: number, seed: number): Float64Array => {
    const random = createRandom(seed);
    return ringdown(4000, 340, amplitude, 60, 3).map((v) => quantise(v + 1.5 * LSB * random.normal()));
  };

  it('finds a rail the signal stands only a few codes beyond, where noise carries samples back under it', () => {
    const rail = 8;
    for (let seed = 1; seed <= 20; seed++) {
      const values = noisyPeak(8.75, seed).map((v) => Math.min(rail, v));
      const clipping = detectClipping(values);
      expect(clipping.high, `seed ${seed}`).toBeGreaterThan(0);
      expect(clipping.highLevel).toBe(rail);
      for (let i = 0; i < values.length; i++) if (clipping.clipped[i]) expect(values[i]).toBe(rail);
    }
  });

  it('does not flag the noisy peak of a ring that stays inside the rails', () => {
    for (let seed = 1; seed <= 20; seed++) expect(count(detectClipping(noisyPeak(8, seed)).clipped), `seed ${seed}`).toBe(0);
  });

  it('does not flag a step response settling onto its top code, nor a flat pre-trigger baseline', () => {
    // Overdamped step on the grid: baseline at the minimum code, a steep rise, a long settled top.
    const values = Float64Array.from({ length: 1200 }, (_, i) => (i < 100 ? 0 : quantise(5 * (1 - Math.exp(-(i - 100) / 60)))));
    expect(longestRunAtMax(values)).toBeGreaterThan(100);
    expect(count(detectClipping(values).clipped)).toBe(0);
  });

  it('marks runs at a confirmed rail that touch the ends of the record', () => {
    const rail = 8;
    const raw = ringdown(4000, 200, 12, -20).map(quantise); // the record starts inside a clipped peak
    const values = raw.map((v) => Math.min(rail, Math.max(-rail, v)));
    expect(values[0]).toBe(rail);
    const clipping = detectClipping(values);
    expect(clipping.clipped[0]).toBe(1);
    expect(Array.from(clipping.clipped)).toEqual(Array.from(raw.map((v) => (v >= rail || v <= -rail ? 1 : 0))));
  });

  it('marks a step whose ring is cut at the top for most of each period and then held there to the end', () => {
    // A step to 1.2 times the rail with a ring at 6.25 samples a period: its troughs dip under the rail for a sample or
    // three, so the runs merge into one stretch reaching the record's end. Before, nothing was marked and the fit
    // read f0 44 % low with a 0.45 % error bar.
    const random = createRandom(7);
    const values = Float64Array.from({ length: 4000 }, (_, i) => {
      const k = i - 400;
      const v = k >= 0 ? 1.2 * (1 - Math.exp(-0.015 * k) * Math.cos((2 * Math.PI * k) / 6.25)) : 0;
      return Math.min(1, Math.round((v + 0.01 * random.normal()) / 0.02) * 0.02);
    });
    const marked = count(detectClipping(values).clipped);
    expect(marked).toBeGreaterThan(3000);
    expect(marked).toBe(values.filter((v) => v === 1).length);
  });

  it('marks nothing in a constant channel', () => {
    expect(count(detectClipping(new Float64Array(50).fill(1.2)).clipped)).toBe(0);
  });
});

describe('clipping through the importer', () => {
  it('marks the channel, counts the samples in a warning, and leaves the values alone', () => {
    const rail = 8;
    const raw = ringdown(2000, 100, 12, 3).map(quantise);
    const clippedValues = raw.map((v) => Math.min(rail, Math.max(-rail, v)));
    const rows = Array.from(clippedValues, (v, i) => `${(i * 1e-9).toExponential(4)},${v.toFixed(2)},${(v / 4).toFixed(3)}`);
    const capture = parseCapture(`Time (s),Vds (V),Vprobe (V)\n${rows.join('\n')}\n`);
    const [vds, probe] = capture.channels;
    const high = raw.filter((v) => v >= rail).length;
    const low = raw.filter((v) => v <= -rail).length;
    expect(count(vds.clipped)).toBe(high + low);
    expect(count(probe.clipped)).toBe(high + low);
    expect(Math.max(...vds.values)).toBe(rail);
    expect(capture.warnings).toContain(
      `channel 'Vds': ${high} samples at the top rail (8 V) and ${low} samples at the bottom rail (-8 V) sit in flat runs and look clipped by the ADC; they are marked and left out of fits`,
    );
  });
});
