// Several events in one record: the event search, the chi-square tail, the weighted combination, and the use case.

import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { chiSquareTail } from '../../core/chiSquare';
import { combineEstimates } from '../../core/fit/eventCombination';
import { findEventTrain } from '../../core/fit/eventTrain';
import { UsageError } from '../../core/inputError';
import { quantity } from '../../core/quantity';
import { createRandom } from '../../core/random';
import { fitEvents } from '../../core/workflow/events';
import { pulseTrainChannel, type PulseTrainSpec } from './trust/cases/severalEvents';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const F0 = 1e6;
const OMEGA0 = 2 * Math.PI * F0;
const DT = 1 / (50 * F0);

/** A train of `count` events `spacing` samples apart from sample 100, at zeta 0.05 (a time constant of 159 samples). */
function train(drive: PulseTrainSpec['drive'], count: number, spacing: number, samples: number, noise = 0.01, seed = 1) {
  const events = Array.from({ length: count }, (_, k) => (100 + k * spacing) * DT);
  return { events: events.map((t) => Math.round(t / DT)), channel: pulseTrainChannel({ seed, alpha: 0.05 * OMEGA0, omega0: OMEGA0, dt: DT, samples, events, drive, amplitude: 1, noise }) };
}

describe('findEventTrain', () => {
  it.each([
    ['square-wave edges after the ring has died', 'square', 4, 1000],
    ['kicks 2.5 time constants apart, the ring still going', 'kicks', 5, 400],
    ['square-wave edges 1.3 time constants apart', 'square', 6, 200],
  ] as const)('finds %s, each fitted from after its start to before the next', (_label, drive, count, spacing) => {
    const { events, channel } = train(drive, count, spacing, 100 + count * spacing + 1000);
    const spans = findEventTrain(channel.values).spans;
    expect(spans.map((s) => s.hasOnset)).toEqual(events.map(() => true));
    spans.forEach((span, k) => {
      expect(span.start).toBeGreaterThanOrEqual(events[k]);
      // Found within a quarter ring period and two blocks of 13 samples.
      expect(span.start - events[k]).toBeLessThan(40);
      if (k + 1 < events.length) expect(span.end).toBeLessThanOrEqual(events[k + 1]);
    });
    expect(spans[spans.length - 1].settledAtEnd).toBe(true);
  });

  it('takes a record that starts inside a ring as an event under way, then finds the next', () => {
    const { channel } = train('kicks', 2, 800, 3000);
    const spans = findEventTrain(channel.values.subarray(150)).spans;
    expect(spans.map((s) => s.hasOnset)).toEqual([false, true]);
    expect(spans[0].start).toBeGreaterThan(0);
  });

  it('still finds the events after a record start inside the faint tail of an earlier ring', () => {
    const { channel } = train('kicks', 3, 800, 3000);
    // At sample 500 the first ring is down to e^-2.5, 8 % of its start.
    const spans = findEventTrain(channel.values.subarray(500)).spans;
    expect(spans.filter((s) => s.hasOnset).map((s) => Math.round(s.onset / 100))).toEqual([4, 12]);
  });

  it('finds no second event in single responses of any damping and noise', () => {
    const random = createRandom(8);
    for (let i = 0; i < 24; i++) {
      const zeta = [0.01, 0.05, 0.2, 0.7, 1, 3][i % 6];
      const noise = [0.001, 0.03, 0.1, 0.3][i % 4];
      const event = Math.round(50 + 300 * random.uniform());
      const channel = pulseTrainChannel({ seed: 100 + i, alpha: zeta * OMEGA0, omega0: OMEGA0, dt: DT, samples: 4000, events: [event * DT], drive: i % 2 ? 'kicks' : 'square', amplitude: 1, noise });
      expect(findEventTrain(channel.values).spans.length, `zeta ${zeta}, noise ${noise}`).toBeLessThanOrEqual(1);
    }
  });

  it('finds no second event in a single response under band-limited noise', () => {
    // Noise low-pass filtered to a neighbour correlation rho reads low in first differences.
    for (const rho of [0.5, 0.8, 0.95]) {
      for (const zeta of [0.01, 0.05, 0.3, 1, 3]) {
        for (const noise of [0.003, 0.03, 0.2]) {
          const channel = pulseTrainChannel({ seed: 9, alpha: zeta * OMEGA0, omega0: OMEGA0, dt: DT, samples: 5000, events: [300 * DT], drive: 'kicks', amplitude: 1, noise: 0 });
          const random = createRandom(Math.round(rho * 100 + zeta * 1000 + noise * 1e4));
          let state = 0;
          for (let i = 0; i < channel.values.length; i++) {
            state = rho * state + Math.sqrt(1 - rho * rho) * noise * random.normal();
            channel.values[i] += state;
          }
          expect(findEventTrain(channel.values).spans.length, `rho ${rho}, zeta ${zeta}, noise ${noise}`).toBeLessThanOrEqual(1);
        }
      }
    }
  });

  it('takes no lone spike for an event, during the ring or after it', () => {
    for (const zeta of [0.01, 0.05, 0.3, 1]) {
      for (const size of [0.2, 0.5, 2]) {
        for (const at of [2500, 4000]) {
          const channel = pulseTrainChannel({ seed: 3, alpha: zeta * OMEGA0, omega0: OMEGA0, dt: DT, samples: 5000, events: [300 * DT], drive: 'square', amplitude: 1, noise: 0.01 });
          channel.values[at] += size;
          channel.values[at + 1] += size / 2;
          expect(findEventTrain(channel.values).spans.length, `zeta ${zeta}, spike ${size} at ${at}`).toBeLessThanOrEqual(1);
        }
      }
    }
  });

  it('finds at most one event in each sample capture (each holds one)', () => {
    const folder = path.join(ROOT, 'sample-captures');
    for (const file of readdirSync(folder).filter((f) => f.endsWith('.csv'))) {
      const values = selectChannel(parseCapture(readFileSync(path.join(folder, file), 'utf8'))).values;
      expect(findEventTrain(values).spans.length, file).toBeLessThanOrEqual(1);
    }
  });
});

