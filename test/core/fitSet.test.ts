// The fit set: block means never straddle left-out samples, and the uniform view the starting values use.

import { describe, expect, it } from 'vitest';
import { prepareFitSet, uniformValues } from '../../core/fit/fitSet';

const DT = 1e-9;
/** A slow ring over 30 000 samples (so the set is block-averaged), with the samples in `holes` marked clipped. */
function trace(holes: [number, number][]) {
  const n = 30_000;
  const time = Float64Array.from({ length: n }, (_, i) => i * DT);
  const values = time.map((t) => Math.cos(2 * Math.PI * 2e4 * t));
  const clipped = new Uint8Array(n);
  for (const [from, to] of holes) clipped.fill(1, from, to);
  return { time, values, clipped, unit: 'V' };
}

describe('prepareFitSet', () => {
  it('averages only unbroken runs of samples, so each block mean is the mean over one block width', () => {
    const t = trace([
      [5_003, 5_040],
      [17_777, 17_800],
    ]);
    const set = prepareFitSet(t, {});
    const factor = set.decimation?.factor ?? 1;
    expect(factor).toBeGreaterThan(1);
    // A block of `factor` consecutive samples spans (factor - 1) DT; the mean of its times sits mid-block,
    // so the first and last sample of each block are recovered from its time, and none of them is left out.
    for (let k = 0; k < set.time.length; k++) {
      const first = Math.round(set.time[k] / DT - (factor - 1) / 2);
      let mean = 0;
      for (let i = first; i < first + factor; i++) {
        expect(t.clipped[i]).toBe(0);
        mean += t.values[i];
      }
      expect(set.values[k]).toBeCloseTo(mean / factor, 12);
    }
    expect(set.samplesUsed).toBe(set.time.length * factor);
  });

  it('reduces a long record to about 1000 block means, or to blocks of 1/8 of a ring period when the ring is fast', () => {
    const slow = prepareFitSet({ ...trace([]), clipped: undefined }, {});
    expect(slow.decimation?.factor).toBe(30);
    expect(slow.time.length).toBe(1_000);
    // 80 samples a period: blocks of 10, so 3000 means of the 30 000 samples.
    const time = Float64Array.from({ length: 30_000 }, (_, i) => i * DT);
    const fast = prepareFitSet({ time, values: time.map((t) => Math.cos((2 * Math.PI * t) / (80 * DT))), unit: 'V' }, {});
    expect(fast.decimation?.factor).toBe(10);
    expect(fast.time.length).toBe(3_000);
  });

  it('averages an unbroken run inside the window from its first sample, each block mean exactly the mean of its samples', () => {
    const t = { ...trace([]), clipped: undefined };
    const set = prepareFitSet(t, { start: 1_234.5 * DT, end: 29_000 * DT });
    const factor = set.decimation?.factor ?? 1;
    expect(factor).toBeGreaterThan(1);
    expect(set.time.length).toBe(Math.floor((29_000 - 1_235 + 1) / factor));
    for (let k = 0; k < set.time.length; k++) {
      let sumT = 0;
      let sumY = 0;
      for (let i = 1_235 + k * factor; i < 1_235 + (k + 1) * factor; i++) {
        sumT += t.time[i];
        sumY += t.values[i];
      }
      expect(set.time[k]).toBe(sumT / factor);
      expect(set.values[k]).toBe(sumY / factor);
    }
  });

  it('keeps every sample of a record of up to 3000', () => {
    const set = prepareFitSet({ ...trace([]), clipped: undefined }, { end: 2_999 * DT });
    expect(set.decimation).toBeNull();
    expect(set.time.length).toBe(3_000);
  });

  it('keeps every sample when nothing is left out and the record is short', () => {
    const set = prepareFitSet({ ...trace([]), clipped: undefined }, { end: 2_000 * DT });
    expect(set.decimation).toBeNull();
    expect(set.time.length).toBe(2_001);
  });
});

describe('uniformValues', () => {
  it('returns the values themselves when the set has no gaps', () => {
    const set = prepareFitSet({ ...trace([]), clipped: undefined }, { end: 2_000 * DT });
    expect(uniformValues(set)).toBe(set.values);
  });

  it('fills a gap on the uniform grid by straight lines between its neighbours', () => {
    const set = prepareFitSet(trace([[1_000, 1_010]]), { end: 2_000 * DT });
    const grid = uniformValues(set);
    expect(grid.length).toBe(2_001);
    const before = Math.cos(2 * Math.PI * 2e4 * 999 * DT);
    const after = Math.cos(2 * Math.PI * 2e4 * 1_010 * DT);
    expect(grid[1_005]).toBeCloseTo(before + (6 / 11) * (after - before), 12);
    expect(grid[1_500]).toBeCloseTo(Math.cos(2 * Math.PI * 2e4 * 1_500 * DT), 12);
  });
});
