// The import summary: what the importer inferred, on written texts, the capture fixtures and the sample captures.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture, parseCaptureBytes } from '../../core/capture/parseCapture';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const fixture = (name: string) => readFileSync(path.join(ROOT, 'test', 'fixtures', 'capture', name), 'utf8');
const sample = (name: string) => readFileSync(path.join(ROOT, 'sample-captures', name), 'utf8');
const decode = (bytes: Uint8Array) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');

/** A ringdown of `rows` samples, 1 µs apart, written with the given delimiter, decimal mark and line end. */
function ringdown(options: { delimiter?: string; decimal?: string; eol?: string; header?: string; rows?: number } = {}): string {
  const { delimiter = ',', decimal = '.', eol = '\n', header = `Time (us)${delimiter}V (V)`, rows = 40 } = options;
  const lines = [header];
  for (let i = 0; i < rows; i++) {
    const v = Math.exp(-i / 10) * Math.cos(i);
    lines.push(`${i}${delimiter}${v.toFixed(4)}`.replace(/\./g, decimal));
  }
  return lines.join(eol) + eol;
}

describe('the import summary', () => {
  it.each([
    [',', 'comma'],
    [';', 'semicolon'],
    ['\t', 'tab'],
  ] as const)('names the delimiter %j as %s', (delimiter, name) => {
    const s = parseCapture(ringdown({ delimiter })).importSummary;
    expect(s.delimiter).toBe(name);
    expect(s.decimalMark).toBe('.');
  });

  it('reads a decimal comma in a semicolon table', () => {
    const s = parseCapture(ringdown({ delimiter: ';', decimal: ',' })).importSummary;
    expect([s.delimiter, s.decimalMark]).toEqual(['semicolon', ',']);
  });

  it.each([
    ['\r\n', 'CRLF'],
    ['\n', 'LF'],
    ['\r', 'CR'],
  ] as const)('names the line end %j as %s, from text and from bytes alike', (eol, name) => {
    const text = ringdown({ eol });
    expect(parseCapture(text).importSummary.lineEnd).toBe(name);
    expect(parseCaptureBytes(Buffer.from(text, 'utf8'), decode).importSummary).toEqual(parseCapture(text).importSummary);
  });

  it('notes a byte-order mark, dropped from the text', () => {
    const withMark = parseCapture(`\ufeff${ringdown()}`).importSummary;
    expect(withMark.encoding).toEqual({ name: 'UTF-8', byteOrderMark: true });
    expect(parseCapture(ringdown()).importSummary.encoding).toEqual({ name: 'UTF-8', byteOrderMark: false });
    expect(parseCaptureBytes(Buffer.from(`\ufeff${ringdown()}`, 'utf8'), decode).importSummary.encoding.byteOrderMark).toBe(true);
  });

  it('gives the header line, the first data line, the rows, and the time column with its unit', () => {
    const s = parseCapture(ringdown()).importSummary;
    expect(s).toMatchObject({ headerLine: 1, firstDataLine: 2, rows: 40, jitter: null });
    expect(s.time).toEqual({ kind: 'column', column: 'Time (us)', index: 1, unit: 'µs' });
    expect(s.sampleInterval).toBeCloseTo(1e-6, 18);
    expect(s.channels).toEqual([{ name: 'V', unit: 'V', samples: 40, dropped: 0, clipped: 0 }]);
    expect([s.droppedRows, s.ignoredSections, s.segments]).toEqual([[], [], []]);
  });

  it('reads the gate-drive sample: semicolons, decimal comma, time in ns', () => {
    const s = parseCapture(sample('gate-drive-turn-on.csv')).importSummary;
    expect(s).toMatchObject({ delimiter: 'semicolon', decimalMark: ',', lineEnd: 'LF', headerLine: 6, firstDataLine: 7, rows: 2000 });
    expect(s.time).toEqual({ kind: 'column', column: 'Time [ns]', index: 1, unit: 'ns' });
    expect(s.sampleInterval).toBeCloseTo(50e-12, 20);
    expect(s.channels.map((c) => `${c.name} ${c.unit}`)).toEqual(['CH1 V', 'CH2 V']);
  });

  it('gives the interval and where the preamble states it when the file has no time column', () => {
    const s = parseCapture(sample('pulse-jig-discharge.csv')).importSummary;
    expect(s.time).toEqual({ kind: 'interval', interval: 4e-8, from: 'preamble', key: 'Sample Interval', line: 2 });
    expect([s.delimiter, s.headerLine, s.sampleInterval, s.jitter]).toEqual(['none', 4, 4e-8, null]);
  });

  it('gives the sample interval option as the source when it is given', () => {
    const values = Array.from({ length: 30 }, (_, i) => String(Math.cos(i))).join('\n');
    const s = parseCapture(`CH1 (V)\n${values}\n`, { sampleInterval: 2e-9 }).importSummary;
    expect(s.time).toEqual({ kind: 'interval', interval: 2e-9, from: 'option', key: null, line: null });
  });

  it('reads the decimal-comma fixture with its dropped cells, and the tab fixture with CR LF and time/value pairs', () => {
    const comma = parseCapture(fixture('lc-filter-decimal-comma.csv')).importSummary;
    expect(comma).toMatchObject({ delimiter: 'semicolon', decimalMark: ',', lineEnd: 'LF', headerLine: 4 });
    expect(comma.channels.map((c) => c.dropped)).toEqual([3, 1]);
    const pairs = parseCapture(fixture('buck-node-pairs.txt')).importSummary;
    expect(pairs).toMatchObject({ delimiter: 'tab', lineEnd: 'CRLF', headerLine: 1 });
    expect(pairs.time).toEqual({ kind: 'column', column: 'Time Vsw', index: 1, unit: '' });
    expect(parseCapture(fixture('gate-loop-preamble.csv')).importSummary.encoding.byteOrderMark).toBe(true);
  });

  it('counts the clipped samples of the half-bridge sample', () => {
    const s = parseCapture(sample('half-bridge-clipped.csv')).importSummary;
    expect(s.channels[0].clipped).toBeGreaterThan(0);
    expect(s.warnings.some((w) => w.includes('clipped'))).toBe(true);
  });

  it('says which rows were left out and why: no readable time, repeated time stamps', () => {
    const rows = ringdown().split('\n');
    rows[5] = `,${rows[5].split(',')[1]}`;
    const timeless = parseCapture(rows.join('\n')).importSummary;
    expect(timeless.droppedRows).toEqual([{ reason: 'no readable time', count: 1, firstLine: 6 }]);
    const repeated = ringdown().split('\n');
    repeated.splice(10, 0, `${repeated[9].split(',')[0]},0.125`);
    const sorted = parseCapture(repeated.join('\n'), { sortTime: true }).importSummary;
    expect(sorted.droppedRows).toEqual([{ reason: 'repeated time stamp', count: 1, firstLine: 11 }]);
    // A row written twice whole is left out without asking.
    const copied = ringdown().split('\n');
    copied.splice(10, 0, copied[9]);
    expect(parseCapture(copied.join('\n')).importSummary.droppedRows).toEqual([{ reason: 'row repeated whole', count: 1, firstLine: 11 }]);
  });

  it('gives the spread of the steps of an uneven axis', () => {
    const lines = ['t (s),V (V)'];
    for (let i = 0; i < 40; i++) lines.push(`${(i + (i % 2 ? 0.2 : 0)) * 1e-6},${Math.cos(i)}`);
    const s = parseCapture(lines.join('\n')).importSummary;
    expect(s.sampleInterval).toBeCloseTo(1e-6, 7);
    expect(s.jitter).toBeGreaterThan(0.1e-6);
  });
});