describe('chiSquareTail', () => {
  // The 5 % and 1 % points of chi-square tables (common practice; e.g. NIST/SEMATECH e-Handbook 1.3.6.7.4, from memory).
  it.each([
    [3.841, 1, 0.05],
    [5.991, 2, 0.05],
    [7.815, 3, 0.05],
    [11.07, 5, 0.05],
    [6.635, 1, 0.01],
    [9.21, 2, 0.01],
    [23.21, 10, 0.01],
  ])('P(chi^2 > %f, %i dof) = %f', (x, dof, p) => {
    expect(chiSquareTail(x, dof)).toBeCloseTo(p, 4);
  });

  it('is 1 at zero and for 2 dof equals exp(-x/2) (the exponential distribution)', () => {
    expect(chiSquareTail(0, 3)).toBe(1);
    for (const x of [0.1, 1, 4, 30]) expect(chiSquareTail(x, 2)).toBeCloseTo(Math.exp(-x / 2), 12);
  });
});

describe('combineEstimates', () => {
  it('weighs by inverse variance and keeps the error when the spread agrees', () => {
    const c = combineEstimates([quantity(10, 1, 's^-1'), quantity(11, 2, 's^-1')])!;
    expect(c.value.value).toBeCloseTo((10 * 1 + 11 / 4) / 1.25, 12);
    expect(c.chiSquare).toBeCloseTo(0.2, 12);
    expect(c.scale).toBe(1);
    expect(c.value.stderr).toBeCloseTo(1 / Math.sqrt(1.25), 12);
  });

  it('scales the error by sqrt(chi^2 / dof) when the spread exceeds the stated errors', () => {
    const c = combineEstimates([quantity(10, 1, ''), quantity(20, 1, '')])!;
    expect(c.chiSquare).toBeCloseTo(50, 12);
    expect(c.scale).toBeCloseTo(Math.sqrt(50), 12);
    expect(c.value.stderr).toBeCloseTo(5, 12);
    expect(c.pValue).toBeLessThan(1e-6);
  });

  it('needs two estimates with errors', () => {
    expect(combineEstimates([quantity(1, 0.1, '')])).toBeNull();
    expect(combineEstimates([quantity(1, 0.1, ''), quantity(1, null, '')])).toBeNull();
  });
});

