// batch --log keeps the test conditions a lot report needs (station, note, operator, each checked as log add checks them),
// refuses a --log that is not a bench log before fitting anything, and, as log add, does not log an answer a setup
// check refused nor a unit id (its file name) holding control characters.
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRandom } from '../../core/random';
import { readBenchLog } from '../../main/io/benchLog';
import { NOMINAL_LOOP, writeLoopCapture } from '../fixtures/benchLog/captures';
import { runCliIn } from './cliHarness';

/** Each test fits a small lot; on a busy machine that takes a while (no time is asserted). */
const SLOW = 120_000;
let folder: string;

/** A 5 V tone at 2 MHz that never decays, 1 % noise, seeded (invented data): a setup check refuses its damping. */
function toneText(): string {
  const random = createRandom(5);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 1200; i++) {
    const t = (i - 100) * 25e-9;
    const y = t < 0 ? 0 : 5 * (1 - Math.cos(2 * Math.PI * 2e6 * t));
    text += `${t.toExponential(6)},${(y + 0.05 * random.normal()).toFixed(5)}\n`;
  }
  return text;
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-batch-labels-'));
  mkdirSync(join(folder, 'lot'));
  writeLoopCapture(join(folder, 'lot'), 'u1.csv', NOMINAL_LOOP, 201);
  writeLoopCapture(join(folder, 'lot'), 'u2.csv', { ...NOMINAL_LOOP, R: 2 }, 202);
  mkdirSync(join(folder, 'mixed'));
  writeLoopCapture(join(folder, 'mixed'), 'u3.csv', NOMINAL_LOOP, 203);
  writeFileSync(join(folder, 'mixed', 'tone.csv'), toneText());
  writeLoopCapture(join(folder, 'mixed'), 'u\u202e4.csv', NOMINAL_LOOP, 204);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('batch --log: test conditions in every record', () => {
  it('--station and --note are kept with the operator in each record', async () => {
    const log = join(folder, 'labels.jsonl');
    const { code } = await runCliIn(folder, ['batch', 'lot', '--jobs', '1', '--log', log, '--operator', 'K. Osei', '--station', 'ICT-3', '--note', 'lot 42, first pass']);
    expect(code).toBe(0);
    const { records } = readBenchLog(log);
    expect(records.map((r) => [r.unit, r.operator, r.station, r.note])).toEqual([
      ['u1', 'K. Osei', 'ICT-3', 'lot 42, first pass'],
      ['u2', 'K. Osei', 'ICT-3', 'lot 42, first pass'],
    ]);
  }, SLOW);

  it.each([
    ['--station', 'ICT\u202e3'],
    ['--operator', 'K.\u0007Osei'],
    ['--note', 'bad\u0000note'],
  ])('%s with a control character is bad input: exit 2 naming it, nothing logged', async (option, value) => {
    const log = join(folder, `refused${option}.jsonl`);
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--jobs', '1', '--log', log, option, value]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toContain(option);
    expect(() => readFileSync(log)).toThrow();
  });

  it('a --log that is a capture is refused before anything is fitted, and left untouched', async () => {
    const capture = join(folder, 'lot', 'u1.csv');
    const before = readFileSync(capture, 'utf8');
    const { code, out, err } = await runCliIn(folder, ['batch', 'lot', '--jobs', '1', '--log', capture]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(/not a bench log/);
    expect(readFileSync(capture, 'utf8')).toBe(before);
  });

  it('an answer a setup check refused is not logged (as log add), nor a unit whose file name holds a control character; exit 1', async () => {
    const log = join(folder, 'mixed.jsonl');
    const { code, out } = await runCliIn(folder, ['batch', 'mixed', '--jobs', '1', '--log', log]);
    expect(code).toBe(1);
    expect(readBenchLog(log).records.map((r) => r.unit)).toEqual(['u3']);
    expect(out).toMatch(/unit id \(the file name without its extension\) must not contain bidirectional control characters/);
  }, SLOW);
});
