// The bench log in one process: append and read back, torn tails, bad lines, the lock and its recovery.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { appendFileSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { appendBenchLog, readBenchLog, readCleanBenchLog } from '../../main/io/benchLog';
import { LogError } from '../../core/report/benchRecord';
import { sampleRecord } from '../fixtures/benchLog/sampleRecord';

let folder: string;
let log: string;
const clock = () => new Date('2025-03-14T10:00:00.000Z');

beforeEach(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-log-'));
  log = join(folder, 'bench.jsonl');
});
afterEach(() => rmSync(folder, { recursive: true, force: true }));

const line = (id: string) => `${JSON.stringify(sampleRecord({ id }))}\n`;

describe('appendBenchLog and readBenchLog', () => {
  it('creates the log, appends one full line per record and reads them back in order', () => {
    const ids = ['000000000001', '000000000002', '0000000000ff'];
    for (const id of ids) expect(appendBenchLog(log, sampleRecord({ id })).bytes).toBe(Buffer.byteLength(line(id)));
    const text = readFileSync(log, 'utf8');
    expect(text).toBe(ids.map(line).join(''));
    const contents = readBenchLog(log);
    expect(contents.records.map((r) => r.id)).toEqual(ids);
    expect(contents.records[0]).toEqual(sampleRecord({ id: ids[0] }));
    expect(contents.torn).toBeNull();
    expect(contents.bad).toEqual([]);
    expect(existsSync(`${log}.lock`)).toBe(false);
  });

  it('reads an empty log as no records', () => {
    writeFileSync(log, '');
    expect(readBenchLog(log)).toEqual({ entries: [], records: [], corrections: [], torn: null, bad: [] });
  });

  it('fails with LogError naming the folder when it does not exist, creating nothing', () => {
    const missing = join(folder, 'no-such-folder', 'bench.jsonl');
    expect(() => appendBenchLog(missing, sampleRecord())).toThrow(LogError);
    expect(() => appendBenchLog(missing, sampleRecord())).toThrow(/folder .*no-such-folder.* does not exist/);
    expect(readdirSync(folder)).toEqual([]);
  });

  it('fails with LogError when reading a log that does not exist', () => {
    expect(() => readBenchLog(log)).toThrow(/no bench log at/);
  });
});

describe('torn tails', () => {
  it.each([
    { kind: 'a last line without a newline', tail: '{"record":"ringbench-measurement","schema":1,"id":"0000' },
    { kind: 'a last line without a newline that is JSON but not a whole record', tail: '{"record":"ringbench-measurement"}' },
  ])('reports $kind, keeps the records before it, and saves it aside on the next append', ({ tail }) => {
    writeFileSync(log, line('000000000001') + line('000000000002') + tail);
    const before = readBenchLog(log);
    expect(before.records.map((r) => r.id)).toEqual(['000000000001', '000000000002']);
    expect(before.torn).toEqual({ line: 3, text: tail.replace(/\n$/, '') });
    expect(before.bad).toEqual([]);

    const result = appendBenchLog(log, sampleRecord({ id: '000000000003' }), { clock });
    expect(result.repairedTail).toEqual({ line: 3, text: tail.replace(/\n$/, ''), savedTo: `${log}.torn-20250314T100000Z` });
    expect(readFileSync(`${log}.torn-20250314T100000Z`, 'utf8')).toBe(tail);
    const after = readBenchLog(log);
    expect(after.records.map((r) => r.id)).toEqual(['000000000001', '000000000002', '000000000003']);
    expect(after.torn).toBeNull();
  });

  it('never overwrites an earlier saved tail', () => {
    writeFileSync(log, `${line('000000000001')}{"cut`);
    appendBenchLog(log, sampleRecord({ id: '000000000002' }), { clock });
    appendFileSync(log, '{"cut again');
    const second = appendBenchLog(log, sampleRecord({ id: '000000000003' }), { clock });
    expect(second.repairedTail!.savedTo).toBe(`${log}.torn-20250314T100000Z-1`);
    expect(readFileSync(`${log}.torn-20250314T100000Z`, 'utf8')).toBe('{"cut');
    expect(readFileSync(`${log}.torn-20250314T100000Z-1`, 'utf8')).toBe('{"cut again');
  });

  it('repairs a log that holds only a torn line', () => {
    writeFileSync(log, '{"record":"ringbench-mea');
    expect(readBenchLog(log).torn).toEqual({ line: 1, text: '{"record":"ringbench-mea' });
    appendBenchLog(log, sampleRecord(), { clock });
    expect(readFileSync(log, 'utf8')).toBe(line('0123456789ab'));
  });
});

