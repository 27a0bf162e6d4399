// `ringbench report` run in-process: formats by extension, bad input with exit 2 and nothing written.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../main/cli/program';
import type { CliIo } from '../../main/cli/io';
import { appendBenchLog } from '../../main/io/benchLog';
import { loggedCapture } from '../fixtures/benchLog/loggedCapture';
import { NOMINAL_LOOP } from '../fixtures/benchLog/captures';
import { sampleTransitions } from '../fixtures/benchLog/sampleRecord';

let folder: string;

async function run(args: string[]) {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => (out += t), err: (t) => (err += t), cwd: folder, interactive: false };
  return { code: await runCli(args, io), out: () => out, err: () => err };
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-reportcli-'));
  appendBenchLog(join(folder, 'bench.jsonl'), loggedCapture(folder, '00000000000a', 'SN040', 'sn040.csv'));
  appendBenchLog(join(folder, 'bench.jsonl'), loggedCapture(folder, '00000000000b', 'SN041', 'sn041.csv', { ...NOMINAL_LOOP, R: 2 }));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('report', () => {
  it.each([
    { out: 'report.html', marker: '<!DOCTYPE html>', format: 'html' },
    { out: 'report.md', marker: '# Bench report', format: 'md' },
    { out: 'report.csv', marker: 'id,time,unit,', format: 'csv' },
  ])('writes $out and says so', async ({ out, marker, format }) => {
    const result = await run(['report', '--log', 'bench.jsonl', '--out', out]);
    expect(result.code).toBe(0);
    expect(result.out()).toBe(`wrote ${out} (${format}, 2 measurements)\n`);
    expect(readFileSync(join(folder, out), 'utf8').startsWith(marker)).toBe(true);
  });

  it('carries the transition metrics of a logged step into every format', async () => {
    const step = loggedCapture(folder, '00000000000c', 'SN042', 'sn042.csv', NOMINAL_LOOP, { note: null });
    step.fit.transitions = sampleTransitions();
    appendBenchLog(join(folder, 'steps.jsonl'), step);
    for (const out of ['steps.html', 'steps.md', 'steps.csv']) expect((await run(['report', '--log', 'steps.jsonl', '--out', out])).code).toBe(0);
    const read = (name: string) => readFileSync(join(folder, name), 'utf8');
    expect(read('steps.html')).toMatch(/<th scope="row">rise time<\/th><td class="num">4\.583 ns ± 21 ps \(0\.46 %\)<\/td><td class="num">4\.61 ns<\/td>/);
    expect(read('steps.html')).toContain('State levels: fitted model;');
    expect(read('steps.md')).toContain('| overshoot | 68.61 % ± 0.21 % (0.31 %) | 69.3 % |');
    const [header, row] = read('steps.csv').split('\r\n').map((line) => line.split(','));
    expect(Number(row[header.indexOf('settling_2pct_s')])).toBe(1.611e-7);
    expect(row[header.indexOf('transition_levels')]).toBe('fitted model');
  });

  it('tells on stderr which captures could not be plotted', async () => {
    writeFileSync(join(folder, 'sn041.csv'), 'changed');
    const result = await run(['report', '--log', 'bench.jsonl', '--out', 'changed.html']);
    expect(result.code).toBe(0);
    expect(result.err()).toMatch(/^ringbench: note: The capture .*sn041\.csv has changed since it was logged/);
  });

  it.each([
    { args: ['--log', 'bench.jsonl', '--out', 'report.pdf'], message: /--out 'report\.pdf': the name must end in \.html, \.md or \.csv/ },
    { args: ['--log', 'missing.jsonl', '--out', 'x.html'], message: /no bench log at/ },
    { args: ['--log', 'bench.jsonl', '--out', 'nowhere/x.html'], message: /report folder .*nowhere.* does not exist/ },
    { args: ['--log', 'bench.jsonl'], message: /required option '--out <file>' not specified/ },
  ])('refuses $args with exit 2 and writes nothing', async ({ args, message }) => {
    const before = readdirSync(folder).sort();
    const result = await run(['report', ...args]);
    expect(result.code).toBe(2);
    expect(result.out()).toBe('');
    expect(result.err()).toMatch(message);
    expect(readdirSync(folder).sort()).toEqual(before);
  });
});
