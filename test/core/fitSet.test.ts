// The fit set: block means never straddle left-out samples, and the uniform view the starting values use.

import { describe, expect, it } from 'vitest';
import { fitSetAndSamples, prepareFitSet, uniformValues } from '../../core/fit/fitSet';

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

describe('prepareFitSet on a long record with left-out samples', () => {
  /** A slow ring over 50 000 samples with NaN cells and clipped runs, and two samples out of time order when `swap`. */
  function holed(swap: boolean) {
    const n = 50_000;
    const time = Float64Array.from({ length: n }, (_, i) => i * DT);
    const values = time.map((t) => Math.exp(-t / 2e-5) * Math.sin(2 * Math.PI * 3e4 * t) + 1e-3 * Math.sin(1.7 * t * 1e9));
    const clipped = new Uint8Array(n);
    for (const i of [7, 12_345, 12_346, 40_001]) values[i] = NaN;
    clipped.fill(1, 20_000, 20_013);
    clipped[33_333] = 1;
    if (swap) [time[100], time[101], values[100], values[101]] = [time[101], time[100], values[101], values[100]];
    return { time, values, clipped, unit: 'V' };
  }

  it('gives block means equal to the mean of each unbroken block, restarted after every left-out sample', () => {
    const t = holed(false);
    const set = prepareFitSet(t, { start: 3 * DT });
    const factor = set.decimation?.factor ?? 1;
    expect(factor).toBe(50);
    const means: number[] = [];
    const times: number[] = [];
    let run: number[] = [];
    for (let i = 3; i < t.time.length; i++) {
      if (t.clipped[i] || !Number.isFinite(t.values[i])) {
        run = [];
        continue;
      }
      run.push(i);
      if (run.length === factor) {
        times.push(run.reduce((s, k) => s + t.time[k], 0) / factor);
        means.push(run.reduce((s, k) => s + t.values[k], 0) / factor);
        run = [];
      }
    }
    expect(Array.from(set.time)).toEqual(times);
    expect(Array.from(set.values)).toEqual(means);
  });

  it('keeps the samples it was made of: the unclipped finite ones in the window, their extremes and whether they are in time order', () => {
    for (const swap of [false, true]) {
      const t = holed(swap);
      const { kept: samples } = fitSetAndSamples(t, { start: 3 * DT, end: 45_000 * DT });
      const kept = [...t.time.keys()].filter((i) => i >= 3 && i <= 45_000 && !t.clipped[i] && Number.isFinite(t.values[i]));
      expect(Array.from(samples.time)).toEqual(kept.map((i) => t.time[i]));
      expect(Array.from(samples.values)).toEqual(kept.map((i) => t.values[i]));
      expect(samples.lo).toBe(Math.min(...kept.map((i) => t.values[i])));
      expect(samples.hi).toBe(Math.max(...kept.map((i) => t.values[i])));
      expect(samples.ordered).toBe(!swap);
    }
  });

  it('reads an unbroken run in place', () => {
    const t = { ...trace([]), clipped: undefined };
    const { kept: samples } = fitSetAndSamples(t, { start: 10 * DT });
    expect(samples.values.buffer).toBe(t.values.buffer);
    expect(samples.values.length).toBe(t.values.length - 10);
  });
});