describe('fitEvents', () => {
  const { channel } = train('square', 3, 900, 3500);
  const alpha = 0.05 * OMEGA0;

  it('fits the first complete event, lists each, and combines them with the spread test', () => {
    const { fit, summary } = fitEvents({ file: 'train.csv', channel });
    const events = summary.events!;
    expect(events.list.map((e) => [e.index, e.complete, e.status])).toEqual([
      [1, true, 'converged'],
      [2, true, 'converged'],
      [3, true, 'converged'],
    ]);
    expect(events.chosen).toBe(1);
    // The fit may start a little later where the response surely runs, never outside the event.
    expect(fit.window.start).toBeGreaterThanOrEqual(events.list[0].start);
    expect(fit.window.end).toBeLessThanOrEqual(events.list[0].end);
    expect(Math.abs(fit.alpha.value - alpha)).toBeLessThan(3 * fit.alpha.stderr!);
    const combined = events.combined!;
    expect(combined.events).toEqual([1, 2, 3]);
    expect(combined.status).toBe('converged');
    expect(Math.abs(combined.alpha.value - alpha)).toBeLessThan(3 * combined.alpha.stderr!);
    expect(combined.alpha.stderr!).toBeLessThan(fit.alpha.stderr!);
    expect(Math.abs(combined.omega0.value - OMEGA0)).toBeLessThan(3 * combined.omega0.stderr!);
  });

  it('measures the event asked for, and refuses one beyond those found, naming how many there are', () => {
    const { summary } = fitEvents({ file: 'train.csv', channel, event: 2 });
    expect(summary.events!.chosen).toBe(2);
    expect(summary.window.start).toBeGreaterThanOrEqual(summary.events!.list[1].start);
    expect(summary.window.end).toBeLessThanOrEqual(summary.events!.list[1].end);
    expect(() => fitEvents({ file: 'train.csv', channel, event: 4 })).toThrow(UsageError);
    expect(() => fitEvents({ file: 'train.csv', channel, event: 4 })).toThrow(/holds 3 events/);
  });

  it('declares the combination inconsistent when the circuit changed between events', () => {
    // Two records of different damping end to end: the events disagree far beyond their errors.
    const first = pulseTrainChannel({ seed: 3, alpha, omega0: OMEGA0, dt: DT, samples: 1500, events: [100 * DT], drive: 'kicks', amplitude: 1, noise: 0.005 });
    const second = pulseTrainChannel({ seed: 4, alpha: 1.5 * alpha, omega0: OMEGA0, dt: DT, samples: 1500, events: [100 * DT], drive: 'kicks', amplitude: 1, noise: 0.005 });
    const time = Float64Array.from({ length: 3000 }, (_, i) => i * DT);
    const values = new Float64Array(3000);
    values.set(first.values);
    values.set(second.values, 1500);
    const { summary } = fitEvents({ file: 'changed.csv', channel: { ...first, time, values, clipped: new Uint8Array(3000) } });
    const combined = summary.events!.combined!;
    expect(combined.status).toBe('inconsistent');
    expect(combined.consistency.alpha.pValue).toBeLessThan(combined.consistency.pLimit);
    expect(combined.consistency.alpha.scale).toBeGreaterThan(1);
  });

  // 0.5 MHz at zeta 0.01, sampled every ns for 3 us after a flat start of 150 ns: the record turns twice, so the
  // search's blocks are a 64th of it and the ring's own swings rise through them like new events.
  const slowOmega0 = 2 * Math.PI * 0.5e6;
  const slowAlpha = 0.01 * slowOmega0;
  const slowRing = (i: number) => (i < 150 ? 1 : Math.exp(-slowAlpha * (i - 150) * 1e-9) * Math.cos(Math.sqrt(slowOmega0 ** 2 - slowAlpha ** 2) * (i - 150) * 1e-9));
  /** 3000 samples a ns apart of `shape` (of the sample index) plus white noise of rms 0.01. */
  function slowChannel(shape: (i: number) => number, seed: number) {
    const random = createRandom(seed);
    const time = Float64Array.from({ length: 3000 }, (_, i) => i * 1e-9);
    const values = Float64Array.from({ length: 3000 }, (_, i) => shape(i) + 0.01 * random.normal());
    return { name: 'generated', unit: 'V', time, values, clipped: new Uint8Array(3000), dropped: 0 };
  }

  it.each([1, 2, 3, 4, 5])('fits whole a ring slower than the search can read (1.4 periods after a flat start), seed %i', (seed) => {
    const channel = slowChannel(slowRing, seed);
    expect(findEventTrain(channel.values).ringPeriodRead).toBe(false);
    const { fit, summary } = fitEvents({ file: 'slow.csv', channel });
    expect(summary.events).toBeUndefined();
    expect(fit.status).toBe('converged');
    expect(fit.warnings.some((w) => /are taken for one response \(it turns fewer than 3 times\)/.test(w))).toBe(true);
    expect(Math.abs(fit.alpha.value - slowAlpha)).toBeLessThan(3 * fit.alpha.stderr!);
    expect(Math.abs(fit.omega0.value - slowOmega0)).toBeLessThan(3 * fit.omega0.stderr!);
  });

  it('keeps the events of such a record when a step cuts into it: one response cannot fit both', () => {
    const channel = slowChannel((i) => slowRing(i) + (i < 2000 ? 0 : 2 * (1 - Math.exp(-(i - 2000) / 20))), 1);
    expect(findEventTrain(channel.values).ringPeriodRead).toBe(false);
    const { fit, summary } = fitEvents({ file: 'stepped.csv', channel });
    expect(summary.events!.list.length).toBeGreaterThan(1);
    expect(fit.warnings.some((w) => /are taken for one response/.test(w))).toBe(false);
  });

  it('leaves a record of one event as it was, and refuses --event 2 there', () => {
    const single = pulseTrainChannel({ seed: 5, alpha, omega0: OMEGA0, dt: DT, samples: 1500, events: [100 * DT], drive: 'square', amplitude: 1, noise: 0.01 });
    expect(fitEvents({ file: 'one.csv', channel: single }).summary.events).toBeUndefined();
    expect(() => fitEvents({ file: 'one.csv', channel: single, event: 2 })).toThrow(/holds 1 event$/);
  });
});
