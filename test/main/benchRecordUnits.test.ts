// The stated units in a bench record's settings: kept when given, absent otherwise, and older records still read.
import { describe, expect, it } from 'vitest';
import { createBenchRecord } from '../../main/app/benchLogRecord';
import { parseBenchRecord, type BenchRecord } from '../../core/report/benchRecord';
import { benchLogRequestProblem } from '../../main/api/guards';
import { sampleMeasurement, sampleRecord } from '../fixtures/benchLog/sampleRecord';

const measurement = sampleMeasurement();
const label = { unit: 'SN042', operator: null, note: null };

/** What the window sends to log a record: the record without its id, time, kind and software. */
function requestOf(record: BenchRecord): Record<string, unknown> {
  const { unit, operator, note, capture, settings, fit, verdict, design, cautions } = record;
  return { unit, operator, note, capture, settings, fit, verdict, design, cautions };
}

describe('stated units in the bench record', () => {
  it('keeps --time-unit and --value-unit as given, and the record parses back', () => {
    const record = createBenchRecord(measurement, label, { timeUnit: 'us', valueUnit: 'mV' });
    expect(record.settings).toMatchObject({ timeUnit: 'us', valueUnit: 'mV' });
    expect(parseBenchRecord(JSON.stringify(record), 1)).toEqual(record);
  });

  it('leaves them out when not given', () => {
    const record = createBenchRecord(measurement, label, {});
    expect(Object.keys(record.settings)).not.toContain('timeUnit');
    expect(Object.keys(record.settings)).not.toContain('valueUnit');
  });

  it('a record written before them still parses and passes the bench API guard', () => {
    const old = sampleRecord();
    expect(parseBenchRecord(JSON.stringify(old), 1).settings).toEqual(old.settings);
    expect(benchLogRequestProblem(requestOf(old))).toBeNull();
  });

  it('the guard takes them as text and refuses anything else', () => {
    const withUnits = sampleRecord({ settings: { ...sampleRecord().settings, timeUnit: 'ns', valueUnit: 'V' } });
    expect(benchLogRequestProblem(requestOf(withUnits))).toBeNull();
    const bad = requestOf(sampleRecord());
    bad.settings = { ...(bad.settings as object), timeUnit: 5 };
    expect(benchLogRequestProblem(bad)).toMatch(/^settings: .*timeUnit/);
  });
});
