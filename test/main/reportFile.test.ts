// Report files from a bench log: captures reloaded for plots (or warned about), formats, atomic writes.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { appendFileSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { appendBenchLog } from '../../main/io/benchLog';
import { reportFormatFor, writeReport } from '../../main/app/reportFile';
import { writeFileAtomic } from '../../main/io/atomicFile';
import type { BenchRecord } from '../../core/report/benchRecord';
import { loggedCapture } from '../fixtures/benchLog/loggedCapture';

let folder: string;
let log: string;
const clock = () => new Date('2025-03-14T12:00:00.000Z');

const recordOf = (id: string, unit: string, file: string) => loggedCapture(folder, id, unit, file);

beforeEach(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-report-'));
  log = join(folder, 'bench.jsonl');
});
afterEach(() => rmSync(folder, { recursive: true, force: true }));

describe('writeReport', () => {
  it('plots every capture that is there unchanged and says which are missing or changed', () => {
    const records = [recordOf('00000000000a', 'SN040', 'sn040.csv'), recordOf('00000000000b', 'SN041', 'sn041.csv'), recordOf('00000000000c', 'SN042', 'sn042.csv')];
    for (const r of records) appendBenchLog(log, r);
    rmSync(join(folder, 'sn041.csv'));
    appendFileSync(join(folder, 'sn042.csv'), '1e-6,0.0\n');
    const out = join(folder, 'report.html');
    const written = writeReport(log, out, { clock });
    expect(written).toMatchObject({ format: 'html', records: 3 });
    expect(written.notes).toHaveLength(2);
    const html = readFileSync(out, 'utf8');
    expect(html.match(/<svg /g)!.length).toBe(1);
    expect(html).toContain(`The capture ${join(folder, 'sn041.csv')} is missing: the numbers are those logged, no plot is drawn.`);
    expect(html).toMatch(/The capture .*sn042\.csv has changed since it was logged/);
    // The numbers of all three are still reported.
    expect(html.match(/<article class="measurement"/g)!.length).toBe(3);
    expect(html).toContain('2025-03-14 12:00:00 UTC');
  });

  it('the redrawn fit follows the capture: its points lie on the measured envelope', () => {
    appendBenchLog(log, recordOf('00000000000a', 'SN040', 'sn040.csv'));
    writeReport(log, join(folder, 'r.html'), { clock });
    const html = readFileSync(join(folder, 'r.html'), 'utf8');
    const ys = (cls: string) =>
      new RegExp(`<polyline class="${cls}" points="([^"]+)"`).exec(html)![1].split(' ').map((p) => p.split(',').map(Number));
    const measured = ys('measured');
    const fit = ys('fit');
    const top = Math.min(...measured.map((p) => p[1]));
    const bottom = Math.max(...measured.map((p) => p[1]));
    for (const [, y] of fit) {
      expect(y).toBeGreaterThanOrEqual(top - 2);
      expect(y).toBeLessThanOrEqual(bottom + 2);
    }
  });

  it.each([
    { name: 'report.md', format: 'md', marker: /^# Bench report/ },
    { name: 'report.csv', format: 'csv', marker: /^id,time,unit,/ },
    { name: 'REPORT.HTML', format: 'html', marker: /^<!DOCTYPE html>/ },
  ])('writes $name as $format', ({ name, format, marker }) => {
    appendBenchLog(log, recordOf('00000000000a', 'SN040', 'sn040.csv'));
    expect(writeReport(log, join(folder, name), { clock }).format).toBe(format);
    expect(readFileSync(join(folder, name), 'utf8')).toMatch(marker);
  });

  it('states each measurement\'s order line (how many ringing modes, and why) in HTML and Markdown, as the text does', () => {
    const record = recordOf('00000000000d', 'SN043', 'sn043.csv');
    const row = { ringingModes: 2, slowTerm: false, parameters: 9, sse: 0.52, criterion: -4821.3, chosen: true };
    const modelOrder = { criterion: 'BIC', forced: false, reason: 'two ringing modes: the second lowers BIC by 212 and passes the F-test', table: [{ ...row, model: 'two ringing modes' }] };
    appendBenchLog(log, { ...record, fit: { ...record.fit, modelOrder } });
    for (const name of ['r.html', 'r.md']) {
      writeReport(log, join(folder, name), { clock });
      expect(readFileSync(join(folder, name), 'utf8')).toContain('Order: two ringing modes (BIC -4821.3): the second lowers BIC by 212 and passes the F-test.');
    }
  });

  it('reports a torn tail of the log and uses the records before it', () => {
    appendBenchLog(log, recordOf('00000000000a', 'SN040', 'sn040.csv'));
    appendFileSync(log, '{"record":"ringbench-meas');
    const written = writeReport(log, join(folder, 'r.md'), { clock });
    expect(written.records).toBe(1);
    expect(written.notes[0]).toMatch(/ends in a cut-off line 2/);
    expect(readFileSync(join(folder, 'r.md'), 'utf8')).toContain('cut-off line 2');
  });

  it('skips a bad line in the middle, counts and names it, and reports every other record', () => {
    const line = (r: BenchRecord) => `${JSON.stringify(r)}\n`;
    writeFileSync(log, `${line(recordOf('00000000000a', 'SN040', 'sn040.csv'))}garbage\n${line(recordOf('00000000000b', 'SN041', 'sn041.csv'))}`);
    const written = writeReport(log, join(folder, 'r.html'), { clock });
    expect(written).toMatchObject({ records: 2, skippedLines: 1 });
    expect(written.notes[0]).toMatch(/line 2: not a JSON record .*: skipped, the other records are used$/);
    expect(readFileSync(join(folder, 'r.html'), 'utf8')).toMatch(/line 2: not a JSON record/);
  });

  it.each([
    { out: 'report.pdf', message: /must end in \.html, \.md or \.csv/ },
    { out: 'no-such-folder/report.html', message: /report folder .* does not exist/ },
  ])('rejects $out before reading the log', ({ out, message }) => {
    expect(() => writeReport(join(folder, 'missing.jsonl'), join(folder, out), { clock })).toThrow(message);
  });
});

describe('writeFileAtomic', () => {
  it('replaces the file whole and leaves no temporary file', () => {
    const path = join(folder, 'report.html');
    writeFileSync(path, 'old report');
    writeFileAtomic(path, 'new report');
    expect(readFileSync(path, 'utf8')).toBe('new report');
    expect(readdirSync(folder)).toEqual(['report.html']);
  });

  it('keeps the old file when the new one cannot be put in place', () => {
    const path = join(folder, 'taken');
    writeFileSync(join(folder, 'keep.txt'), 'old');
    // A folder where the report should go: rename onto it fails, the temporary file is removed.
    rmSync(path, { force: true });
    mkdirSync(path);
    writeFileSync(join(path, 'inside'), 'x');
    expect(() => writeFileAtomic(path, 'new')).toThrow(/cannot write report/);
    expect(readdirSync(folder).sort()).toEqual(['keep.txt', 'taken']);
  });
});

describe('reportFormatFor', () => {
  it.each([
    ['a.html', 'html'],
    ['a.htm', 'html'],
    ['b.MD', 'md'],
    ['c.csv', 'csv'],
    ['d.txt', null],
    ['html', null],
  ])('%s -> %s', (path, format) => {
    expect(reportFormatFor(path)).toBe(format);
  });
});