describe('bad lines', () => {
  it.each([
    { bad: 'not json at all', message: /line 2: not a JSON record/ },
    { bad: '', message: /line 2: blank line/ },
    { bad: '{"record":"something-else"}', message: /line 2: not a ringbench measurement record/ },
    { bad: JSON.stringify({ ...sampleRecord(), schema: 7 }), message: /line 2: record schema 7 is not 1/ },
    { bad: JSON.stringify({ ...sampleRecord(), id: 'xyz' }), message: /line 2: record field "id": must be 12 hex digits/ },
    { bad: JSON.stringify({ ...sampleRecord(), unit: '' }), message: /line 2: record field "unit"/ },
    { bad: JSON.stringify({ ...sampleRecord(), fit: null }), message: /line 2: record field "fit"/ },
  ])('a bad line in the middle is skipped and noted with its number, the records around it read: $bad', ({ bad, message }) => {
    writeFileSync(log, `${line('000000000001')}${bad}\n${line('000000000003')}`);
    const contents = readBenchLog(log);
    expect(contents.records.map((r) => r.id)).toEqual(['000000000001', '000000000003']);
    expect(contents.bad).toHaveLength(1);
    expect(contents.bad[0].line).toBe(2);
    expect(contents.bad[0].message).toMatch(message);
    const clean = readCleanBenchLog(log, 'bench.jsonl');
    expect(clean.records.map((r) => r.id)).toEqual(['000000000001', '000000000003']);
    expect(clean.notes).toHaveLength(1);
    expect(clean.notes[0]).toMatch(/^bench log 'bench\.jsonl' line 2: .*: skipped, the other records are used$/);
    expect(clean.notes[0]).toMatch(message);
  });

  it('a last line with a newline that is not JSON is a bad line, kept in place and skipped, not torn', () => {
    writeFileSync(log, `${line('000000000001')}{"record":"ringbench-meas\n`);
    expect(readBenchLog(log)).toMatchObject({ torn: null, bad: [{ line: 2 }] });
    expect(appendBenchLog(log, sampleRecord({ id: '000000000003' }), { clock }).repairedTail).toBeNull();
    expect(readFileSync(log, 'utf8')).toBe(`${line('000000000001')}{"record":"ringbench-meas\n${line('000000000003')}`);
  });

  it('a valid JSON last line that is not a record is bad, not torn', () => {
    writeFileSync(log, `${line('000000000001')}{"record":"other"}\n`);
    const contents = readBenchLog(log);
    expect(contents.torn).toBeNull();
    expect(contents.bad.map((b) => b.line)).toEqual([2]);
  });
});

describe('the lock', () => {
  const deadPid = () => {
    const child = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))']);
    return Number(child.stdout.toString());
  };

  it('waits for a live holder and then fails naming it, leaving the log untouched', () => {
    writeFileSync(log, line('000000000001'));
    writeFileSync(`${log}.lock`, `${process.pid} ${hostname()}\n`);
    expect(() => appendBenchLog(log, sampleRecord(), { lockTimeoutMs: 100 })).toThrow(
      new RegExp(`locked by ${process.pid} ${hostname()}`),
    );
    expect(readFileSync(log, 'utf8')).toBe(line('000000000001'));
    expect(readFileSync(`${log}.lock`, 'utf8')).toBe(`${process.pid} ${hostname()}\n`);
  });

  it('recovers a lock left by a process that has ended', () => {
    writeFileSync(`${log}.lock`, `${deadPid()} ${hostname()}\n`);
    appendBenchLog(log, sampleRecord(), { lockTimeoutMs: 2000 });
    expect(readBenchLog(log).records).toHaveLength(1);
    expect(readdirSync(folder).sort()).toEqual(['bench.jsonl']);
  });

  it('recovers an empty lock file only once it is older than the grace time', () => {
    writeFileSync(`${log}.lock`, '');
    expect(() => appendBenchLog(log, sampleRecord(), { lockTimeoutMs: 50 })).toThrow(/locked by an unknown process/);
    const old = new Date(Date.now() - 60_000);
    utimesSync(`${log}.lock`, old, old);
    appendBenchLog(log, sampleRecord(), { lockTimeoutMs: 2000 });
    expect(readBenchLog(log).records).toHaveLength(1);
  });

  it('does not take a lock held on another host, even with a dead pid', () => {
    writeFileSync(`${log}.lock`, `${deadPid()} another-bench-pc\n`);
    expect(() => appendBenchLog(log, sampleRecord(), { lockTimeoutMs: 50 })).toThrow(/another-bench-pc/);
    expect(existsSync(log)).toBe(false);
  });
});
