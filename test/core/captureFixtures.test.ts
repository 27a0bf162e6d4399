// The hand-written bench exports in test/fixtures/capture: layout, channels, units, timing and dropped cells.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';

const folder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../fixtures/capture');
const read = (name: string): string => readFileSync(path.join(folder, name), 'utf8');

interface Expected {
  file: string;
  layout: { delimiter: string; decimalComma: boolean; headerLine: number | null; firstDataLine: number; rows: number };
  channels: { name: string; unit: string; samples: number; dropped: number; firstTime: number; firstValue: number }[];
  sampleInterval: number;
  metadata: Record<string, string>;
  warnings: RegExp[];
}

const cases: Expected[] = [
  {
    // BOM, CRLF, comments, key/value lines, mV scaled to V; the flat pre-trigger level is not a rail.
    file: 'gate-loop-preamble.csv',
    layout: { delimiter: ',', decimalComma: false, headerLine: 7, firstDataLine: 8, rows: 60 },
    channels: [
      { name: 'Vgs', unit: 'V', samples: 60, dropped: 0, firstTime: -24e-9, firstValue: 15 },
      { name: 'Id', unit: 'A', samples: 60, dropped: 0, firstTime: -24e-9, firstValue: 0.002 },
    ],
    sampleInterval: 2e-9,
    metadata: { Instrument: 'Bench scope B', 'Record Length': '60', 'Sample Interval': '2e-9' },
    warnings: [],
  },
  {
    // Semicolons, decimal comma, time in µs, current in mA, NaN / empty / 9,9E37 / **** cells.
    file: 'lc-filter-decimal-comma.csv',
    layout: { delimiter: ';', decimalComma: true, headerLine: 4, firstDataLine: 5, rows: 40 },
    channels: [
      { name: 'V_out', unit: 'V', samples: 37, dropped: 3, firstTime: 0, firstValue: 26.5 },
      { name: 'I_L', unit: 'A', samples: 39, dropped: 1, firstTime: 0, firstValue: 0 },
    ],
    sampleInterval: 0.5e-6,
    metadata: { Bench: 'LC input filter, 24 V rail', 'Delta t': '0,5E-6' },
    warnings: [/channel 'V_out': 3 sample\(s\) dropped/, /channel 'I_L': 1 sample\(s\) dropped/],
  },
  {
    // Tab-separated time/value pairs, trailing empty header cells, a blank second line, shifted second axis.
    file: 'buck-node-pairs.txt',
    layout: { delimiter: '\t', decimalComma: false, headerLine: 1, firstDataLine: 3, rows: 30 },
    channels: [
      { name: 'Vsw', unit: '', samples: 30, dropped: 0, firstTime: 0, firstValue: 18 },
      { name: 'Vgate', unit: '', samples: 30, dropped: 0, firstTime: 0.5e-9, firstValue: 0.58752 },
    ],
    sampleInterval: 1e-9,
    metadata: {},
    // 'Time Vsw' and 'Time Vgate' state no unit: read as seconds, and said so.
    warnings: [/^time columns 'Time Vsw' and 'Time Vgate' state no unit and were read as seconds; state another unit with --time-unit$/],
  },
  {
    // Values only, '=' key/value lines, an origin, a per-division scale that is not the interval, overrange cells.
    file: 'pulse-jig-values.txt',
    layout: { delimiter: '', decimalComma: false, headerLine: null, firstDataLine: 6, rows: 40 },
    channels: [{ name: 'channel 1', unit: '', samples: 38, dropped: 2, firstTime: -1e-7, firstValue: 0 }],
    sampleInterval: 5e-9,
    metadata: { XIncrement: '5e-9', 'X Origin': '-1E-07', 'Horizontal Scale': '1e-7' },
    warnings: [/the sample interval 'XIncrement' on line 2 and the start time 'X Origin' on line \d state no unit and were read as seconds/, /channel 'channel 1': 2 sample\(s\) dropped/],
  },
  {
    // Wall-clock stamps: axis rebuilt from a period given in µs by its key, started at a numeric start time.
    file: 'filter-wallclock.csv',
    layout: { delimiter: ',', decimalComma: false, headerLine: 4, firstDataLine: 5, rows: 25 },
    channels: [
      { name: 'V_in', unit: '', samples: 25, dropped: 0, firstTime: -5e-6, firstValue: 23.98 },
      { name: 'V_out', unit: '', samples: 25, dropped: 0, firstTime: -5e-6, firstValue: 25.2 },
    ],
    sampleInterval: 1e-6,
    metadata: { 'Sampling Period (us)': '1', 'Start Time': '-5e-6' },
    warnings: [
      /the start time 'Start Time' on line 2 states no unit and was read as seconds/,
      /column 'Timestamp' holds wall-clock time stamps; the time axis was rebuilt as t = -5 µs \+ i × 1 µs, with the interval from 'Sampling Period \(us\)' on line 1 and the start from 'Start Time' on line 2/,
    ],
  },
];

describe('bench fixtures', () => {
  it.each(cases.map((c) => [c.file, c] as const))('%s', (_, expected) => {
    const capture = parseCapture(read(expected.file));
    expect(capture.layout).toEqual(expected.layout);
    expect(capture.sampleInterval).toBeCloseTo(expected.sampleInterval, 20);
    expect(capture.metadata).toEqual(expected.metadata);
    expect(capture.channels).toHaveLength(expected.channels.length);
    expected.channels.forEach((want, k) => {
      const channel = capture.channels[k];
      expect(channel.name).toBe(want.name);
      expect(channel.unit).toBe(want.unit);
      expect(channel.values.length).toBe(want.samples);
      expect(channel.time.length).toBe(want.samples);
      expect(channel.dropped).toBe(want.dropped);
      expect(channel.time[0]).toBeCloseTo(want.firstTime, 20);
      expect(channel.values[0]).toBeCloseTo(want.firstValue, 12);
      expect(channel.clipped.reduce((a, b) => a + b, 0)).toBe(0);
      for (let i = 1; i < channel.time.length; i++) expect(channel.time[i]).toBeGreaterThan(channel.time[i - 1]);
    });
    expect(capture.warnings).toHaveLength(expected.warnings.length);
    expected.warnings.forEach((pattern, k) => expect(capture.warnings[k]).toMatch(pattern));
  });

  it('scales the LC filter current from mA and skips the overrange voltage cell', () => {
    const capture = parseCapture(read('lc-filter-decimal-comma.csv'));
    const [vout, il] = capture.channels;
    expect(il.values[1]).toBeCloseTo(0.02507, 12);
    expect(Array.from(vout.values).every((v) => v > 20 && v < 30)).toBe(true);
    expect(Array.from(vout.time).some((t) => Math.abs(t - 10.5e-6) < 1e-12)).toBe(false);
    expect(Array.from(il.time).some((t) => Math.abs(t - 10.5e-6) < 1e-12)).toBe(true);
  });
});
