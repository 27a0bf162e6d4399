// A capture a setup check refuses (here a ring sampled under 2.5 times a period: its frequency is an alias) is a
// failed measurement for every use case, as for `fit`: `check` gives it no verdict, `parasitics` no L_p and C_p,
// `compare` no change; each exits 1 naming the file and the check. Never a PASS or a number from the alias.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { createRandom } from '../../core/random';
import { evaluateResponse } from '../../core/response/secondOrder';

let folder: string;
const run = (args: string[]) => runCliIn(folder, args);

/** A switch-node loop: L 6.5 nH, R 280 mOhm; the bare node 390 pF, with 470 pF added 860 pF (invented values). */
const L = 6.5e-9;
const R = 0.28;
const STEP = 48;
const ALPHA = R / (2 * L);
/** The slow capture's sample interval: 125 MS/s, under 2 samples per period of the 67.3 MHz ring with 470 pF added. */
const SLOW_INTERVAL = 8e-9;

/** A 48 V step into the series loop with node capacitance C: the capacitor voltage, 50 mV noise (seeded); invented data. */
function writeStep(file: string, C: number, interval: number, samples: number, seed: number): void {
  const omega0 = 1 / Math.sqrt(L * C);
  const time = Float64Array.from({ length: samples }, (_, i) => i * interval);
  const t0 = 0.05 * samples * interval;
  const clean = evaluateResponse({ t0, yPre: 0, yFinal: STEP, a: -STEP, b: -ALPHA * STEP, alpha: ALPHA, omega0 }, time);
  const random = createRandom(seed);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < samples; i++) text += `${time[i].toExponential(9)},${(clean[i] + 0.05 * random.normal()).toPrecision(8)}\n`;
  writeFileSync(path.join(folder, file), text);
}

/**
 * The natural frequency the aliased capture shows, Hz: sampling e^(-alpha t) cos(omega_d t) at fs folds the ring
 * frequency f_d to fs - f_d (for fs / 2 < f_d < fs) and keeps alpha (derived from the sampling theorem).
 */
function aliasedF0(C: number): number {
  const fs = 1 / SLOW_INTERVAL;
  const decay = ALPHA / (2 * Math.PI);
  const fd = Math.sqrt(1 / (4 * Math.PI ** 2 * L * C) - decay ** 2);
  return Math.hypot(fs - fd, decay);
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-refused-'));
  writeStep('bare.csv', 390e-12, 0.2e-9, 2000, 1);
  writeStep('added-470p-slow.csv', 860e-12, SLOW_INTERVAL, 400, 3);
  // A design built for what the alias shows (the same L and R, the C that rings at the aliased f0): it would pass.
  const aliasC = 1 / ((2 * Math.PI * aliasedF0(860e-12)) ** 2 * L);
  const design = {
    format: 'ringbench-design',
    version: 1,
    name: 'the alias',
    topology: 'series',
    components: { R: { value: R, tolerance: 0.1 }, L: { value: L, tolerance: 0.1 }, C: { value: aliasC, tolerance: 0.1 } },
    source: { kind: 'step', amplitude: STEP, initialLevel: 0 },
    probe: 'capacitor-voltage',
  };
  writeFileSync(path.join(folder, 'alias.json'), JSON.stringify(design));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const REFUSAL = /2\.\d samples per ring period \(57\.\d+ MHz sampled every 8 ns\): under 2\.5 the frequency may be an alias/;

describe('a capture sampled under 2.5 times a ring period', () => {
  it('fit refuses it (exit 1): the fitted f0 is the alias, not the 67.3 MHz the loop rings at', async () => {
    const r = await run(['fit', 'added-470p-slow.csv', '--json']);
    expect(r.code).toBe(1);
    const fit = JSON.parse(r.out);
    expect(fit.omega0.value / (2 * Math.PI) / aliasedF0(860e-12) - 1).toBeLessThan(1e-3);
    expect(fit.setupChecks.find((c: { level: string }) => c.level === 'refusal').message).toMatch(REFUSAL);
  });

  it('check: no verdict against a design it would pass, exit 1, the refusal as the reason (text and JSON)', async () => {
    const text = await run(['check', 'added-470p-slow.csv', '--design', 'alias.json']);
    expect(text.code).toBe(1);
    expect(text.out).not.toMatch(/PASS|FAIL/);
    expect(text.out).toMatch(/ {2}verdict {10}none: a setup check refused the capture \(2\.\d samples per ring period.*\), so nothing was checked against 'the alias'\n/);
    const json = await run(['check', 'added-470p-slow.csv', '--design', 'alias.json', '--json']);
    expect(json.code).toBe(1);
    const body = JSON.parse(json.out);
    expect(body.verdict).toBeNull();
    expect(body.noVerdict).toMatch(REFUSAL);
  });

  it('parasitics: a failed measurement, exit 1, one line naming the file and the refusal, no L_p printed', async () => {
    const r = await run(['parasitics', 'bare.csv', 'added-470p-slow.csv', '--added', 'C=470p', '--added-tolerance', '0']);
    expect(r.code).toBe(1);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/^ringbench: added-470p-slow\.csv: a setup check refused the capture: /);
    expect(r.err).toMatch(REFUSAL);
  });

  it('compare: undetermined, exit 1, the refusal as the reason, no change rows', async () => {
    const r = await run(['compare', 'bare.csv', 'added-470p-slow.csv', '--json']);
    expect(r.code).toBe(1);
    const body = JSON.parse(r.out);
    expect(body.verdict).toBe('undetermined');
    expect(body.quantities).toEqual([]);
    expect(body.reason).toMatch(/^a setup check refused added-470p-slow\.csv: /);
    expect(body.reason).toMatch(REFUSAL);
  });
});
