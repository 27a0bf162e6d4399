// `compare` when a fit finds a single decay (first-order: tau, no alpha or omega0): two single decays compare
// their tau; a single decay against a ring has no quantity in common, so no change is judged (exit 1). Never a
// NaN row, and never bad input (exit 2) for what the fit found.
import { copyFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { createRandom } from '../../core/random';

let folder: string;
const run = (args: string[]) => runCliIn(folder, args);
const RING = path.resolve(__dirname, '../../sample-captures/switch-node-before.csv');

const TAU = 20e-6;

/** An RC step of 12 V with time constant tau, event at 0, 0.5 % noise (seeded), 100 ns samples from -20 us: invented data. */
function writeRcStep(file: string, tau: number, seed: number): void {
  const random = createRandom(seed);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 2400; i++) {
    const t = (i - 200) * 100e-9;
    const y = t < 0 ? 0 : 12 * (1 - Math.exp(-t / tau));
    text += `${t.toExponential(6)},${(y + 0.06 * random.normal()).toFixed(5)}\n`;
  }
  writeFileSync(path.join(folder, file), text);
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-compare-decay-'));
  copyFileSync(RING, path.join(folder, 'ring.csv'));
  writeRcStep('decay.csv', TAU, 7);
  writeRcStep('decay-again.csv', TAU, 8);
  writeRcStep('decay-slower.csv', 1.3 * TAU, 9);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('compare with a single decay', () => {
  it('a ring against a single decay: undetermined, exit 1, the reason names the single decay; no NaN (text and JSON)', async () => {
    const text = await run(['compare', 'ring.csv', 'decay.csv']);
    expect(text.code).toBe(1);
    expect(text.out).not.toMatch(/NaN/);
    expect(text.out).toMatch(/verdict: undetermined: decay\.csv holds a single decay \(first-order, tau [^)]+\) and ring\.csv a second-order response: no quantity is common to both/);
    const json = await run(['compare', 'decay.csv', 'ring.csv', '--json']);
    expect(json.code).toBe(1);
    const body = JSON.parse(json.out);
    expect(body.verdict).toBe('undetermined');
    expect(body.quantities).toEqual([]);
  });

  it('two single decays compare tau: the difference and its combined uncertainty as computed by hand', async () => {
    const [a, b] = await Promise.all(['decay.csv', 'decay-slower.csv'].map(async (f) => JSON.parse((await run(['fit', f, '--json'])).out)));
    expect([a.regime, b.regime]).toEqual(['first-order', 'first-order']);
    const r = await run(['compare', 'decay.csv', 'decay-slower.csv', '--json']);
    expect(r.code).toBe(0);
    const body = JSON.parse(r.out);
    expect(body.quantities.map((q: { name: string }) => q.name)).toEqual(['tau']);
    const [tau] = body.quantities;
    expect(tau.difference.value).toBeCloseTo(b.tau.value - a.tau.value, 15);
    // Independent captures: u(difference) = sqrt(u_a^2 + u_b^2) (GUM 5.1.2, sensitivities +1 and -1).
    expect(tau.difference.stderr).toBeCloseTo(Math.hypot(a.tau.stderr, b.tau.stderr), 15);
    expect(body.verdict).toBe('changed');
    expect(body.reason).toMatch(/^tau moved beyond chance/);
  });

  it('two captures of the same single decay: no significant change, exit 0', async () => {
    const r = await run(['compare', 'decay.csv', 'decay-again.csv']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/verdict: no significant change: the change in tau is within what the noise explains/);
  });

  it('with a known part: R, L and C are not derived from a single decay, and that is no bad input', async () => {
    const r = await run(['compare', 'decay.csv', 'decay-again.csv', '--topology', 'series', '--known', 'C=1u', '--json']);
    expect(r.code).toBe(0);
    const body = JSON.parse(r.out);
    expect(body.quantities.map((q: { name: string }) => q.name)).toEqual(['tau']);
    expect(body.notes.join(' ')).toMatch(/R, L and C are not compared: a single decay/);
  });
});
