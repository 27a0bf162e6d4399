// `batch --jobs`: the captures fitted on worker processes give the same table, JSON and log as in one thread, in folder
// order whatever finishes first; the progress bar only on a terminal; the built command finds its worker from any folder.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readBenchLog } from '../../main/io/benchLog';
import { progressLine } from '../../main/cli/batchProgress';
import { NOMINAL_LOOP, writeLoopCapture } from '../fixtures/benchLog/captures';
import { runCliIn } from './cliHarness';

/** Each test fits the lot several times over; on a busy machine that takes minutes, not seconds (no time is asserted). */
const SLOW = 300_000;

const ROOT = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');
let folder: string;
let captures: string;

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-jobs-'));
  captures = join(folder, 'lot');
  mkdirSync(captures);
  // Five units of the gate loop, their damping resistor spread over 1 to 3 ohm, and a file that is no capture.
  [1, 1.5, 2, 2.5, 3].forEach((R, i) => writeLoopCapture(captures, `u${i + 1}.csv`, { ...NOMINAL_LOOP, R }, 100 + i));
  writeFileSync(join(captures, 'u0-torn.csv'), 'Time (s),Gate (V)\n0,1\n1e-9,oops\n');
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('batch --jobs', () => {
  it('prints the same table and the same JSON with --jobs 1 and --jobs 2, in folder order', async () => {
    const one = await runCliIn(folder, ['batch', 'lot', '--jobs', '1']);
    const two = await runCliIn(folder, ['batch', 'lot', '--jobs', '2']);
    expect(one.code).toBe(1); // the torn file
    expect(two).toEqual(one);
    expect(one.out.split('\n').slice(1, 7).map((line) => line.split(' ')[0])).toEqual(['u0-torn.csv', 'u1.csv', 'u2.csv', 'u3.csv', 'u4.csv', 'u5.csv']);

    const jsonOne = await runCliIn(folder, ['batch', 'lot', '--jobs', '1', '--json']);
    const jsonTwo = await runCliIn(folder, ['batch', 'lot', '--jobs', '2', '--json']);
    expect(jsonTwo).toEqual(jsonOne);
    expect((JSON.parse(jsonOne.out) as { file: string }[]).map((e) => e.file)).toEqual(['u0-torn.csv', 'u1.csv', 'u2.csv', 'u3.csv', 'u4.csv', 'u5.csv']);
  }, SLOW);

  it('logs every converged capture once with --jobs 2, the unit named after its file', async () => {
    const log = join(folder, 'jobs.jsonl');
    const { code } = await runCliIn(folder, ['batch', 'lot', '--jobs', '2', '--log', log, '--operator', 'R. Adeyemi']);
    expect(code).toBe(1);
    const { records } = readBenchLog(log);
    expect(records.map((r) => r.unit).sort()).toEqual(['u1', 'u2', 'u3', 'u4', 'u5']);
    expect(new Set(records.map((r) => r.operator))).toEqual(new Set(['R. Adeyemi']));
  }, SLOW);

  it.each(['0', '-2', '1.5', 'two', ''])('--jobs %j is bad input: exit 2 naming --jobs, nothing fitted or logged', async (jobs) => {
    const log = join(folder, 'refused.jsonl');
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--jobs', jobs, '--log', log]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toContain('--jobs');
    expect(existsSync(log)).toBe(false);
  });
});

describe('progress', () => {
  it('draws a bar with count, rate and time left on a terminal, and writes nothing to stderr when piped', async () => {
    // In-process the io cannot redraw a line, so each drawing is a line of its own.
    const terminal = await runCliIn(folder, ['batch', 'lot', '--jobs', '2'], true);
    const bars = terminal.err.split('\n');
    expect(bars).toHaveLength(8);
    expect(bars[0]).toBe('[------------------------]  0/6  - captures/s  - left');
    for (const bar of bars.slice(1, 6)) expect(bar).toMatch(/^\[#+-+\]  [1-5]\/6  [\d.]+ captures\/s  \d+:\d\d left$/);
    expect(bars[6]).toMatch(/^\[#{24}\]  6\/6  done in \d+:\d\d$/);
    const piped = await runCliIn(folder, ['batch', 'lot', '--jobs', '2']);
    expect(piped.err).toBe('');
    expect(piped.out).toBe(terminal.out);
  }, SLOW);

  it.each([
    [0, 120, 0, '[------------------------]    0/120  - captures/s  - left'],
    [30, 120, 10, '[######------------------]   30/120  3.0 captures/s  0:30 left'],
    [60, 120, 3000, '[############------------]   60/120  0.020 captures/s  50:00 left'],
    [90, 120, 7200, '[##################------]   90/120  0.013 captures/s  40:00 left'],
    [120, 120, 3725, '[########################]  120/120  done in 1:02:05'],
  ])('%i of %i after %i s reads %j', (done, total, seconds, line) => {
    expect(progressLine(done, total, seconds)).toBe(line);
  });
});

describe('the built command line', () => {
  it('redraws its bar in place on a terminal (a pseudo-terminal made by script(1))', () => {
    const command = `${process.execPath} ${join(ROOT, 'bin/ringbench.js')} batch ${captures} --jobs 2 > /dev/null`;
    const shown = spawnSync('script', ['-q', '-e', '-c', command, '/dev/null'], { cwd: tmpdir(), encoding: 'utf8' });
    expect(shown.status).toBe(1);
    expect(shown.stdout).toMatch(/^\r\x1b\[K\[-{24}\]  0\/6  - captures\/s  - left\r\x1b\[K\[#+-+\]  1\/6 /);
    expect(shown.stdout).toMatch(/\r\x1b\[K\[#{24}\]  6\/6  done in \d+:\d\d\r?\n$/);
  }, SLOW);

  it('finds its worker from any working folder and prints what the source prints', async () => {
    const cli = join(ROOT, 'bin/ringbench.js');
    const built = spawnSync(process.execPath, [cli, 'batch', captures, '--jobs', '2', '--json'], { cwd: tmpdir(), encoding: 'utf8' });
    expect(built.stderr).toBe('');
    expect(built.status).toBe(1);
    const fromSource = await runCliIn(folder, ['batch', 'lot', '--jobs', '1', '--json']);
    expect(JSON.parse(built.stdout)).toEqual(JSON.parse(fromSource.out));
  }, SLOW);
});
