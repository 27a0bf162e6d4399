// A capture refused for its unit comes back as a refusal the window can show beside its unit choices, and reads once a unit is stated.

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
