// `ringbench log add`, `log list` and `batch` run in-process: what they print, log and exit with.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readBenchLog } from '../../main/io/benchLog';
import { NOMINAL_LOOP, writeLoopCapture, writeLoopDesign } from '../fixtures/benchLog/captures';
import { runCliIn } from './cliHarness';

let folder: string;

const run = (args: string[], interactive = false) => runCliIn(folder, args, interactive);

const bytesOf = (path: string) => (existsSync(path) ? readFileSync(path) : null);

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-logcli-'));
  writeLoopCapture(folder, 'sn040.csv', NOMINAL_LOOP, 40);
  // SN041: the gate resistor was fitted at twice its value, so damping is far out of tolerance.
  writeLoopCapture(folder, 'sn041.csv', { ...NOMINAL_LOOP, R: 3 }, 41);
  writeFileSync(join(folder, 'broken.csv'), 'Time (s),Gate (V)\n0,1\nnot,a number row\n');
  writeLoopDesign(folder);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('log add', () => {
  it('fits, checks against the design, appends one record and prints what was logged', async () => {
    const { code, out } = await run(['log', 'add', 'sn040.csv', '--log', 'bench.jsonl', '--unit', 'SN040', '--design', 'gate-loop.json', '--operator', 'M. Okafor', '--note', 'first article']);
    expect(code).toBe(0);
    expect(out).toMatch(/^logged SN040 to bench\.jsonl \(record [0-9a-f]{12}, \d{4}-\d\d-\d\dT/);
    expect(out).toMatch(/verdict\s+PASS against 'gate loop rev C'/);
    expect(out).toMatch(/cautions: no threshold reached/);
    const { records } = readBenchLog(join(folder, 'bench.jsonl'));
    expect(records).toHaveLength(1);
    const r = records[0];
    expect(r).toMatchObject({ record: 'ringbench-measurement', schema: 1, unit: 'SN040', operator: 'M. Okafor', note: 'first article' });
    expect(r.capture).toMatchObject({ path: join(folder, 'sn040.csv'), channel: 'Gate', bytes: readFileSync(join(folder, 'sn040.csv')).length });
    expect(r.capture.sha256).toBe(createHash('sha256').update(readFileSync(join(folder, 'sn040.csv'))).digest('hex'));
    expect(r.design).toMatchObject({ path: join(folder, 'gate-loop.json'), name: 'gate loop rev C' });
    expect(r.verdict!.pass).toBe(true);
    expect(r.software).toEqual({ name: 'ringbench', version: '0.1.0' });
    // The fitted loop: alpha = R / 2L = 62.5 Ms^-1, omega0 = 1 / sqrt(LC) = 194.6 Mrad/s (series relations).
    expect(r.fit.alpha.value / 62.5e6).toBeCloseTo(1, 1);
    expect(r.fit.omega0.value / 194.6e6).toBeCloseTo(1, 2);
  });

  it('logs an out-of-tolerance unit, names the likely cause, exits 3, and prints JSON with --json', async () => {
    const { code, out } = await run(['log', 'add', 'sn041.csv', '--log', 'bench.jsonl', '--unit', 'SN041', '--design', 'gate-loop.json', '--json']);
    expect(code).toBe(3);
    const printed = JSON.parse(out);
    expect(printed.logged.unit).toBe('SN041');
    expect(printed.logged.verdict.pass).toBe(false);
    expect(printed.logged.verdict.likelyCause.component).toBe('R');
    expect(printed.cautions.deferral).toMatch(/local electrical codes/);
    expect(readBenchLog(join(folder, 'bench.jsonl')).records.map((r) => r.unit)).toEqual(['SN040', 'SN041']);
  });

  it.each([
    { why: 'an empty unit id', args: ['--unit', '   '], message: /--unit must not be empty/ },
    { why: 'a unit id with a line break', args: ['--unit', 'SN\n42'], message: /--unit must not contain line breaks/ },
    { why: 'a missing log folder', args: ['--unit', 'SN042', '--log', 'nowhere/bench.jsonl'], message: /bench log folder .*nowhere.* does not exist/ },
    { why: 'an unknown option', args: ['--unit', 'SN042', '--wobble', 'red'], message: /unknown option '--wobble'/ },
    { why: '--design with --known', args: ['--unit', 'SN042', '--design', 'gate-loop.json', '--topology', 'series', '--known', 'C=2.2n'], message: /leave out --topology and --known/ },
    { why: 'a bad design', args: ['--unit', 'SN042', '--design', 'broken.csv'], message: /^ringbench: broken\.csv: design: not valid JSON/ },
    { why: 'a bad capture', args: ['--unit', 'SN042', '--file', 'broken.csv'], message: /no rows of numbers found/ },
  ])('refuses $why with one line and exit 2, leaving the log bytes unchanged', async ({ args, message }) => {
    const log = join(folder, 'bench.jsonl');
    const before = bytesOf(log);
    const fileIndex = args.indexOf('--file');
    const file = fileIndex >= 0 ? args[fileIndex + 1] : 'sn040.csv';
    const rest = fileIndex >= 0 ? args.filter((_, i) => i !== fileIndex && i !== fileIndex + 1) : args;
    const logArgs = rest.includes('--log') ? [] : ['--log', 'bench.jsonl'];
    const { code, out, err } = await run(['log', 'add', file, ...logArgs, ...rest]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trimEnd().split('\n')).toHaveLength(1);
    expect(err).toMatch(message);
    expect(bytesOf(log)).toEqual(before);
    expect(existsSync(join(folder, 'nowhere'))).toBe(false);
  });
});

describe('log list', () => {
  it('prints one line per measurement and reports a torn tail on stderr', async () => {
    const log = join(folder, 'listed.jsonl');
    writeFileSync(log, `${readFileSync(join(folder, 'bench.jsonl'), 'utf8')}{"record":"ringbench-measurement","sch`);
    const { code, out, err } = await run(['log', 'list', '--log', 'listed.jsonl']);
    expect(code).toBe(0);
    const lines = out.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^id\s+time\s+unit\s+regime\s+f0\s+zeta\s+verdict$/);
    expect(lines[1]).toMatch(/^[0-9a-f]{12}  \d{4}-.*SN040\s+underdamped\s+3\d\.\d+ MHz\s+0\.3\d*\s+pass$/);
    expect(lines[2]).toMatch(/SN041\s+underdamped\s+.*fail$/);
    expect(err).toMatch(/cut-off line 3/);
  });

  it('prints { records, torn } with --json', async () => {
    const { out } = await run(['log', 'list', '--log', 'listed.jsonl', '--json']);
    const printed = JSON.parse(out);
    expect(printed.records).toHaveLength(2);
    expect(printed.torn.line).toBe(3);
  });

  it('lists the records around a bad line in the middle, names the line and exits 1', async () => {
    const log = join(folder, 'bad.jsonl');
    const [first, second] = readFileSync(join(folder, 'bench.jsonl'), 'utf8').split('\n');
    writeFileSync(log, `${first}\n{"record":"nope"}\n${second}\n`);
    const { code, out, err } = await run(['log', 'list', '--log', 'bad.jsonl']);
    expect(code).toBe(1);
    expect(out.trimEnd().split('\n')).toHaveLength(3);
    expect(err).toMatch(/^ringbench: note: bench log 'bad\.jsonl' line 2: not a ringbench measurement record/);
  });

  it('fails with exit 2 for a log that does not exist', async () => {
    const { code, err } = await run(['log', 'list', '--log', 'missing.jsonl']);
    expect(code).toBe(2);
    expect(err).toMatch(/no bench log at/);
  });
});

