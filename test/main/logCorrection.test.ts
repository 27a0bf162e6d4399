// Amending and withdrawing a logged measurement: a correction record appended (nothing rewritten), the log
// listed and reported as it stands, from the command line and the bench API alike.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { readBenchLog, readCleanBenchLog } from '../../main/io/benchLog';
import { createBenchApi } from '../../main/api/benchApi';
import { createApiDispatch } from '../../main/api/dispatch';
import { applyCorrections } from '../../core/report/logCorrection';
import { sampleRecord, sampleVerdict } from '../fixtures/benchLog/sampleRecord';
import { runCliIn } from './cliHarness';

const root = resolve(__dirname, '../..');
let folder: string;
const run = (args: string[]) => runCliIn(folder, args);

const A = '00000000000a';
const B = '00000000000b';
const C = '00000000000c';

/** Three units: SN100 passes, SN101 fails, SN102 (logged under a wrong unit id) fails. */
function writeLog(name: string): string {
  const records = [
    sampleRecord({ id: A, unit: 'SN100', verdict: sampleVerdict(true), design: { path: '/d.json', name: 'gate loop rev C', sha256: 'cd'.repeat(32), spec: {} as never } }),
    sampleRecord({ id: B, unit: 'SN101', verdict: sampleVerdict(false), design: { path: '/d.json', name: 'gate loop rev C', sha256: 'cd'.repeat(32), spec: {} as never } }),
    sampleRecord({ id: C, unit: 'SN1O2', note: 'first try', verdict: sampleVerdict(false), design: null }),
  ];
  const path = join(folder, name);
  writeFileSync(path, records.map((r) => `${JSON.stringify(r)}\n`).join(''));
  return path;
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-correct-'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('log amend and log withdraw', () => {
  it('append a correction each, keep every earlier byte, and list the log as it stands', async () => {
    const log = writeLog('bench.jsonl');
    const before = readFileSync(log);
    const amended = await run(['log', 'amend', C, '--log', 'bench.jsonl', '--unit', 'SN102', '--note', '', '--reason', 'letter O typed for zero']);
    expect(amended).toMatchObject({ code: 0, err: '' });
    expect(amended.out).toMatch(/^amended measurement 00000000000c in bench\.jsonl \(correction [0-9a-f]{12}, /);
    const withdrawn = await run(['log', 'withdraw', B, '--log', 'bench.jsonl', '--reason', 'probe ground lead was loose']);
    expect(withdrawn).toMatchObject({ code: 0, err: '' });

    const after = readFileSync(log);
    expect(after.subarray(0, before.length)).toEqual(before);
    const { corrections } = readBenchLog(log);
    expect(corrections.map((c) => [c.target, c.action, c.changes, c.reason])).toEqual([
      [C, 'amend', { unit: 'SN102', note: null }, 'letter O typed for zero'],
      [B, 'withdraw', {}, 'probe ground lead was loose'],
    ]);

    const listed = await run(['log', 'list', '--log', 'bench.jsonl']);
    expect(listed.code).toBe(0);
    const lines = listed.out.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^id\s+time\s+unit\s+regime\s+f0\s+zeta\s+verdict$/);
    expect(lines[1]).toMatch(/^00000000000a .*SN100 .*pass$/);
    expect(lines[2]).toMatch(/^00000000000c .*SN102 .*fail  \(amended\)$/);
    expect(lines).toContain('withdrawn (left out of the yield and the reports):');
    expect(lines[lines.length - 1]).toMatch(/^00000000000b .*SN101 .*fail  withdrawn: probe ground lead was loose$/);
    expect(listed.out).not.toMatch(/SN1O2/);
    expect(listed.err).toMatch(/measurement 00000000000c amended .*: unit set to “SN102”, note cleared \(letter O typed for zero\)/);
  });

  it('report leaves the withdrawn measurement out of the yield, shows the amended unit and states both changes', async () => {
    const { code } = await run(['report', '--log', 'bench.jsonl', '--out', 'bench.md']);
    expect(code).toBe(0);
    const md = readFileSync(join(folder, 'bench.md'), 'utf8');
    expect(md).toMatch(/\*\*Yield 50\.0 %\*\*: 1 pass, 1 fail, 0 not checked/);
    expect(md).toContain('## SN102: fail');
    expect(md).not.toContain('## SN101');
    expect(md).toMatch(/measurement 00000000000b of SN101 .* withdrawn .*probe ground lead was loose/);
    expect(md).not.toContain('first try');
  });

  it.each([
    { why: 'an id that is not logged', args: ['amend', 'ffffffffffff', '--unit', 'SN9', '--reason', 'x'], message: /no measurement ffffffffffff in bench log/ },
    { why: 'an id of the wrong form', args: ['withdraw', 'SN100', '--reason', 'x'], message: /<id> must be the 12 hex digits/ },
    { why: 'a measurement withdrawn already', args: ['withdraw', B, '--reason', 'again'], message: /was withdrawn already .*probe ground lead was loose/ },
    { why: 'an amendment that changes nothing', args: ['amend', A, '--reason', 'nothing'], message: /give --unit, --operator or --note/ },
    { why: 'a blank reason', args: ['amend', A, '--unit', 'SN7', '--reason', '  '], message: /say why the measurement is amended/ },
    { why: 'a reason with a line break', args: ['withdraw', A, '--reason', 'a\nb'], message: /reason must not contain line breaks/ },
    { why: 'no reason', args: ['withdraw', A], message: /required option '--reason <text>' not specified/ },
    { why: 'an empty unit', args: ['amend', A, '--unit', ' ', '--reason', 'x'], message: /--unit must not be empty/ },
  ])('refuses $why with exit 2 and one line, appending nothing', async ({ args, message }) => {
    const log = join(folder, 'bench.jsonl');
    const before = readFileSync(log);
    const { code, out, err } = await run(['log', ...args, '--log', 'bench.jsonl']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trimEnd().split('\n')).toHaveLength(1);
    expect(err).toMatch(message);
    expect(readFileSync(log)).toEqual(before);
  });
});

