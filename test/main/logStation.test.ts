// The test conditions a record keeps (unit, operator, station, note, design name and hash, version) and the
// guard-banded verdict in the reports: `log add --station`, then `report` as Markdown and HTML, on real files.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readBenchLog } from '../../main/io/benchLog';
import { NOMINAL_LOOP, writeLoopCapture, writeLoopDesign } from '../fixtures/benchLog/captures';
import { runCliIn } from './cliHarness';

let folder: string;
const run = (args: string[]) => runCliIn(folder, args);

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-station-'));
  writeLoopCapture(folder, 'sn050.csv', NOMINAL_LOOP, 50);
  writeLoopDesign(folder);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('log add --station', () => {
  it('keeps the station with the other test conditions, and the reports show it with each zone and the rule', async () => {
    const added = await run(['log', 'add', 'sn050.csv', '--log', 'lot.jsonl', '--unit', 'SN050', '--design', 'gate-loop.json', '--operator', 'kim', '--station', 'fixture 3', '--note', 'after rework']);
    expect(added.code).toBe(0);
    const [record] = readBenchLog(join(folder, 'lot.jsonl')).records;
    expect(record).toMatchObject({ unit: 'SN050', operator: 'kim', station: 'fixture 3', note: 'after rework', design: { name: 'gate loop rev C' }, software: { name: 'ringbench' } });
    expect(record.design!.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(record.verdict).toMatchObject({ pass: true, decision: 'pass', rule: { name: 'guarded-acceptance', source: 'default' } });

    expect((await run(['report', '--log', 'lot.jsonl', '--out', 'lot.md'])).code).toBe(0);
    const markdown = readFileSync(join(folder, 'lot.md'), 'utf8');
    expect(markdown).toContain('operator kim · station fixture 3 · after rework');
    expect(markdown).toContain('Verdict against gate loop rev C: accepted: pass.');
    expect(markdown).toMatch(/Decision rule: guarded-acceptance, guard band w = 1 U, U = k u with k = 2 \(the default/);
    expect(markdown).toMatch(/\| zeta \| .* \| 0\.2835 to 0\.3642 \| .* \| pass \|/);
    // R derived with C at its design value: shown for diagnosis, not counted.
    expect(markdown).toMatch(/\| R \| .* \| conditional pass \(not counted\) \|/);

    expect((await run(['report', '--log', 'lot.jsonl', '--out', 'lot.html'])).code).toBe(0);
    const html = readFileSync(join(folder, 'lot.html'), 'utf8');
    expect(html).toContain('operator kim · station fixture 3 · after rework');
    expect(html).toContain('<th>Limits</th><th>U</th><th>Margin</th><th>Zone</th>');
    expect(html).toMatch(/<h4>Verdict against gate loop rev C: accepted: pass<\/h4>/);
  });

  it('leaves the station out of a record when not given', async () => {
    expect((await run(['log', 'add', 'sn050.csv', '--log', 'plain.jsonl', '--unit', 'SN050', '--design', 'gate-loop.json'])).code).toBe(0);
    expect(readBenchLog(join(folder, 'plain.jsonl')).records[0]).not.toHaveProperty('station');
  });

  it('refuses an empty station with one line and exit 2, logging nothing', async () => {
    const { code, err } = await run(['log', 'add', 'sn050.csv', '--log', 'refused.jsonl', '--unit', 'SN050', '--station', '  ']);
    expect(code).toBe(2);
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toContain('--station must not be empty');
    expect(() => readFileSync(join(folder, 'refused.jsonl'))).toThrow();
  });
});