describe('batch', () => {
  it('fits every capture by name order, reports a bad file without stopping, logs the good ones, exits 1', async () => {
    const { code, out, err } = await run(['batch', '.', '--design', 'gate-loop.json', '--log', 'batch.jsonl', '--json', '--jobs', '1'], true);
    expect(code).toBe(1);
    const results = JSON.parse(out) as { file: string; error?: string; verdict?: { pass: boolean } }[];
    expect(results.map((r) => r.file)).toEqual(['broken.csv', 'sn040.csv', 'sn041.csv']);
    expect(results[0].error).toMatch(/no rows of numbers found/);
    expect(results[1].verdict!.pass).toBe(true);
    expect(results[2].verdict!.pass).toBe(false);
    expect(err).toMatch(/^\[#{24}\]  3\/3  done in \d+:\d\d$/m); // the progress bar on a terminal, a line per drawing in-process
    const logged = readBenchLog(join(folder, 'batch.jsonl')).records;
    expect(logged.map((r) => r.unit)).toEqual(['sn040', 'sn041']);
    for (const r of logged) expect(r.capture.sha256).toBe(createHash('sha256').update(readFileSync(join(folder, `${r.unit}.csv`))).digest('hex'));
  });

  it('prints a table and no progress when not interactive; exit 3 when all fitted but one is out of tolerance', async () => {
    const sub = mkdtempSync(join(folder, 'units-'));
    writeLoopCapture(sub, 'a.CSV', NOMINAL_LOOP, 1);
    writeLoopCapture(sub, 'b.dat', { ...NOMINAL_LOOP, R: 3 }, 2);
    writeFileSync(join(sub, 'notes.md'), 'not a capture');
    const { code, out, err } = await run(['batch', sub, '--design', join(folder, 'gate-loop.json')]);
    expect(err).toBe('');
    expect(code).toBe(3);
    const lines = out.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^file\s+status\s+warnings\s+regime\s+f0\s+zeta\s+Q\s+verdict\s+cautions$/);
    expect(lines[1]).toMatch(/^a\.CSV\s+converged\s+\d+\s+underdamped .* pass\s+-$/);
    expect(lines[2]).toMatch(/^b\.dat\s+converged .* FAIL\s+-$/);
    expect(lines).toHaveLength(3);
  });

  it.each([
    { args: ['batch', 'no-such-dir'], message: /cannot read folder .*no such folder/ },
    { args: ['batch', '.', '--log', 'nowhere/x.jsonl'], message: /bench log folder .* does not exist/ },
    { args: ['batch', '.', '--design', 'gate-loop.json', '--known', 'C=2n', '--topology', 'series'], message: /leave out --topology and --known/ },
  ])('refuses bad input before fitting anything: $args', async ({ args, message }) => {
    const before = bytesOf(join(folder, 'batch.jsonl'));
    const { code, out, err } = await run(args);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(message);
    expect(bytesOf(join(folder, 'batch.jsonl'))).toEqual(before);
  });
});
