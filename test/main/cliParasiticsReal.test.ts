// parasitics with real capacitors: per-part derating and a DC-bias factor on the line, the switch's output capacitance
// split off C_p, and L_p cross-checked on a seeded turn-on edge; bad values exit 2 naming the option.
import { copyFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { turnOnEdge, turnOnEdgeCsv } from '../core/turnOnEdgeCapture';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');
const SET = ['switch-node-before.csv', 'switch-node-after-470p.csv', 'switch-node-after-1n.csv'];
/** L_p of the switch-node set with the nominal values (`parasitics --added C=470p,1n`), H. */
const NOMINAL_LP = 6.4979e-9;
const DERATING = 0.9;
let folder: string;

const run = (args: string[]) => runCliIn(folder, args);

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-parasitics-real-'));
  for (const file of SET) copyFileSync(path.join(SAMPLES, file), path.join(folder, file));
  // Both added parts at 0.9 of nominal scale every x by 0.9: the line gives L_p / 0.9 and 0.9 C_p. The edge is rung through that L.
  writeFileSync(path.join(folder, 'edge.csv'), turnOnEdgeCsv(turnOnEdge({ L: NOMINAL_LP / DERATING, seed: 21 })));
});

afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('parasitics with real capacitors', () => {
  it('derated parts move the line as the closed form says, and the edge agrees with L_p (JSON)', async () => {
    const r = await run([
      'parasitics', ...SET, '--added', 'C=470p@0.9,1n@90%', '--added-tolerance', '0', '--derating-tolerance', '5', '--switch-coss', '120p,10',
      '--current-capture', 'edge.csv', '--current-column', 'I_D', '--switch-voltage-column', 'V_SW', '--json',
    ]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(json.captures.map((c: { factorSource: string }) => c.factorSource)).toEqual(['none', 'derating', 'derating']);
    expect(json.captures[2].effectiveC.value).toBeCloseTo(0.9e-9, 20);
    expect(json.captures[2].addedC).toBeCloseTo(1e-9, 20);
    // x -> 0.9 x: slope L_p / 0.9 (derived from y = L_p (C_p + x)).
    expect(json.L.value / (NOMINAL_LP / DERATING) - 1).toBeCloseTo(0, 3);
    // The factors' 5 % tolerance (rectangular, 2.9 %) reaches L_p, whose error from the frequencies alone is 0.05 %.
    expect(json.L.stderr / json.L.value).toBeGreaterThan(0.01);
    expect(json.switchSplit.rest.value).toBeCloseTo(json.C.value - 120e-12, 20);
    expect(json.edgeCheck).toMatchObject({ file: 'edge.csv', plateauSource: 'voltage capture', verdict: 'agree', coverageFactor: 2 });
    expect(Math.abs(json.edgeCheck.L.value - NOMINAL_LP / DERATING)).toBeLessThan(3 * json.edgeCheck.L.stderr);
    expect(json.edgeCheck.didt.unit).toBe('A/s');
  });

  it('a wrong plateau voltage disagrees: the result is printed, the verdict repeated on stderr, exit 1', async () => {
    const r = await run(['parasitics', ...SET, '--added', 'C=470p,1n', '--added-tolerance', '0', '--dc-bias-factor', '1', '--current-capture', 'edge.csv', '--current-column', 'I_D', '--plateau-voltage', '30,5']);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/L_p cross-check on the turn-on edge edge\.csv/);
    expect(r.out).toMatch(/V_L +30\.0+ V ± .* \(plateau given\)/);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/disagree \(difference .* beyond 2 combined standard uncertainties\)/);
  });

  it.each([
    [['--dc-bias-factor', '1.5'], /--dc-bias-factor: factor '1\.5' must be a fraction in \(0, 1\]/],
    [['--dc-bias-factor', '0.6'], /--derating-tolerance: give the tolerance of the derating factors/],
    [['--added', 'C=470p@0.6@2,1n'], /--added 'C=470p@0\.6@2,1n': '470p@0\.6@2' has more than one '@'/],
    [['--added', 'C=470p@x,1n', '--derating-tolerance', '5'], /--added 'C=470p@x,1n': factor 'x'/],
    [['--switch-coss', '180p,10,3'], /--switch-coss '180p,10,3': expected VALUE,TOL/],
    [['--switch-coss', '-5p,10'], /--switch-coss '-5p,10': must be a positive value/],
    // A datasheet's typical Coss taken as exact gave C_p - C_switch a +-4 % bar where a 20 % part leaves 11 %.
    [['--switch-coss', '180p'], /--switch-coss '180p': give its tolerance in % after a comma, e\.g\. 180p,10 .*180p,0 takes it as exact/],
    [['--switch-coss', '180p,'], /--switch-coss '180p,': give its tolerance/],
    [['--current-capture', 'edge.csv', '--current-column', 'I_D', '--plateau-voltage', '4.7'], /--plateau-voltage '4\.7': give its tolerance in % after a comma/],
    [['--plateau-voltage', '10'], /--plateau-voltage belongs to the L_p cross-check: give the turn-on edge with --current-capture/],
    [['--current-capture', 'edge.csv'], /--current-capture needs the voltage across the loop inductance/],
    [['--current-capture', 'edge.csv', '--current-column', 'V_SW', '--plateau-voltage', '5,5'], /turn-on edge edge\.csv: the current channel 'V_SW' is in V, not A/],
  ])('%j exits 2 with one line naming the option', async (extra, message) => {
    const args = extra[0] === '--added' ? ['parasitics', ...SET, ...extra] : ['parasitics', ...SET, '--added', 'C=470p,1n', '--added-tolerance', '0', ...extra];
    const r = await run(args);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(message);
  });
});
