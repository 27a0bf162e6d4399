// The response fit's other explanations on the command line: no response (exit 1), a first-order step (tau only, no R, L, C), --jump-start.

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { firstOrderShape, generatedTrace, secondOrderShape } from '../core/trust/responseRecords';
import type { Trace } from '../../core/fit/trace';
import { runCliIn } from './cliHarness';

let folder = '';

const run = (args: string[]) => runCliIn(folder, args);

function writeCsv(name: string, trace: Trace): void {
  const rows = Array.from(trace.time, (t, i) => `${t.toExponential(6)},${trace.values[i].toFixed(6)}`);
  writeFileSync(path.join(folder, name), `Time (s),CH1 (V)\n${rows.join('\n')}\n`);
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-models-'));
  writeCsv('level.csv', generatedTrace({ seed: 41, samples: 1000, dt: 1e-9, noise: 0.01 }, (time) => time.map(() => 3.3)));
  // An RC step, tau = 150 ns (the generator's truth).
  writeCsv('rc.csv', generatedTrace({ seed: 42, samples: 1500, dt: 1e-9, noise: 0.02 }, firstOrderShape({ t0: 200e-9, yPre: 0, yStart: 0, yFinal: 5, tau: 150e-9 })));
  // A capacitor's current after a current step: jumps to 1 A, rings to zero.
  const alpha = 2e6;
  writeCsv('jump.csv', generatedTrace({ seed: 43, samples: 2000, dt: 1e-9, noise: 0.01 }, secondOrderShape({ t0: 200e-9, yPre: 0, yFinal: 0, alpha, omega0: 2 * Math.PI * 5e6, a: 1, b: -alpha })));
});

afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('fit on records that are not a ring', () => {
  it('a level with noise: no response found, exit 1', async () => {
    const { code, out } = await run(['fit', 'level.csv', '--json']);
    expect(JSON.parse(out)).toMatchObject({ status: 'no-response', message: 'no second-order response found' });
    expect(code).toBe(1);
  });

  it('an RC step: first order, tau in the JSON and the table, no ring rows', async () => {
    const json = await run(['fit', 'rc.csv', '--json']);
    expect(json.code).toBe(0);
    const summary = JSON.parse(json.out);
    expect(summary.regime).toBe('first-order');
    expect(summary.tau.unit).toBe('s');
    expect(Math.abs(summary.tau.value - 150e-9)).toBeLessThan(3 * summary.tau.stderr);
    const text = await run(['fit', 'rc.csv']);
    expect(text.out).toMatch(/^ {2}tau +\d/m);
    expect(text.out).not.toMatch(/^ {2}omega0 /m);
  });

  it('an RC step with a known part: refused, one time constant gives no R, L, C (exit 2)', async () => {
    const { code, err } = await run(['fit', 'rc.csv', '--topology', 'series', '--known', 'C=1n']);
    expect(code).toBe(2);
    expect(err).toMatch(/only tau is reported/);
  });

  it('--jump-start fits the initial value freely', async () => {
    const { code, out } = await run(['fit', 'jump.csv', '--jump-start', '--json']);
    expect(code).toBe(0);
    expect(JSON.parse(out).warnings.join(' ')).toMatch(/jumps at the event: its initial value was fitted freely/);
  });
});
