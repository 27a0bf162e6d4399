// --probe-ratio and --invert: the channel's values scaled and turned over before the fit, on fit and log add, and
// the report reading the capture again the same way; bad ratios refused with exit 2 and one line.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { createRandom } from '../../core/random';
import { loadReportTraces } from '../../main/app/reportFile';
import { readBenchLog } from '../../main/io/benchLog';
import { runCliIn } from './cliHarness';

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-probe-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A step of 4.8 V (what a 10:1 probe hands a scope set to 1:1 on a 48 V step) ringing to rest. */
const STEP = 4.8;
const ALPHA = 3e4;
const OMEGA_D = 2 * Math.PI * 60e3;
const DT = 0.2e-6;
const ROWS = 1000;
const PRE_TRIGGER_ROWS = 100;
const NOISE = 5e-3;
/** Agreement asked of ratios that should be exact up to the fit's noise: well beyond its error bars here. */
const CLOSE = 1e-3;

function stepFile(): string {
  const random = createRandom(4242);
  const lines = ['Time (s),Vsw (V)'];
  for (let i = 0; i < ROWS; i++) {
    const t = (i - PRE_TRIGGER_ROWS) * DT;
    const v = t < 0 ? 0 : STEP * (1 - Math.exp(-ALPHA * t) * (Math.cos(OMEGA_D * t) + (ALPHA / OMEGA_D) * Math.sin(OMEGA_D * t)));
    lines.push(`${t.toExponential(6)},${(v + NOISE * random.normal()).toFixed(5)}`);
  }
  const file = path.join(dir, 'probed-step.csv');
  writeFileSync(file, `${lines.join('\n')}\n`);
  return file;
}

const run = (args: string[]) => runCliIn(dir, args);
const file = stepFile();

async function fitJson(...options: string[]): Promise<Record<string, any>> {
  const { code, out, err } = await run(['fit', file, '--json', ...options]);
  expect(err).toBe('');
  expect(code).toBe(0);
  return JSON.parse(out);
}

describe('fit --probe-ratio and --invert', () => {
  it('multiplies the final value by the ratio and leaves the rates alone', async () => {
    const plain = await fitJson();
    const probed = await fitJson('--probe-ratio', '10');
    expect(plain.finalValue.value).toBeCloseTo(STEP, 1);
    expect(Math.abs(probed.finalValue.value / plain.finalValue.value - 10)).toBeLessThan(10 * CLOSE);
    expect(Math.abs(probed.alpha.value / plain.alpha.value - 1)).toBeLessThan(CLOSE);
    expect(Math.abs(probed.omega0.value / plain.omega0.value - 1)).toBeLessThan(CLOSE);
  });

  it('turns the values over with --invert, and takes 10:1 with it', async () => {
    const plain = await fitJson();
    const both = await fitJson('--probe-ratio', '10:1', '--invert');
    expect(Math.abs(both.finalValue.value / plain.finalValue.value + 10)).toBeLessThan(10 * CLOSE);
  });

  for (const bad of ['0', '-10', 'ten', '10:2']) {
    it(`refuses --probe-ratio ${bad} with exit 2 and one line naming the flag`, async () => {
      const { code, out, err } = await run(['fit', file, '--probe-ratio', bad]);
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err).toContain(`--probe-ratio '${bad}'`);
    });
  }
});

describe('log add --probe-ratio --invert', () => {
  it("keeps both in the record's settings, and the report reads the capture scaled and turned over again", async () => {
    const { code, err } = await run(['log', 'add', file, '--probe-ratio', '10', '--invert', '--log', 'bench.jsonl', '--unit', 'SN9', '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    const [record] = readBenchLog(path.join(dir, 'bench.jsonl')).records;
    expect(record.settings.probeRatio).toBe('10');
    expect(record.settings.invert).toBe(true);
    expect(record.fit.finalValue.value).toBeCloseTo(-10 * STEP, 0);
    const trace = loadReportTraces([record]).traces[record.id];
    const raw = parseCapture(readFileSync(file, 'utf8')).channels[0].values;
    expect(Array.from(trace.values)).toEqual(Array.from(raw, (v) => -10 * v));
  });
});
