// A capture refused for its unit or its missing time axis comes back as a refusal the window can show beside its choices, and reads once it is stated.

import { describe, expect, it } from 'vitest';
import { CaptureError } from '../../core/capture/types';
import { unitRefusal } from '../../renderer/unitRefusal';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import type { StatedUnits, WorkerReplyValue } from '../../renderer/workerProtocol';
import { ambiguousMillisecondsCapture } from '../e2e/generatedCaptures';

function open(text: string, units?: StatedUnits) {
  return handleWorkerRequest({ type: 'open', captureId: 'units', name: 'ms.csv', content: { text }, reading: units && { units } }, () => undefined).value as Extract<WorkerReplyValue, { type: 'open' }>;
}

describe('stating a unit in the window', () => {
  it('names the choice that fixes a refused unit instead of the command-line option', () => {
    const time = unitRefusal(new CaptureError("column 'Time (MS)': unit 'MS' is ambiguous (ms (milliseconds) or Ms (megaseconds)); state the time unit with --time-unit", 1));
    expect(time).toEqual({ unit: 'time', message: "line 1: column 'Time (MS)': unit 'MS' is ambiguous (ms (milliseconds) or Ms (megaseconds)); state the time unit with the 'Time in' choice" });
    expect(unitRefusal(new CaptureError("column 'CH1 (Vx)': unit 'Vx' is not recognised; state the channel's unit with --value-unit", 1))?.unit).toBe('value');
    expect(unitRefusal(new CaptureError('no numeric rows', 3))).toBeNull();
    expect(unitRefusal(new Error('with --time-unit'))).toBeNull();
  });

  it('refuses a file without a time axis for its interval, then reads it once the interval is stated', () => {
    const values = Array.from({ length: 400 }, (_, i) => (i < 40 ? 0 : 1 - Math.exp(-(i - 40) / 30) * Math.cos((i - 40) / 5)).toFixed(5));
    const text = `CH1 (V)\n${values.join('\n')}\n`;
    expect(unitRefusal(new CaptureError('no time column and no sample interval stated in the file; give the sample interval (option sampleInterval)', 1))?.unit).toBe('interval');
    const refused = open(text);
    expect(refused.refusal).toEqual({ unit: 'interval', message: "line 1: no time column and no sample interval stated in the file; give the sample interval (the 'Sample interval' field)" });
    const read = handleWorkerRequest(
      { type: 'open', captureId: 'interval', name: 'ch1.csv', content: { text }, reading: { units: { timeUnit: '', valueUnit: '' }, sampleInterval: '2n' } },
      () => undefined,
    ).value as Extract<WorkerReplyValue, { type: 'open' }>;
    expect(read.refusal).toBeNull();
    expect(read.info?.sampleInterval).toBeCloseTo(2e-9, 20);
  });

  it('refuses MS as a time unit, then reads the file in milliseconds once ms is stated', () => {
    const text = ambiguousMillisecondsCapture();
    const refused = open(text);
    expect(refused.info).toBeNull();
    expect(refused.refusal?.unit).toBe('time');
    expect(refused.refusal?.message).toContain("'MS'");
    const read = open(text, { timeUnit: 'ms', valueUnit: '' });
    expect(read.refusal).toBeNull();
    // The sample's own step, 400 ns as its first rows show, comes back from the milliseconds.
    expect(read.info?.sampleInterval).toBeCloseTo(400e-9, 15);
  });
});
