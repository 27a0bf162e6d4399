// Building a bench-log record from a measurement: injected clock and id, settings, cautions, checks on labels.
import { describe, expect, it } from 'vitest';
import { createBenchRecord } from '../../main/app/benchLogRecord';
import { checkLabel } from '../../main/app/labels';
import { parseBenchRecord } from '../../core/report/benchRecord';
import { sampleMeasurement } from '../fixtures/benchLog/sampleRecord';

const measurement = sampleMeasurement();

describe('createBenchRecord', () => {
  const record = createBenchRecord(
    measurement,
    { unit: 'SN042', operator: 'M. Okafor', note: null },
    { known: 'C=2.2n', topology: 'series', from: '-5n' },
    { clock: () => new Date('2025-03-14T09:26:53.120Z'), newId: () => '00c0ffee0042' },
  );

  it('fills the fixed layout with the injected time and id, and parses back', () => {
    expect(record).toMatchObject({ record: 'ringbench-measurement', schema: 1, id: '00c0ffee0042', time: '2025-03-14T09:26:53.120Z', unit: 'SN042' });
    expect(record.capture).toEqual({ path: '/bench/sn042.csv', sha256: 'ef'.repeat(32), bytes: 1234, channel: 'CH1' });
    expect(parseBenchRecord(JSON.stringify(record), 1)).toEqual(record);
  });

  it('refuses a measurement whose capture was read without its hash (a record names its capture by it)', () => {
    const unhashed = { ...measurement, capture: { ...measurement.capture, sha256: null } };
    expect(() => createBenchRecord(unhashed, { unit: 'X', operator: null, note: null }, {})).toThrow('a bench-log record needs its capture read with the hash');
  });

  it('keeps the fit settings as given, null where left to the default', () => {
    expect(record.settings).toEqual({ topology: 'series', known: 'C=2.2n', column: null, sampleInterval: null, from: '-5n', to: null, sortTime: false });
  });

  it('logs the fired cautions and stored energy but not the standing advice', () => {
    // 60 V on 1 uF holds 60 uC, above the 45 uC limit of IEC 61010-1 6.3.1.
    expect(record.cautions.fired.map((c) => c.id)).toEqual(['accessible-ac-peak', 'de-energize-50v', 'charge-45uc']);
    expect(record.cautions.energies.capacitor!.value).toBeCloseTo(1.8e-3, 15);
    expect(record.cautions).not.toHaveProperty('advice');
    expect(record.cautions).not.toHaveProperty('deferral');
  });

  it('uses a random 12-hex id and the system clock by default', () => {
    const a = createBenchRecord(measurement, { unit: 'X', operator: null, note: null }, {});
    const b = createBenchRecord(measurement, { unit: 'X', operator: null, note: null }, {});
    expect(a.id).toMatch(/^[0-9a-f]{12}$/);
    expect(a.id).not.toBe(b.id);
    expect(Math.abs(Date.parse(a.time) - Date.now())).toBeLessThan(60_000);
  });
});

describe('checkLabel', () => {
  it.each([
    { text: '  SN042 ', ok: 'SN042' },
    { text: '<script>alert(1)</script>', ok: '<script>alert(1)</script>' }, // kept as typed; escaped in reports
    { text: '', error: /must not be empty/ },
    { text: 'a\tb', error: /control characters/ },
    { text: 'x'.repeat(101), error: /at most 100 characters/ },
  ])('$text', ({ text, ok, error }) => {
    if (ok !== undefined) expect(checkLabel(text, '--unit')).toBe(ok);
    else expect(() => checkLabel(text, '--unit')).toThrow(error);
  });
});
