// The samples-per-period check reads the median step only when twice the mean step (a bound on it) could leave
// fewer than the working minimum per period: on uneven axes it says what the median of the sorted steps says.

import { describe, expect, it } from 'vitest';
import type { Channel } from '../../core/capture/types';
import { MIN_SAMPLES_PER_PERIOD, REFUSED_SAMPLES_PER_PERIOD } from '../../core/circuit/measurementChecks';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { summarizeFit } from '../../core/report/fitSummary';
import { runSetupChecks } from '../../core/workflow/setupChecks';

/** A 1 V step ringing at 10 MHz, 20 samples a period (invented data): the fit whose frequency the check reads. */
function ringFit() {
  const n = 600;
  const dt = 5e-9;
  const time = Float64Array.from({ length: n }, (_, i) => (i - 60) * dt);
  const random = createRandom(5);
  const values = time.map((t) => (t < 0 ? 0 : 1 - Math.exp(-2e6 * t) * Math.cos(2 * Math.PI * 1e7 * t)) + 0.002 * random.normal());
  const fit = fitResponse({ time, values, unit: 'V', name: 'CH1' });
  return { fit, summary: summarizeFit('seeded.csv', 'CH1', fit) };
}

/** Axes of `n` samples with their steps drawn by `step` (all positive, so the axis increases strictly). */
function axisOf(n: number, step: (i: number) => number): Float64Array {
  const time = new Float64Array(n);
  for (let i = 1; i < n; i++) time[i] = time[i - 1] + step(i);
  return time;
}

const random = createRandom(7);
const axes: { label: string; time: Float64Array }[] = [
  { label: 'an even axis', time: axisOf(20001, () => 1e-9) },
  { label: 'a jittered axis', time: axisOf(20001, () => 1e-9 * (1 + 0.01 * random.normal())) },
  // An odd count of steps, one more long than short: the median is the long step, near twice the mean (the bound is tight).
  { label: 'alternating short and long steps', time: axisOf(20002, (i) => (i % 2 ? 2e-9 : 1e-15)) },
  { label: 'steps with long gaps (rows missing)', time: axisOf(20001, (i) => (i % 50 ? 1e-9 : 4e-7)) },
  { label: 'a short axis (the steps copied and selected)', time: axisOf(301, (i) => (i % 3 ? 1e-9 : 3e-9)) },
];

/** The check as the median of the sorted steps decides it. */
function expectedCheck(time: Float64Array, frequency: number): { level: string; perPeriod: number } | null {
  const steps = Float64Array.from({ length: time.length - 1 }, (_, i) => time[i + 1] - time[i]).sort();
  const m = steps.length;
  const median = m % 2 ? steps[(m - 1) / 2] : 0.5 * (steps[m / 2 - 1] + steps[m / 2]);
  const perPeriod = 1 / (frequency * median);
  if (perPeriod < REFUSED_SAMPLES_PER_PERIOD) return { level: 'refusal', perPeriod };
  return perPeriod < MIN_SAMPLES_PER_PERIOD ? { level: 'warning', perPeriod } : null;
}

describe('samples-per-period check with the median step bounded by twice the mean', () => {
  const { fit, summary } = ringFit();
  const frequencies = [1e6, 3e7, 5e7, 9.9e7, 1e8, 1.01e8, 2e8, 3.9e8, 4e8, 4.1e8, 1e9];
  it.each(axes)('says what the median step says on $label', ({ time }) => {
    for (const frequency of frequencies) {
      const omegaD = { ...fit.omegaD!, value: 2 * Math.PI * frequency };
      const channel: Pick<Channel, 'time' | 'values' | 'unit'> = { time, values: new Float64Array(time.length), unit: 'V' };
      const check = runSetupChecks({ fit: { ...fit, omegaD }, summary, channel }).find((c) => c.id === 'samples-per-period');
      const expected = expectedCheck(time, omegaD.value / (2 * Math.PI));
      expect(check ? { level: check.level, perPeriod: check.values?.samplesPerPeriod } : null).toEqual(expected);
    }
  });
});
