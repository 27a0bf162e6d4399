// A step caught after its event has no level before it and no step start: the verdict checks neither that level
// nor the swing at the event, gives no verdict against step-metric limits, and a record with its event keeps
// the fitted level before it with its standard error (the summary every face hands the verdict carries it).
import { describe, expect, it } from 'vitest';
import type { Channel } from '../../core/capture/types';
import { parseDesign } from '../../core/circuit/design';
import { measureCapture, verdictRefusal } from '../../core/workflow/measure';
import { ALPHA, DT, OMEGA0, stepDesignJson as design, stepSamples } from '../fixtures/stepFromRest';

const NOISE = 0.005;

/** 4000 samples with 5 mV of seeded noise, the first at `firstSample` samples after the event. */
function stepChannel(firstSample: number, seed: number): Channel {
  const { time, values } = stepSamples(4000, firstSample, seed, NOISE);
  return { name: 'CH1', unit: 'V', time, values, clipped: new Uint8Array(time.length), dropped: 0 };
}

describe('a step caught after its event', () => {
  it('passes a board built to its design without judging the level before the event or the step metrics', () => {
    // Before this was handled, the model's value at the first sample (0.15 V) failed as the initial level and the
    // overshoot from it (43 % for 37 %) failed a stated limit: a good board rejected.
    const result = measureCapture({ file: 'late.csv', channel: stepChannel(9, 31), design: parseDesign(design()) });
    expect(result.summary.startsInResponse).toBe(true);
    expect(result.summary.preLevel).toBeUndefined();
    expect(result.summary.transitions!.reason).toMatch(/starts inside the response/);
    const verdict = result.verdict!;
    expect(verdict.quantities.map((q) => q.name)).not.toContain('initial level');
    expect(verdict.quantities.map((q) => q.name)).toContain('final value');
    expect(verdict.notes.join(' ')).toMatch(/starts after the event: the level before it is not observed/);
    expect(verdict.pass).toBe(true);
    // No event time: the prediction placed at the first sample differed from the samples by 33 mV rms (noise 5 mV).
    expect(verdict.rmsDifference).toBeNull();
    expect(verdict.notes.join(' ')).toMatch(/No event time is known/);
  });

  it('a window set after the event, with the event time from the whole record, places the prediction but judges no level before it', () => {
    const channel = stepChannel(-400, 34);
    const result = measureCapture({ file: 'whole.csv', channel, design: parseDesign(design()), window: { start: 10 * DT }, eventTime: 0 });
    expect(result.summary.startsInResponse).toBe(true);
    const verdict = result.verdict!;
    expect(verdict.quantities.map((q) => q.name)).not.toContain('initial level');
    // The prediction at the true event matches the samples to about their noise.
    expect(verdict.rmsDifference!).toBeLessThan(2 * NOISE);
  });

  it('gets no verdict against an overshoot limit, which it cannot decide', () => {
    const limits = ', "limits": { "overshoot": { "upper": "40 %" } }';
    const limited = parseDesign(design(limits));
    const result = measureCapture({ file: 'late.csv', channel: stepChannel(9, 32), design: limited });
    expect(result.verdict).toBeNull();
    expect(result.problems.verdict).toBeNull();
    expect(verdictRefusal(limited, result.summary, result.setupChecks)).toMatch(/does not decide the design limits overshoot \(the fit window starts inside the response/);
    // With the event in the record the same limit is decided: the overshoot exp(-pi zeta / sqrt(1 - zeta^2)) = 37 % passes.
    const whole = measureCapture({ file: 'whole.csv', channel: stepChannel(-400, 32), design: limited });
    expect(whole.verdict!.quantities.find((q) => q.name === 'overshoot')!.measured.value).toBeCloseTo(100 * Math.exp(-Math.PI * ALPHA / Math.sqrt(OMEGA0 ** 2 - ALPHA ** 2)), 0);
    expect(whole.verdict!.pass).toBe(true);
  });

  it('with the event in the record, the level before it is judged with its standard error', () => {
    const result = measureCapture({ file: 'whole.csv', channel: stepChannel(-400, 33), design: parseDesign(design()) });
    expect(result.summary.startsInResponse).toBeUndefined();
    expect(result.verdict!.rmsDifference!).toBeLessThan(2 * NOISE);
    const fitted = result.summary.preLevel!;
    // 400 samples before the event with 5 mV of noise: a standard error near 5 mV / sqrt(400) = 0.25 mV.
    expect(fitted.stderr).toBeGreaterThan(0.1e-3);
    expect(fitted.stderr).toBeLessThan(1e-3);
    const initial = result.verdict!.quantities.find((q) => q.name === 'initial level')!;
    expect(initial.measured.stderr).toBe(fitted.stderr);
    expect(Math.abs(initial.measured.value)).toBeLessThan(4 * fitted.stderr!);
  });
});
