// Two ringing modes simulated by ngspice (two series RLC tanks summed at a node) are both recovered by the fit.
// Source: ngspice transient simulation, run here; the tanks' f0 = 1 / (2 pi sqrt(L C)) and alpha = R / (2 L)
// are the handbook relations of a series RLC circuit.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { findNgspice } from './ngspice/simulator';

/** Two tanks (invented values): a power loop near 12 MHz and a faster loop near 95 MHz, driven by steps of 1 V and 0.4 V. */
const TANKS = [
  { R: 7.5, L: 1e-6, C: 176e-12, step: 1 },
  { R: 0.72, L: 20e-9, C: 140e-12, step: 0.4 },
];
const SAMPLE_INTERVAL = 0.5e-9;
const STOP = 0.6e-6;
const EVENT = 50e-9;
/** Noise added to the simulated sum: 0.5 % of the larger step (46 dB), seeded. */
const NOISE = 0.005;

function netlist(): string {
  const lines = ['ringbench two-mode reference: two series RLC tanks, their capacitor voltages summed by a behavioural source'];
  TANKS.forEach((tank, k) => {
    const n = k + 1;
    lines.push(
      `V${n} in${n} 0 PULSE(0 ${tank.step} ${EVENT} 1e-14 1e-14 1 2)`,
      `R${n} in${n} mid${n} ${tank.R}`,
      `L${n} mid${n} out${n} ${tank.L}`,
      `C${n} out${n} 0 ${tank.C}`,
    );
  });
  lines.push(
    'B1 sum 0 V=v(out1)+v(out2)',
    '.options reltol=1e-7 abstol=1e-15 vntol=1e-12 chgtol=1e-20',
    `.tran ${SAMPLE_INTERVAL} ${STOP} 0 1e-12`,
    '.control',
    'run',
    'linearize v(sum)',
    'set wr_singlescale',
    'set numdgt=12',
    'wrdata sum.txt v(sum)',
    'quit',
    '.endc',
    '.end',
  );
  return lines.join('\n') + '\n';
}

function simulate(): { time: Float64Array; values: Float64Array } {
  const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-modes-'));
  try {
    writeFileSync(path.join(dir, 'modes.cir'), netlist());
    const run = spawnSync('ngspice', ['-b', 'modes.cir'], { cwd: dir, encoding: 'utf8' });
    if (run.error || run.status !== 0) throw new Error(`ngspice failed: ${run.error?.message ?? run.stderr}`);
    const rows = readFileSync(path.join(dir, 'sum.txt'), 'utf8')
      .trim()
      .split('\n')
      .map((line) => line.trim().split(/\s+/).map(Number));
    return { time: Float64Array.from(rows, (r) => r[0]), values: Float64Array.from(rows, (r) => r[1]) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const simulator = findNgspice();

describe.skipIf(!simulator)('two ringing modes simulated by ngspice', () => {
  it('both tanks within 3 standard errors of their f0 and alpha', () => {
    const { time, values } = simulate();
    const random = createRandom(14500);
    const noisy = values.map((v) => v + NOISE * random.normal());
    const fit = fitResponse({ time, values: noisy, unit: 'V', name: 'two tanks' });
    expect(fit.status).toBe('converged');
    expect(fit.modes).toHaveLength(2);
    for (const tank of TANKS) {
      const omega0 = 1 / Math.sqrt(tank.L * tank.C);
      const alpha = tank.R / (2 * tank.L);
      const mode = [...fit.modes].sort((x, y) => Math.abs(x.omega0.value - omega0) - Math.abs(y.omega0.value - omega0))[0];
      expect(Math.abs(mode.omega0.value - omega0) / mode.omega0.stderr!).toBeLessThan(3);
      expect(Math.abs(mode.alpha.value - alpha) / mode.alpha.stderr!).toBeLessThan(3);
    }
  }, 300_000);
});

if (!simulator) console.warn('ngspiceModes.test.ts skipped: ngspice is not on PATH (Debian: apt-get install ngspice)');
