// Generated hostile bench logs and --log targets: bad lines in the middle, a last record without its newline,
// and `log add --log` aimed at files that are not bench logs.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readBenchLog } from '../../main/io/benchLog';
import { sampleRecord } from '../fixtures/benchLog/sampleRecord';
import { NOMINAL_LOOP, writeLoopCapture, writeLoopDesign } from '../fixtures/benchLog/captures';
import { runCliIn } from './cliHarness';

let folder: string;
const run = (args: string[]) => runCliIn(folder, args);
const line = (id: string, unit: string) => `${JSON.stringify(sampleRecord({ id, unit }))}\n`;

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-hostile-'));
  writeLoopCapture(folder, 'sn050.csv', NOMINAL_LOOP, 50);
  writeLoopDesign(folder);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('a bad line in the middle of the log', () => {
  it.each([
    { kind: 'a broken line', bad: '{"record":"ringbench-measurement","schema":1,"id":"00', why: /line 2: not a JSON record/ },
    { kind: 'a blank line', bad: '   ', why: /line 2: blank line/ },
    { kind: 'a bare {}', bad: '{}', why: /line 2: not a ringbench measurement record/ },
    { kind: 'a record with a field the reports cannot show', bad: JSON.stringify(sampleRecord({ id: '0000000000bb', cautions: { fired: [{}], energies: {} } as never })), why: /line 2: record field "cautions\.fired\[0\]"/ },
  ])('$kind: log list shows every good record, names the line on stderr and exits 1', async ({ bad, why }) => {
    writeFileSync(join(folder, 'mixed.jsonl'), `${line('00000000000a', 'SN060')}${bad}\n${line('00000000000c', 'SN062')}`);
    const { code, out, err } = await run(['log', 'list', '--log', 'mixed.jsonl']);
    expect(code).toBe(1);
    expect(out).toMatch(/^00000000000a\s+2025-03-14 09:26:53\s+SN060\s/m);
    expect(out).toMatch(/^00000000000c\s+2025-03-14 09:26:53\s+SN062\s/m);
    expect(err.trimEnd().split('\n')).toHaveLength(1);
    expect(err).toMatch(/^ringbench: note: bench log 'mixed\.jsonl' line 2: .*: skipped, the other records are used$/m);
    expect(err).toMatch(why);
    const json = await run(['log', 'list', '--log', 'mixed.jsonl', '--json']);
    expect(json.code).toBe(1);
    const printed = JSON.parse(json.out) as { records: { id: string }[]; logs: { skipped: { line: number }[] }[] };
    expect(printed.records.map((r) => r.id)).toEqual(['00000000000a', '00000000000c']);
    expect(printed.logs[0].skipped.map((s) => s.line)).toEqual([2]);
  });

  it('report writes every good record, states the skipped line in the report and on stderr, and exits 1', async () => {
    const bad = JSON.stringify(sampleRecord({ id: '0000000000bb', fit: { ...sampleRecord().fit, components: { x: 1 } } as never }));
    writeFileSync(join(folder, 'mixed.jsonl'), `${line('00000000000a', 'SN060')}${bad}\n\n${line('00000000000c', 'SN062')}`);
    for (const out of ['mixed.md', 'mixed.html']) {
      const { code, err } = await run(['report', '--log', 'mixed.jsonl', '--out', out]);
      expect(code).toBe(1);
      expect(err).toMatch(/line 2: record field "fit": components\.R must be a quantity/);
      expect(err).toMatch(/line 3: blank line: skipped/);
      const text = readFileSync(join(folder, out), 'utf8');
      expect(text).toContain('SN060');
      expect(text).toContain('SN062');
      expect(text).toMatch(/line 2: record field .*fit.*: components\.R must be a quantity .*: skipped/);
      expect(text).toMatch(/line 3: blank line: skipped/);
    }
  });

  it('a byte-order mark before a record (a log saved by an editor, or two logs joined) does not hide the record', async () => {
    writeFileSync(join(folder, 'marked.jsonl'), `\uFEFF${line('00000000000a', 'SN060')}\uFEFF${line('00000000000b', 'SN061')}`);
    const { code, out, err } = await run(['log', 'list', '--log', 'marked.jsonl']);
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(out).toMatch(/SN060/);
    expect(out).toMatch(/SN061/);
  });
});

