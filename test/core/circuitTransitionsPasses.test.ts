// transitionMetrics reads the samples after the final level's first crossing in one pass (extremes, the settling
// bands' last exits, the noise peak's) and counts ring crossings only up to the last sample beyond the noise peak:
// checked value for value against the separate full-length scans it replaced.
import { describe, expect, it } from 'vitest';
import { transitionMetrics } from '../../core/circuit/transitions';
import { createRandom } from '../../core/random';
import { evaluateResponse } from '../../core/response/secondOrder';

/** The settling times and ring frequency as the separate scans found them: bands scanned back from the record's end, crossings counted to it. */
function separateScans(time: Float64Array, values: Float64Array, initial: number, final: number, eventTime: number) {
  const n = values.length;
  const amplitude = final - initial;
  const d = (i: number) => (values[i] - initial) / amplitude;
  let start = 0;
  while (start < n - 1 && time[start] < eventTime) start++;
  const rising = (level: number, from: number) => {
    for (let i = Math.max(from, 1); i < n; i++) if (d(i - 1) < level && d(i) >= level) return i;
    return null;
  };
  const at = (i: number, level: number) => time[i - 1] + ((level - d(i - 1)) / (d(i) - d(i - 1))) * (time[i] - time[i - 1]);
  const i50 = rising(0.5, start);
  if (i50 === null) return null;
  const t50 = at(i50, 0.5);
  const settling = (band: number) => {
    let last = -1;
    for (let i = n - 1; i >= i50; i--) {
      if (Math.abs(d(i) - 1) > band) {
        last = i;
        break;
      }
    }
    if (last === n - 1) return null;
    if (last < 0) return 0;
    const target = d(last) > 1 ? 1 + band : 1 - band;
    return time[last] + ((target - d(last)) / (d(last + 1) - d(last))) * (time[last + 1] - time[last]) - t50;
  };
  const i100 = rising(1, i50);
  let ring: number | null = null;
  if (i100 !== null) {
    const from = Math.max(i50, Math.floor(0.8 * n));
    let squares = 0;
    for (let i = from; i < n; i++) squares += (d(i) - 1) ** 2;
    const noisePeak = Math.sqrt(squares / Math.max(1, n - from)) * Math.sqrt(2 * Math.log(n));
    let largest = 0;
    for (let i = i100; i < n; i++) largest = Math.max(largest, Math.abs(d(i) - 1));
    ring = largest < 2 * noisePeak ? null : crossingFrequency(time, d, i100, n, largest, Math.max(0.02 * largest, noisePeak));
  }
  return { settlingTime2: settling(0.02), settlingTime5: settling(0.05), ringFrequency: ring };
}

/** The final level's crossings to the record's end and the weighted slope of their instants. */
function crossingFrequency(time: Float64Array, d: (i: number) => number, i100: number, n: number, largest: number, h: number): number | null {
  const crossing = (i: number) => time[i - 1] + ((1 - d(i - 1)) / (d(i) - d(i - 1))) * (time[i] - time[i - 1]);
  const crossings: { time: number; lobe: number }[] = [];
  let side = -1;
  let firstChange = i100;
  let lastChange = i100;
  let lobe = largest;
  let above = d(i100) - 1 >= 0;
  for (let i = i100 + 1; i < n; i++) {
    const e = d(i) - 1;
    if (e >= 0 !== above) {
      above = !above;
      if (firstChange < 0) firstChange = i;
      lastChange = i;
    }
    lobe = Math.max(lobe, Math.abs(e));
    if ((side < 0 && e > h) || (side > 0 && e < -h)) {
      crossings.push({ time: (crossing(firstChange) + crossing(lastChange)) / 2, lobe });
      side = -side;
      firstChange = -1;
      lobe = 0;
    }
  }
  if (crossings.length < 2) return null;
  const gaps = crossings.slice(1).map((c, i) => c.time - crossings[i].time);
  const guess = [...gaps].sort((a, b) => a - b)[Math.floor(gaps.length / 2)];
  const index = [0];
  gaps.forEach((g) => index.push(index[index.length - 1] + Math.max(1, Math.round(g / guess))));
  const w = crossings.map((c) => c.lobe * c.lobe);
  const sw = w.reduce((a, b) => a + b, 0);
  const meanK = index.reduce((a, k, i) => a + w[i] * k, 0) / sw;
  const meanT = crossings.reduce((a, c, i) => a + w[i] * c.time, 0) / sw;
  let sxy = 0;
  let sxx = 0;
  crossings.forEach((c, i) => {
    sxy += w[i] * (index[i] - meanK) * (c.time - meanT);
    sxx += w[i] * (index[i] - meanK) ** 2;
  });
  return 1 / (2 * (sxy / sxx));
}

function axis(n: number, dt: number, start: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => start + i * dt);
}

