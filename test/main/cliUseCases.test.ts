// The use cases on the command line: parasitics takes its cautions from the captures' own peak, and
// compare weighs a change against the combined uncertainty of two fits.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { runCliIn } from './cliHarness';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const SWITCH_NODE = ['switch-node-before.csv', 'switch-node-after-470p.csv', 'switch-node-after-1n.csv'].map((f) => path.join('sample-captures', f));

const run = (args: string[]) => runCliIn(ROOT, args);

/** Largest |sample| of a capture's first channel, read here independently of the command. */
function peakOf(file: string): number {
  const channel = selectChannel(parseCapture(readFileSync(path.join(ROOT, file), 'utf8')));
  return channel.values.reduce((peak, v) => Math.max(peak, Math.abs(v)), 0);
}

describe('parasitics cautions', () => {
  it('come from the largest peak over all captures, not from --voltage', async () => {
    const base = [...SWITCH_NODE, '--added', 'C=470p,1n', '--added-tolerance', '0', '--switching-frequency', '250k', '--json'];
    const low = await run(['parasitics', ...base, '--voltage', '48']);
    const high = await run(['parasitics', ...base, '--voltage', '10']);
    expect(low.code).toBe(0);
    const cautions = JSON.parse(low.out).cautions;
    const peak = Math.max(...SWITCH_NODE.map(peakOf));
    expect(peak).toBeGreaterThan(80); // the captures ring well above the 48 V the node switches
    const ids = cautions.fired.map((c: { id: string }) => c.id);
    // 50 V: OSHA 29 CFR 1910.333(a)(1) de-energize threshold; 70.7 V: IEC 61140 ELV crest. Both fire on the
    // data's peak although --voltage is below them.
    expect(ids).toEqual(expect.arrayContaining(['de-energize-50v', 'elv-ac-crest']));
    for (const c of cautions.fired.filter((f: { checks: string }) => f.checks === 'peak voltage')) expect(c.measured.value).toBe(peak);
    // --voltage only sizes the snubber's dissipation.
    expect(JSON.parse(high.out).cautions).toEqual(cautions);
    expect(JSON.parse(high.out).snubber.powerAt.power).toBeLessThan(JSON.parse(low.out).snubber.powerAt.power);
  });
});

describe('compare BEFORE AFTER', () => {
  it('finds the added capacitor: omega0 falls by many combined standard errors, verdict changed', async () => {
    const { code, out } = await run(['compare', SWITCH_NODE[0], SWITCH_NODE[1], '--json']);
    expect(code).toBe(0);
    const comparison = JSON.parse(out);
    expect(comparison.verdict).toBe('changed');
    // The difference and its uncertainty, recomputed from the two fits as `fit --json` reports them.
    const before = JSON.parse((await run(['fit', SWITCH_NODE[0], '--json'])).out);
    const after = JSON.parse((await run(['fit', SWITCH_NODE[1], '--json'])).out);
    const omega0 = comparison.quantities.find((q: { name: string }) => q.name === 'omega0');
    expect(omega0.difference.value).toBe(after.omega0.value - before.omega0.value);
    expect(omega0.difference.stderr).toBeCloseTo(Math.hypot(after.omega0.stderr, before.omega0.stderr), 12);
    expect(omega0.significant).toBe(true);
    // Adding C lowers omega0 = 1/sqrt(LC): with 470 pF on about 390 pF the ratio is near sqrt(390/860).
    expect(after.omega0.value / before.omega0.value).toBeCloseTo(Math.sqrt(390 / 860), 1);
  });

  it('finds no change between a capture and itself', async () => {
    const { code, out } = await run(['compare', SWITCH_NODE[0], SWITCH_NODE[0], '--json']);
    expect(code).toBe(0);
    const comparison = JSON.parse(out);
    expect(comparison.verdict).toBe('no significant change');
    expect(comparison.jointChiSquare).toBe(0);
  });

  it('compares R and L with a known part, without the known part tolerance', async () => {
    const { out } = await run(['compare', SWITCH_NODE[0], SWITCH_NODE[0], '--topology', 'series', '--known', 'C=390p,10', '--json']);
    const comparison = JSON.parse(out);
    expect(comparison.quantities.map((q: { name: string }) => q.name)).toEqual(['alpha', 'omega0', 'f0', 'zeta', 'Q', 'R', 'L']);
    const L = comparison.quantities.find((q: { name: string }) => q.name === 'L');
    const fitted = JSON.parse((await run(['fit', SWITCH_NODE[0], '--topology', 'series', '--known', 'C=390p,10', '--json'])).out);
    // The 10 % tolerance (u = 10 %/sqrt 3) would dominate; a common part cancels in the difference.
    expect(L.difference.stderr).toBeLessThan(0.1 * fitted.components.L.stderr);
  });

  it('prints a table and the verdict, and refuses bad input with exit 2', async () => {
    const text = await run(['compare', SWITCH_NODE[0], SWITCH_NODE[2]]);
    expect(text.out).toMatch(/^verdict: changed: /m);
    expect(text.out).toMatch(/^ {2}omega0 /m);
    const missing = await run(['compare', SWITCH_NODE[0], 'sample-captures/no-such.csv']);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/no-such\.csv.*no such file/);
    expect(missing.out).toBe('');
  });
});
