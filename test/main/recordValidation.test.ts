// Records are checked deeply wherever they come from: a log line and a window's request get the same check,
// with the field's path in the message, so that nothing a report cannot show is ever kept.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parseBenchRecord, type BenchRecord } from '../../core/report/benchRecord';
import { createBenchApi } from '../../main/api/benchApi';
import { createApiDispatch } from '../../main/api/dispatch';
import { writeReport } from '../../main/app/reportFile';
import { sampleRecord, sampleVerdict } from '../fixtures/benchLog/sampleRecord';

const root = resolve(__dirname, '../..');
let folder: string;

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-shape-'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

type Spoil = (r: Record<string, any>) => void;

/** Each a record the reports could not draw before: the path of the field the message must name. */
const HOSTILE: { name: string; spoil: Spoil; field: RegExp }[] = [
  { name: 'a fired caution with no fields', spoil: (r) => (r.cautions.fired = [{}]), field: /cautions\.fired\[0\]/ },
  { name: 'a caution without its measured quantity', spoil: (r) => (r.cautions.fired = [{ id: 'x', checks: 'peak voltage', message: 'm', source: 's', certainty: 'verified', threshold: { value: 1, stderr: null, unit: 'V' } }]), field: /cautions\.fired\[0\]/ },
  { name: 'components with no R, L, C', spoil: (r) => (r.fit.components = { x: 1 }), field: /fit.*components\.R must be a quantity/ },
  { name: 'a stored energy as text', spoil: (r) => (r.cautions.energies = { capacitor: '1 J' }), field: /cautions\.energies\.capacitor/ },
  { name: 'a discharge without its time', spoil: (r) => (r.cautions.discharge = { toVoltage: 50 }), field: /cautions\.discharge/ },
  { name: 'a verdict row without its design value', spoil: (r) => (r.verdict = { ...sampleVerdict(false), quantities: [{ name: 'alpha' }] }), field: /verdict.*quantities\[0\]/ },
  { name: 'a likely cause without its implied value', spoil: (r) => (r.verdict = { ...sampleVerdict(false), likelyCause: { component: 'R', change: 0.3 } }), field: /verdict.*likelyCause/ },
  { name: 'fit warnings that are not text', spoil: (r) => (r.fit.warnings = [{}]), field: /fit.*warnings must be a list of text/ },
  { name: 'a model with text parameters', spoil: (r) => (r.fit.params = { ...r.fit.params, alpha: 'fast' }), field: /fit.*params must give/ },
  { name: 'a fit message that is not text', spoil: (r) => (r.fit.message = 42), field: /fit.*message must be text/ },
  { name: 'a design without its name', spoil: (r) => (r.design = { path: '/d.json', sha256: 'cd'.repeat(32), spec: {} }), field: /design/ },
];

function spoiled(spoil: Spoil): Record<string, any> {
  const record = JSON.parse(JSON.stringify(sampleRecord())) as Record<string, any>;
  spoil(record);
  return record;
}

describe('a log line', () => {
  it.each(HOSTILE)('with $name is refused naming the line and the field', ({ spoil, field }) => {
    expect(() => parseBenchRecord(JSON.stringify(spoiled(spoil)), 7)).toThrow(/^line 7: record field "/);
    expect(() => parseBenchRecord(JSON.stringify(spoiled(spoil)), 7)).toThrow(field);
  });

  it('a good record, with a verdict, cautions and components, passes', () => {
    const fired = { id: 'hv-50v', checks: 'peak voltage', message: 'above 50 V', measured: { value: 60, stderr: null, unit: 'V' }, threshold: { value: 50, stderr: null, unit: 'V' }, source: 'common practice', certainty: 'verified' };
    const record = sampleRecord({ verdict: sampleVerdict(false), cautions: { fired: [fired as never], energies: {} } });
    expect(parseBenchRecord(JSON.stringify(record), 1).verdict!.likelyCause!.component).toBe('R');
  });

  it('a log holding every hostile record still gives HTML and Markdown reports of its good records', () => {
    const log = join(folder, 'hostile.jsonl');
    const lines = [sampleRecord({ id: '00000000000a', unit: 'SN070' }), ...HOSTILE.map((h) => spoiled(h.spoil)), sampleRecord({ id: '00000000000c', unit: 'SN071' })];
    writeFileSync(log, lines.map((r) => `${JSON.stringify(r)}\n`).join(''));
    for (const name of ['hostile.html', 'hostile.md']) {
      const written = writeReport(log, join(folder, name));
      expect(written).toMatchObject({ records: 2, skippedLines: HOSTILE.length });
      const text = readFileSync(join(folder, name), 'utf8');
      expect(text).toContain('SN070');
      expect(text).toContain('SN071');
    }
  });
});

describe('a request of the bench API', () => {
  it.each(HOSTILE)('with $name is refused before the log is touched, naming the field', async ({ spoil, field }) => {
    const logPath = join(folder, 'api.jsonl');
    const dispatch = createApiDispatch(createBenchApi({ projectRoot: root, logPath }));
    const { record: _r, schema: _s, id: _i, time: _t, software: _w, ...request } = spoiled(spoil) as BenchRecord & Record<string, unknown>;
    const answer = await dispatch('appendBenchLog', [request]);
    expect(answer).toMatchObject({ ok: false, code: 'bad-argument' });
    expect((answer as { error: string }).error).toMatch(/^appendBenchLog: argument 1: /);
    expect((answer as { error: string }).error).toMatch(new RegExp(field.source.replace(/\\\./g, '(\\.|: )')));
    expect(existsSync(logPath)).toBe(false);
  });
});
