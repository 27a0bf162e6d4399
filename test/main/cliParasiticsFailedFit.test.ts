// parasitics with a capture whose fit gives no ring (no response, a single decay) is a failed measurement, not bad
// input: exit 1 and one line naming the file and the fit's state, nothing on stdout; bad input stays exit 2.
import { copyFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { createRandom } from '../../core/random';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');
const BARE = 'switch-node-before.csv';
let folder: string;

const run = (args: string[]) => runCliIn(folder, args);

/** 2000 samples of 1 ns at 1 V with 1 % noise (seeded): nothing responds. Invented data. */
function writeFlatLevel(file: string): void {
  const random = createRandom(11);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 2000; i++) text += `${((i - 200) * 1e-9).toExponential(6)},${(1 + 0.01 * random.normal()).toFixed(6)}\n`;
  writeFileSync(file, text);
}

/** A 12 V RC step, tau 100 ns, 1 ns samples from -200 ns, 0.5 % noise (seeded): a single decay, no ring. Invented data. */
function writeRcStep(file: string): void {
  const random = createRandom(5);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 2000; i++) {
    const t = (i - 200) * 1e-9;
    text += `${t.toExponential(6)},${((t < 0 ? 0 : 12 * (1 - Math.exp(-t / 100e-9))) + 0.06 * random.normal()).toFixed(5)}\n`;
  }
  writeFileSync(file, text);
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-parasitics-failed-'));
  copyFileSync(path.join(SAMPLES, BARE), path.join(folder, BARE));
  writeFlatLevel(path.join(folder, 'flat-level.csv'));
  writeRcStep(path.join(folder, 'rc-step.csv'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('parasitics with a failed fit', () => {
  it('a capture with no response exits 1 with one line naming it and its status, and prints no snubber', async () => {
    for (const json of [[], ['--json']]) {
      const r = await run(['parasitics', BARE, 'flat-level.csv', '--added', 'C=470p', '--added-tolerance', '0', ...json]);
      expect(r.code).toBe(1);
      expect(r.out).toBe('');
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(/^ringbench: flat-level\.csv: no ring to measure \(no-response\)/);
      expect(r.err).not.toMatch(/internal error/);
    }
  });

  it('a capture fitted as a single decay exits 1 naming it as converged, first-order', async () => {
    const r = await run(['parasitics', 'rc-step.csv', BARE, '--added', 'C=470p', '--added-tolerance', '0']);
    expect(r.code).toBe(1);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/^ringbench: rc-step\.csv: no ring to measure \(converged, first-order\); the added-capacitor method needs an underdamped ring in every capture\n$/);
  });

  it('bad input still exits 2: the same capture twice', async () => {
    const r = await run(['parasitics', BARE, BARE, '--added', 'C=470p', '--added-tolerance', '0']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/cannot separate L_p and C_p/);
  });
});
