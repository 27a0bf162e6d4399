// --modes and --mode on the command line: a forced order, R, L and C for the mode named, the order line of the text,
// the modes in --json, and bad values refused with exit 2 and one line before anything is fitted.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { TWO_MODES, twoModeCapture } from '../fixtures/twoModeCapture';
import { runCliIn } from './cliHarness';

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-modes-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
writeFileSync(path.join(dir, 'two-mode.csv'), twoModeCapture());
const SAMPLE = path.resolve(__dirname, '../../sample-captures/input-filter-step.csv');
/** A forced two-mode fit of about ten thousand samples on a shared test machine. */
const FIT_MS = 120_000;
/** The capacitance stated as known for the R, L and C of a mode (series loop). */
const KNOWN_C = 1e-9;

const run = (args: string[]) => runCliIn(dir, args);

interface Mode {
  omega0: { value: number; stderr: number | null; unit: string };
  zeta: { value: number; stderr: number | null; unit: string };
  amplitude: { value: number; stderr: number | null; unit: string };
  energyShare: number;
}

describe('fit --modes and --mode', () => {
  it('fits the two modes asked for and derives R, L, C for the second, saying which (JSON)', async () => {
    const { code, out, err } = await run(['fit', 'two-mode.csv', '--modes', '2', '--mode', '2', '--topology', 'series', '--known', 'C=1n', '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    const json = JSON.parse(out);
    expect(json.modelOrder).toMatchObject({ criterion: 'BIC', forced: true });
    const modes = json.modes as Mode[];
    expect(modes).toHaveLength(2);
    // Dominant first: the slow ring carries most of the energy; the top level is its.
    expect(modes[0].energyShare).toBeGreaterThan(modes[1].energyShare);
    expect(json.omega0).toEqual(modes[0].omega0);
    modes.forEach((mode, k) => {
      const f0 = mode.omega0.value / (2 * Math.PI);
      const stderr = (mode.omega0.stderr ?? NaN) / (2 * Math.PI);
      expect(mode.omega0.unit).toBe('rad/s');
      expect(mode.amplitude.unit).toBe('V');
      expect(Math.abs(f0 - TWO_MODES[k].f0), `mode ${k + 1} f0 ${f0} ± ${stderr}`).toBeLessThan(3 * stderr);
    });
    expect(json.components.mode).toMatchObject({ index: 2, of: 2 });
    // Series loop: omega0 = 1 / sqrt(L C) (handbook relation), so the second mode's L is 1 / (omega0^2 C).
    expect(json.components.L.value / (1 / (modes[1].omega0.value ** 2 * KNOWN_C))).toBeCloseTo(1, 9);
  }, FIT_MS);

  it('prints the order line and the modes as rows, the components saying which mode (text)', async () => {
    const { code, out } = await run(['fit', 'two-mode.csv', '--modes', '2', '--mode', '2', '--topology', 'series', '--known', 'C=1n']);
    expect(code).toBe(0);
    expect(out).toMatch(/\n {2}order {12}two ringing modes \(BIC -?[\d.]+, order forced\): \S/);
    expect(out).toMatch(/\n {2}mode 2 f0 {8}95\.\d+ MHz ± /);
    expect(out).toMatch(/\n {2}mode 1 energy {4}\d+(\.\d+)? % of the response's energy/);
    expect(out).toMatch(/\n {2}components {7}series, known C = 1 nF, taken as exact \(no tolerance given: R and L carry the fit's uncertainty only\), for mode 2 of 2 \(f0 95\.\d+ MHz\)/);
  }, FIT_MS);

  it('says on a one-mode capture which order won, and refuses a second mode it did not find (exit 2)', async () => {
    const plain = await run(['fit', SAMPLE]);
    expect(plain.code).toBe(0);
    expect(plain.out).toMatch(/\n {2}order {12}one ringing mode/);
    expect(plain.out).not.toMatch(/mode 1 f0/);
    const beyond = await run(['fit', SAMPLE, '--mode', '2', '--topology', 'series', '--known', 'C=47u']);
    expect(beyond.code).toBe(2);
    expect(beyond.out).toBe('');
    expect(beyond.err).toMatch(/--mode 2: the fit found 1 ringing mode\n$/);
  }, FIT_MS);

  it('refuses a bad number of modes or mode with one line and exit 2, before fitting', async () => {
    const cases: [string[], RegExp][] = [
      [['--modes', '4'], /--modes '4': expected a number of ringing modes from 1 to 3/],
      [['--modes', 'two'], /--modes 'two': expected a number/],
      [['--modes', '0'], /--modes '0'/],
      [['--mode', '0', '--topology', 'series', '--known', 'C=1n'], /--mode '0': expected a mode number from 1 to 3/],
      [['--modes', '1', '--mode', '2', '--topology', 'series', '--known', 'C=1n'], /--mode 2: --modes 1 fits 1 ringing mode$/m],
      [['--mode', '2'], /--mode names the mode R, L and C are derived for: give --topology and --known too/],
    ];
    for (const [args, message] of cases) {
      const { code, out, err } = await run(['fit', 'two-mode.csv', ...args]);
      expect(code, args.join(' ')).toBe(2);
      expect(out).toBe('');
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err).toMatch(message);
    }
  });

  it('check compares the design with the mode named: the fast loop design matches mode 2, not the dominant mode', async () => {
    // The design of the fast loop: series, L 2.8 nH and C 1 nF ring at 95 MHz (omega0 = 1 / sqrt(L C), handbook relation), R for zeta 0.03.
    const design = {
      format: 'ringbench-design',
      version: 1,
      name: 'fast loop',
      topology: 'series',
      components: { R: { value: '100m', tolerance: 0.2 }, L: { value: '2.8n', tolerance: 0.1 }, C: { value: '1n', tolerance: 0.1 } },
      source: { kind: 'step', amplitude: '0.5', initialLevel: 0 },
      probe: 'capacitor-voltage',
    };
    writeFileSync(path.join(dir, 'fast-loop.json'), JSON.stringify(design));
    const verdictOf = async (extra: string[]) => {
      const { out } = await run(['check', 'two-mode.csv', '--design', 'fast-loop.json', '--modes', '2', '--json', ...extra]);
      const quantities = JSON.parse(out).verdict.quantities as { name: string; inTolerance: boolean }[];
      return Object.fromEntries(quantities.map((q) => [q.name, q.inTolerance]));
    };
    expect(await verdictOf(['--mode', '2'])).toMatchObject({ alpha: true, omega0: true, zeta: true, Q: true });
    expect(await verdictOf([])).toMatchObject({ alpha: false, omega0: false });
  }, 2 * FIT_MS);

  it('batch refuses --mode without a known part or design, and a bad --modes, before any file is fitted', async () => {
    const folder = path.join(dir, 'lot');
    mkdirSync(folder, { recursive: true });
    writeFileSync(path.join(folder, 'a.csv'), twoModeCapture(3));
    const noPart = await run(['batch', 'lot', '--mode', '2']);
    expect(noPart.code).toBe(2);
    expect(noPart.err).toMatch(/--mode names the mode/);
    const badOrder = await run(['batch', 'lot', '--modes', '9']);
    expect(badOrder.code).toBe(2);
    expect(badOrder.err).toMatch(/--modes '9'/);
  });
});
