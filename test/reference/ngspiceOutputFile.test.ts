// ngspice's own output file, as the simulator writes it (wrdata with its vector names 'time v(out) i(L1)', its raw
// uneven time points), read and fitted by the command line: the circuit's alpha, omega0 and L come back.
// Source: ngspice transient simulation, run here; alpha = R / (2 L) and omega0 = 1 / sqrt(L C) are the handbook
// relations of a series RLC circuit. The simulator's own error (trapezoidal rule, steps at most TMAX: a ring's
// frequency reads low by about (omega0 TMAX)^2 / 12, 2e-8 here; from memory) is far under the limit checked.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from '../main/cliHarness';
import { findNgspice } from './ngspice/simulator';

/** A series loop (invented values): 0.5 ohm, 10 uH, 100 nF, stepped by 5 V at 1 us; rings at 1 Mrad/s, alpha 25 000 s^-1. */
const R = 0.5;
const L = 10e-6;
const C = 100e-9;
/** Largest simulator step: 0.5 ns, some 12 500 points a ring period. */
const TMAX = 0.5e-9;
/** Relative agreement asked of alpha, omega0 and L: 50 times the simulator's own frequency error. */
const AGREEMENT = 1e-6;

function netlist(): string {
  return [
    'series RLC loop stepped by 5 V',
    'V1 in 0 PULSE(0 5 1u 1n 1n 1 2)',
    `R1 in a ${R}`,
    `L1 a out ${L}`,
    `C1 out 0 ${C}`,
    '.options reltol=1e-7 abstol=1e-15 vntol=1e-12',
    `.tran ${TMAX} 60u 0 ${TMAX}`,
    '.control',
    'set wr_vecnames',
    'set wr_singlescale',
    'set numdgt=12',
    'run',
    'wrdata loop.txt v(out) i(L1)',
    'quit',
    '.endc',
    '.end',
  ].join('\n');
}

const simulator = findNgspice();
if (!simulator) console.warn('test/reference/ngspiceOutputFile.test.ts: skipped, ngspice is not installed (apt-get install ngspice)');

describe.skipIf(!simulator)("ngspice's output file through the command line", () => {
  let dir: string;

  beforeAll(() => {
    dir = mkdtempSync(path.join(tmpdir(), 'ringbench-ngspice-file-'));
    writeFileSync(path.join(dir, 'loop.cir'), netlist());
    const run = spawnSync('ngspice', ['-b', 'loop.cir'], { cwd: dir, encoding: 'utf8' });
    if (run.error || run.status !== 0) throw new Error(`ngspice failed: ${run.error?.message ?? run.stderr}`);
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  const close = (value: number, expected: number) => expect(Math.abs(value / expected - 1)).toBeLessThan(AGREEMENT);

  it.each([
    ['v(out)', 'V'],
    ['i(L1)', 'A'],
  ])('%s: read in %s by its probe heading; alpha, omega0 and L of the circuit', async (column, unit) => {
    const { code, out, err } = await runCliIn(dir, ['fit', 'loop.txt', '--column', column, '--topology', 'series', '--known', `C=${C}`, '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    const result = JSON.parse(out);
    expect(result.channel).toBe(column);
    expect(result.finalValue.unit).toBe(unit);
    expect(result.import.time.column).toBe('time');
    close(result.alpha.value, R / (2 * L));
    close(result.omega0.value, 1 / Math.sqrt(L * C));
    close(result.components.L.value, L);
  });
});