/** A step of the second-order response from 0 to `step`, with white noise of rms `noise`; `edit` changes samples after. */
function record(options: { n: number; alpha: number; omega0: number; step: number; noise: number; seed: number; gap?: number; edit?: (values: Float64Array) => void }) {
  const { n, alpha, omega0, step, noise, seed, gap } = options;
  // A gap: the samples from index `gap` on come 200 sample intervals late (rows missing from the export).
  const time = axis(n, 1e-9, -0.1 * n * 1e-9).map((t, i) => (gap !== undefined && i >= gap ? t + 200e-9 : t));
  const random = createRandom(seed);
  const values = evaluateResponse({ t0: 0, yPre: 0, yFinal: step, alpha, omega0, a: -step, b: -step * alpha }, time).map((y) => y + noise * random.normal());
  options.edit?.(values);
  return { time, values };
}

const cases = [
  { label: 'a noisy ring (noise peak above 2 % of the largest excursion)', n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 0.15, seed: 1 },
  { label: 'a clean ring (2 % of the largest excursion above the noise peak)', n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 1e-4, seed: 2 },
  { label: 'a noiseless ring', n: 20000, alpha: 1e6, omega0: 2e7, step: -5, noise: 0, seed: 3 },
  { label: 'a falling ring', n: 20000, alpha: 2e6, omega0: 3e7, step: -48, noise: 0.2, seed: 4 },
  { label: 'an overdamped step that never crosses its final level cleanly', n: 5000, alpha: 3e7, omega0: 1e7, step: 1, noise: 0, seed: 5 },
  { label: 'an overdamped noisy step', n: 5000, alpha: 3e7, omega0: 1e7, step: 1, noise: 0.005, seed: 6 },
  { label: 'a ring still outside the bands at the record end', n: 3000, alpha: 1e4, omega0: 2e7, step: 1, noise: 0.001, seed: 7 },
  {
    label: 'a ring clipped at a rail (a flat run at the extreme)',
    n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 0.05, seed: 8,
    edit: (v: Float64Array) => v.forEach((y, i) => (v[i] = Math.min(y, 18))),
  },
  {
    label: 'a ring with NaN samples in its ring and where it settles',
    n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 0.05, seed: 9,
    edit: (v: Float64Array) => [2500, 2600, 6000, 9000].forEach((i) => (v[i] = NaN)),
  },
  {
    label: 'a ring with a NaN sample in its settled tail (the settled noise is NaN)',
    n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 0.05, seed: 13,
    edit: (v: Float64Array) => (v[19990] = NaN),
  },
  { label: 'a ring with a gap in its time axis', n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 0.05, seed: 12, gap: 3000 },
  {
    label: 'a ring with a run of held samples (a dropout) after it settled',
    n: 20000, alpha: 1e6, omega0: 2e7, step: 12, noise: 0.05, seed: 10,
    edit: (v: Float64Array) => v.fill(v[12000], 12000, 12400),
  },
  {
    label: 'a step jumping straight into the bands (nothing outside them after the final crossing)',
    n: 400, alpha: 1e6, omega0: 2e7, step: 1, noise: 0, seed: 11,
    edit: (v: Float64Array) => v.forEach((_, i) => (v[i] = i < 40 ? 0 : i === 40 ? 0.97 : 1 + 1e-4 * Math.sin(i))),
  },
];

describe('transitionMetrics: one pass after the final crossing, crossings counted to the last sample beyond the noise peak', () => {
  it.each(cases)('gives the separate scans’ settling times and ring frequency on $label', (c) => {
    const { time, values } = record(c);
    const m = transitionMetrics(time, values, { initial: 0, final: c.step, eventTime: 0 });
    const expected = separateScans(time, values, 0, c.step, 0);
    expect(expected).not.toBeNull();
    expect({ settlingTime2: m.settlingTime2, settlingTime5: m.settlingTime5, ringFrequency: m.ringFrequency }).toEqual(expected);
  });

  it('gives them on short records', () => {
    for (const n of [3, 4, 5, 8]) {
      const time = axis(n, 1, 0);
      const values = Float64Array.from({ length: n }, (_, i) => (i === 0 ? 0 : i % 2 ? 1.3 : 0.8));
      const m = transitionMetrics(time, values, { initial: 0, final: 1, eventTime: 0.5 });
      const expected = separateScans(time, values, 0, 1, 0.5);
      expect({ settlingTime2: m.settlingTime2, settlingTime5: m.settlingTime5, ringFrequency: m.ringFrequency }).toEqual(expected);
    }
  });

  it('finds the first sample at or after the event by bisection as the walk did, also for an event past the last sample', () => {
    const { time, values } = record(cases[0]);
    for (const eventTime of [time[0] - 1, time[0], 0, time[time.length - 1], time[time.length - 1] + 1]) {
      const m = transitionMetrics(time, values, { initial: 0, final: 12, eventTime });
      const expected = separateScans(time, values, 0, 12, eventTime);
      if (expected === null) expect(m.instants.t50).toBeNull();
      else expect({ settlingTime2: m.settlingTime2, settlingTime5: m.settlingTime5, ringFrequency: m.ringFrequency }).toEqual(expected);
    }
  });
});