describe('the bench API correctBenchLog call', () => {
  it('withdraws and amends through the same function and answers the log as it stands', async () => {
    const logPath = writeLog('api.jsonl');
    const dispatch = createApiDispatch(createBenchApi({ projectRoot: root, logPath, clock: () => new Date('2030-01-02T03:04:05Z') }));
    const withdrawn = await dispatch('correctBenchLog', [{ target: A, action: 'withdraw', changes: {}, reason: 'wrong board on the jig' }]);
    expect(withdrawn.ok).toBe(true);
    const view = (withdrawn as { value: { records: { id: string }[]; withdrawn: { record: { id: string }; time: string; reason: string }[] } }).value;
    expect(view.records.map((r) => r.id)).toEqual([B, C]);
    expect(view.withdrawn).toEqual([{ record: expect.objectContaining({ id: A }), time: '2030-01-02T03:04:05.000Z', reason: 'wrong board on the jig' }]);
    const amended = await dispatch('correctBenchLog', [{ target: B, action: 'amend', changes: { operator: 'J. Alvarez' }, reason: 'measured by the second shift' }]);
    expect(amended).toMatchObject({ ok: true, value: { amended: [B] } });
    expect(readCleanBenchLog(logPath).records.find((r) => r.id === B)!.operator).toBe('J. Alvarez');
  });

  it.each([
    [{ target: A, action: 'delete', changes: {}, reason: 'x' }, /action: must be 'amend' or 'withdraw'/],
    [{ target: A, action: 'amend', changes: { fit: {} }, reason: 'x' }, /changes: has an unknown field "fit"/],
    [{ target: A, action: 'withdraw', changes: { unit: 'x' }, reason: 'x' }, /changes: a withdrawal changes no label/],
    [{ target: '../../etc', action: 'withdraw', changes: {}, reason: 'x' }, /target: must be the 12 hex digits/],
    [{ target: A, action: 'withdraw', changes: {}, reason: '' }, /reason: say why/],
  ])('refuses a malformed request before the log is read: %j', async (request, message) => {
    const logPath = writeLog('api-bad.jsonl');
    const before = readFileSync(logPath);
    const answer = await createApiDispatch(createBenchApi({ projectRoot: root, logPath }))('correctBenchLog', [request]);
    expect(answer).toMatchObject({ ok: false, code: 'bad-argument' });
    expect((answer as { error: string }).error).toMatch(message);
    expect(readFileSync(logPath)).toEqual(before);
  });
});

describe('applyCorrections', () => {
  it('applies amendments in log order, keeps a withdrawal final, and notes a correction of an unknown id', () => {
    const base = { record: 'ringbench-correction' as const, schema: 1 as const, time: '2030-01-01T00:00:00Z', reason: 'r', software: { name: 'ringbench' as const, version: 't' } };
    const standing = applyCorrections([
      sampleRecord({ id: A, unit: 'U1' }),
      { ...base, id: '0000000000f1', target: A, action: 'amend', changes: { unit: 'U2' } },
      { ...base, id: '0000000000f2', target: A, action: 'amend', changes: { unit: 'U3', operator: null } },
      { ...base, id: '0000000000f3', target: 'eeeeeeeeeeee', action: 'withdraw', changes: {} },
      sampleRecord({ id: B, unit: 'U4' }),
      { ...base, id: '0000000000f4', target: B, action: 'withdraw', changes: {} },
    ]);
    expect(standing.records.map((r) => [r.unit, r.operator])).toEqual([['U3', null]]);
    expect(standing.withdrawn.map((w) => w.record.unit)).toEqual(['U4']);
    expect(standing.amendments[A]).toHaveLength(2);
    expect(standing.notes).toEqual(['correction 0000000000f3 names measurement eeeeeeeeeeee, which is not logged before it: not applied']);
  });
});