describe('a valid last record without a final newline', () => {
  it('is a record, not an interrupted write; the next append ends its line first and loses nothing', async () => {
    const log = join(folder, 'unended.jsonl');
    writeFileSync(log, `${line('00000000000a', 'SN060')}${line('00000000000b', 'SN061').trimEnd()}`);
    const listed = await run(['log', 'list', '--log', 'unended.jsonl']);
    expect(listed.code).toBe(0);
    expect(listed.err).toBe('');
    expect(listed.out).toMatch(/SN061/);
    const added = await run(['log', 'add', 'sn050.csv', '--log', 'unended.jsonl', '--unit', 'SN050', '--topology', 'series', '--known', 'C=2.2n']);
    expect(added.err).not.toMatch(/cut-off/);
    expect(readBenchLog(log).records.map((r) => r.unit)).toEqual(['SN060', 'SN061', 'SN050']);
    expect(readdirSync(folder).filter((f) => f.startsWith('unended.jsonl.torn-'))).toEqual([]);
  });
});

describe('log add --log pointed at a file that is not a bench log', () => {
  const foreign: { kind: string; make: () => string }[] = [
    { kind: 'a capture', make: () => writeLoopCapture(folder, 'foreign-capture.csv', NOMINAL_LOOP, 51) },
    { kind: 'a design', make: () => writeLoopDesign(folder, 'foreign-design.json') },
    {
      kind: 'a symbolic link to a capture',
      make: () => {
        const target = writeLoopCapture(folder, 'linked-capture.csv', NOMINAL_LOOP, 52);
        symlinkSync(target, join(folder, 'link.jsonl'));
        return join(folder, 'link.jsonl');
      },
    },
    { kind: 'a one-line JSON file without a newline', make: () => (writeFileSync(join(folder, 'settings.json'), '{"probe":"10x"}'), join(folder, 'settings.json')) },
  ];

  it.each(foreign)('$kind: exit 2, one line naming it, the file untouched and no lock left', async ({ make }) => {
    const path = make();
    const before = readFileSync(path);
    const { code, out, err } = await run(['log', 'add', 'sn050.csv', '--log', path, '--unit', 'SN050', '--topology', 'series', '--known', 'C=2.2n']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trimEnd().split('\n')).toHaveLength(1);
    expect(err).toMatch(/is not a bench log \(no ringbench record in it\); nothing was written/);
    expect(readFileSync(path)).toEqual(before);
    expect(readdirSync(folder).filter((f) => f.endsWith('.lock') || f.includes('.torn-'))).toEqual([]);
  });

  it('a named pipe (FIFO): exit 2 at once, never waiting for a writer', async () => {
    const fifo = join(folder, 'pipe.jsonl');
    execFileSync('mkfifo', [fifo]);
    const { code, err } = await run(['log', 'add', 'sn050.csv', '--log', fifo, '--unit', 'SN050', '--topology', 'series', '--known', 'C=2.2n']);
    expect(code).toBe(2);
    expect(err).toMatch(/is a named pipe \(FIFO\), not a bench log/);
    expect(existsSync(`${fifo}.lock`)).toBe(false);
  });

  it('an empty file is a new log: the record is appended', async () => {
    writeFileSync(join(folder, 'empty.jsonl'), '');
    const { code } = await run(['log', 'add', 'sn050.csv', '--log', 'empty.jsonl', '--unit', 'SN050', '--topology', 'series', '--known', 'C=2.2n']);
    expect(code).toBe(0);
    expect(readBenchLog(join(folder, 'empty.jsonl')).records).toHaveLength(1);
  });
});
