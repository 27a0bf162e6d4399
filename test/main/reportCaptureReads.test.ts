// A record's capture path is never trusted: a report reads it only while it is the regular file logged (size
// and sha256), never a device or a FIFO, and through the bench API only where the page could have opened it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { appendFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeReport } from '../../main/app/reportFile';
import { createBenchApi } from '../../main/api/benchApi';
import { GrantedPaths } from '../../main/electron/grantedPaths';
import { loggedCapture } from '../fixtures/benchLog/loggedCapture';
import type { BenchRecord } from '../../core/report/benchRecord';

let folder: string;
const NOT_READ = 'the numbers are those logged, no plot is drawn';

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-capture-reads-'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function logOf(name: string, records: BenchRecord[]): string {
  const path = join(folder, name);
  writeFileSync(path, records.map((r) => `${JSON.stringify(r)}\n`).join(''));
  return path;
}

/** The Markdown report of `records` and its terminal notes. */
function reportOf(records: BenchRecord[]): { text: string; notes: string[] } {
  const log = logOf('reads.jsonl', records);
  const written = writeReport(log, join(folder, 'reads.md'));
  return { text: readFileSync(join(folder, 'reads.md'), 'utf8'), notes: written.notes };
}

describe('the command-line report', () => {
  it('never reads a device named as the capture, whatever its logged size', () => {
    const record = loggedCapture(folder, '00000000000a', 'SN080', 'sn080.csv');
    const { notes } = reportOf([{ ...record, capture: { ...record.capture, path: '/dev/zero', bytes: 11 * 2 ** 30 } }]);
    expect(notes).toEqual([`The capture /dev/zero is a device, not a regular file: it is not read: ${NOT_READ}.`]);
  });

  it('never opens a named pipe for reading in a way that waits for a writer', () => {
    const record = loggedCapture(folder, '00000000000b', 'SN081', 'sn081.csv');
    const fifo = join(folder, 'capture.fifo');
    execFileSync('mkfifo', [fifo]);
    const { notes } = reportOf([{ ...record, capture: { ...record.capture, path: fifo } }]);
    expect(notes).toEqual([`The capture ${fifo} is a named pipe (FIFO), not a regular file: it is not read: ${NOT_READ}.`]);
  });

  it('reads no more than the logged size: a capture grown since is named as changed by its size', () => {
    const record = loggedCapture(folder, '00000000000c', 'SN082', 'sn082.csv');
    appendFileSync(record.capture.path, '1e-6,0\n'.repeat(1000));
    const { notes } = reportOf([record]);
    expect(notes).toEqual([`The capture ${record.capture.path} has changed since it was logged (${record.capture.bytes + 7000} bytes instead of ${record.capture.bytes}): ${NOT_READ}.`]);
  });

  it('reads a path that is not absolute (a browser upload names only a file) from nowhere', () => {
    const record = loggedCapture(folder, '00000000000d', 'SN083', 'sn083.csv');
    const { notes } = reportOf([{ ...record, capture: { ...record.capture, path: 'sn083.csv' } }]);
    expect(notes[0]).toMatch(/^The capture sn083\.csv was not opened from a file on this computer/);
  });

  it('draws the plot of an unchanged capture', () => {
    const record = loggedCapture(folder, '00000000000e', 'SN084', 'sn084.csv');
    expect(reportOf([record]).notes).toEqual([]);
  });
});

describe('the report of the bench API (server and window)', () => {
  it('reads again only captures in the project folder or granted to the session; the report says why not', async () => {
    const project = join(folder, 'project');
    const elsewhere = join(folder, 'elsewhere');
    mkdirSync(project);
    mkdirSync(elsewhere);
    const inside = loggedCapture(project, '0000000000a1', 'SN090', 'inside.csv');
    const outside = loggedCapture(elsewhere, '0000000000a2', 'SN091', 'outside.csv');
    const logPath = logOf('api.jsonl', [inside, outside]);

    const report = async (mayReadCapture?: (path: string) => boolean) =>
      (await createBenchApi({ projectRoot: project, logPath, ...(mayReadCapture ? { mayReadCapture } : {}) }).renderReport('md')).text;
    const ungranted = await report();
    expect(ungranted).toMatch(new RegExp(`The capture ${outside.capture.path.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')} was not opened in this session or from the project folder`));
    expect(ungranted).not.toMatch(/inside\.csv was not opened/);

    const granted = new GrantedPaths();
    granted.grant(outside.capture.path);
    expect(await report((path) => granted.isGranted(path))).not.toMatch(/was not opened in this session/);
  });
});
