// Where the response fit starts: the event found inside a hand-set window, a record caught in progress and one whose
// level before the event sits at a converter rail fitted without an event (t0 not reported as measured), a response
// from rest after a short flat level, the rail test.

import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { railHeadCount, type KeptRange } from '../../core/fit/railGuard';
import { quantisationStep, recordNoise } from '../../core/fit/noise';
import { fitSetAndSamples } from '../../core/fit/fitSet';
import { locateResponse } from '../../core/fit/responseStart';
import { createRandom } from '../../core/random';
import { makeRecord, sampleCaptureTrace, type RecordSpec } from './trust/startRecords';

const NOT_MEASURED = /not a measured event/;

describe('a hand-set window that holds the event', () => {
  it('finds the event inside it and gives the automatic answer (switch-node-before.csv from -30 ns)', () => {
    const { trace } = sampleCaptureTrace('switch-node-before.csv');
    const automatic = fitResponse(trace);
    const windowed = fitResponse(trace, { window: { start: -30e-9 } });
    expect(windowed.status).toBe('converged');
    expect(windowed.t0.stderr).not.toBeNull();
    expect(Math.abs(windowed.t0.value - automatic.t0.value)).toBeLessThan(automatic.t0.stderr as number);
    expect(Math.abs(windowed.omega0.value - automatic.omega0.value)).toBeLessThan(automatic.omega0.stderr as number);
  });
});

describe('a record caught with its ringdown in progress', () => {
  // The starting phases at which an event used to be placed inside the record, near a peak.
  const RINGDOWN: Omit<RecordSpec, 'eventAt' | 'seed'> = { zeta: 0.03, omega0: 2 * Math.PI * 20e6, samples: 2000, perPeriod: 50, kind: 'ringdown', snrDb: 35, noise: { kind: 'white' } };
  it.each([2, 6])('from %d/8 of a period before the record: fitted without an event, t0 not reported as measured', (eighths) => {
    const fit = fitResponse(makeRecord({ ...RINGDOWN, eventAt: -((eighths / 8) * 50 + 3.3), seed: 4400 + eighths }).trace);
    expect(fit.t0.stderr).toBeNull();
    // Either the event search finds no flat samples to start from (the record's head is inside the ring, so its spread
    // is not taken for noise), or it places an event the fit then does not hold: both say t0 is no measured event.
    expect(fit.warnings.join(' ')).toMatch(new RegExp(`${NOT_MEASURED.source}|t0 was not fitted: the record has no flat samples before the event`));
  });
});

describe('a response that leaves a short flat level from rest', () => {
  // A natural response with no initial slope rises as the square of the time; with a flat head of 2 % the event search
  // placed its start at the first sample, and the free fit from there came out 3 to 5 standard errors low.
  it.each([
    [1.11, 1],
    [2, 2],
  ])('zeta %d: the event is fitted inside the record and alpha and omega0 lie within 3 standard errors', (zeta, seed) => {
    const spec: RecordSpec = { zeta, omega0: 2 * Math.PI * 56e3, samples: 20000, perPeriod: 24000, eventAt: 400.4, kind: 'ringdown', snrDb: 60, noise: { kind: 'white' }, seed: 9100 + seed };
    const { trace, truth } = makeRecord(spec);
    const fit = fitResponse(trace);
    expect(fit.t0.stderr).not.toBeNull();
    expect(fit.t0.value).toBeGreaterThan(trace.time[0]);
    expect(Math.abs(fit.alpha.value - truth.alpha)).toBeLessThan(3 * (fit.alpha.stderr as number));
    expect(Math.abs(fit.omega0.value - truth.omega0)).toBeLessThan(3 * (fit.omega0.stderr as number));
  });
});

describe('a level before the event at a converter rail', () => {
  it('is left out as censored, never fitted as the level before the event', () => {
    const spec: RecordSpec = { zeta: 0.2, omega0: 2 * Math.PI * 5e6, samples: 2000, perPeriod: 40, eventAt: 300.4, kind: 'step', snrDb: 40, noise: { kind: 'white' }, preLevel: -0.1, height: 1.1, converter: { codes: 256, bottom: 0, top: 1.7 }, seed: 7701 };
    const fit = fitResponse(makeRecord(spec).trace);
    expect(fit.warnings.join(' ')).toMatch(/converter rail/);
    expect(fit.t0.stderr).toBeNull();
    expect(fit.preLevel.stderr).toBeNull();
    expect(fit.t0.value).toBeGreaterThan(300.4 / (5e6 * 40));
  });
});

describe('railHeadCount', () => {
  const keptRangeOf = (values: number[]): KeptRange => ({ lo: Math.min(...values), hi: Math.max(...values), step: quantisationStep(values) });
  const random = createRandom(77);
  const codes = (level: number, rms: number, n: number) => Array.from({ length: n }, () => Math.max(0, Math.round(level + rms * random.normal())));
  const response = Array.from({ length: 200 }, (_, i) => Math.round(40 + 10 * Math.sin(i / 5)));

  it('finds no rail in a level a few codes above the lowest value, nor in a noiseless flat one', () => {
    const head = codes(20, 0.4, 200);
    expect(railHeadCount(head, keptRangeOf([...head, ...response]), 0.4)).toBe(0);
    const flat = new Array(200).fill(20);
    expect(railHeadCount(flat, keptRangeOf([...flat, ...response]), 0.2)).toBe(0);
    // Noise of a fifth of a code: the level's code is the lowest value with a few samples one code above it.
    const quiet = [...new Array(197).fill(20), 21, 21, 21];
    expect(railHeadCount(quiet, keptRangeOf([...quiet, ...response]), 0.2)).toBe(0);
  });

  it('finds the samples piled up at the lowest code when the level sits on it or beyond it', () => {
    const atRail = codes(0, 2, 200);
    expect(railHeadCount(atRail, keptRangeOf([...atRail, ...response]), 2)).toBe(atRail.filter((v) => v === 0).length);
    const beyond = new Array(200).fill(0);
    expect(railHeadCount(beyond, keptRangeOf([...beyond, ...response]), 2)).toBe(200);
  });
});

describe('locateResponse', () => {
  it('counts the same censored head when the samples are not in time order', () => {
    const spec: RecordSpec = { zeta: 0.2, omega0: 2 * Math.PI * 5e6, samples: 2000, perPeriod: 40, eventAt: 300.4, kind: 'step', snrDb: 40, noise: { kind: 'white' }, preLevel: -0.1, height: 1.1, converter: { codes: 256, bottom: 0, top: 1.7 }, seed: 7701 };
    const ordered = makeRecord(spec).trace;
    const shuffled = { ...ordered, time: ordered.time.slice(), values: ordered.values.slice(), clipped: ordered.clipped?.slice() };
    // Two head samples trade places, time and value together: the same samples, out of order.
    for (const a of [shuffled.time, shuffled.values, shuffled.clipped ?? new Uint8Array(0)]) [a[40], a[90]] = [a[90], a[40]];
    const locate = (trace: typeof ordered) => {
      const { set, kept } = fitSetAndSamples(trace, {});
      return locateResponse(trace, set, kept, {}, recordNoise(set.values, set.block !== null), quantisationStep(set.values));
    };
    const a = locate(ordered);
    expect(fitSetAndSamples(shuffled, {}).kept.ordered).toBe(false);
    const b = locate(shuffled);
    expect(a.warnings[0]).toMatch(/converter rail: \d+ samples/);
    expect(b.warnings).toEqual(a.warnings);
  });
});
