// `check` of a capture whose fit is a single decay (first-order): against a design that rings, no verdict and exit 1;
// against a design whose slow root dominates, tau and the levels are checked. Never a NaN row or an infinite margin.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { createRandom } from '../../core/random';

let folder: string;

const run = (args: string[]) => runCliIn(folder, args);

const STEP = 12;
/** Series R, L, C of the designs: L 10 uH, C 1 uF (omega0 316.2 krad/s); R 1 ohm rings (zeta 0.158), R 20 ohm does not (zeta 3.16). */
const L = 10e-6;
const C = 1e-6;
/** The slow time constant of the R 20 ohm design, 1 / (alpha - sqrt(alpha^2 - omega0^2)) with alpha = R / 2L: 19.487 us. */
const SLOW_TAU = 1 / (1e6 - Math.sqrt(1e12 - 1 / (L * C)));

/** An RC step of 12 V with time constant tau, event at 0, 0.5 % noise (seeded), 100 ns samples from -20 us: invented data. */
function writeRcStep(file: string, tau: number): void {
  const random = createRandom(7);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 2400; i++) {
    const t = (i - 200) * 100e-9;
    const y = t < 0 ? 0 : STEP * (1 - Math.exp(-t / tau));
    text += `${t.toExponential(6)},${(y + 0.005 * STEP * random.normal()).toFixed(5)}\n`;
  }
  writeFileSync(file, text);
}

function writeDesign(file: string, name: string, R: number): void {
  const design = {
    format: 'ringbench-design',
    version: 1,
    name,
    topology: 'series',
    components: { R: { value: R, tolerance: 0.05 }, L: { value: L, tolerance: 0.1 }, C: { value: C, tolerance: 0.02 } },
    source: { kind: 'step', amplitude: STEP, initialLevel: 0 },
    probe: 'capacitor-voltage',
  };
  writeFileSync(file, JSON.stringify(design));
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-first-order-'));
  writeRcStep(path.join(folder, 'rc-step.csv'), SLOW_TAU);
  writeRcStep(path.join(folder, 'rc-step-slow.csv'), 1.3 * SLOW_TAU);
  writeDesign(path.join(folder, 'ringing.json'), 'LC filter', 1);
  writeDesign(path.join(folder, 'overdamped.json'), 'damped filter', 20);
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('check with a single decay', () => {
  it('the capture is fitted as a single decay', async () => {
    const r = await run(['fit', 'rc-step.csv', '--json']);
    const fit = JSON.parse(r.out);
    expect(fit.status).toBe('converged');
    expect(fit.regime).toBe('first-order');
    expect(Math.abs(fit.tau.value - SLOW_TAU)).toBeLessThan(3 * fit.tau.stderr);
  });

  it('against a design that rings: no verdict, exit 1, one line saying why; no NaN and no infinite margin', async () => {
    const r = await run(['check', 'rc-step.csv', '--design', 'ringing.json']);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/ {2}verdict {10}none: the fit found a single decay \(first-order, tau [^)]*\) where 'LC filter' predicts a ring \(f0 50\.33 kHz, zeta 0\.158\)/);
    expect(r.out).not.toMatch(/NaN|∞|Infinity|PASS|FAIL/);

    const json = await run(['check', 'rc-step.csv', '--design', 'ringing.json', '--json']);
    expect(json.code).toBe(1);
    const body = JSON.parse(json.out);
    expect(body.verdict).toBeNull();
    expect(body.noVerdict).toMatch(/^the fit found a single decay \(first-order/);
  });

  it('against a design whose slow root dominates: tau and the levels in tolerance, exit 0, no R, L, C rows', async () => {
    const r = await run(['check', 'rc-step.csv', '--design', 'overdamped.json', '--json']);
    expect(r.code).toBe(0);
    const { verdict } = JSON.parse(r.out);
    expect(verdict.pass).toBe(true);
    expect(verdict.quantities.map((q: { name: string }) => q.name)).toEqual(['tau', 'initial level', 'final value']);
    for (const q of verdict.quantities) expect(Number.isFinite(q.marginSigma)).toBe(true);
    const text = await run(['check', 'rc-step.csv', '--design', 'overdamped.json']);
    expect(text.out).toMatch(/verdict {10}PASS against 'damped filter' \(accepted: pass\)\n {4}rule {11}guarded-acceptance.*\n {4}tau {12}pass /);
    expect(verdict.quantities[0]).toMatchObject({ zone: 'pass', limitsFrom: 'tolerances' });
    expect(text.out).not.toMatch(/NaN|∞/);
  });

  it('a decay 30 % slower than the design is out of tolerance (exit 3) with a finite margin', async () => {
    const r = await run(['check', 'rc-step-slow.csv', '--design', 'overdamped.json']);
    expect(r.code).toBe(3);
    expect(r.out).toMatch(/ {4}tau {12}FAIL +\d/);
    expect(r.out).not.toMatch(/NaN|∞/);
  });
});
