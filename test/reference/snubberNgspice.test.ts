// The snubbed loop's step response (suggestSnubber) against an ngspice transient of the same circuit.

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { suggestSnubber } from '../../core/circuit/snubber';
import { quantity } from '../../core/quantity';
import { findNgspice } from './ngspice/simulator';

const simulator = findNgspice();
if (!simulator) console.warn('ngspice is not on PATH: skipping the snubbed-loop transient check (CI installs ngspice).');

/** Output points per 1 / omega_ref of the loop, and ngspice's internal step limit below that. */
const POINTS_PER_TIME_UNIT = 200;
const INTERNAL_STEPS_PER_POINT = 20;

interface Loop {
  Lp: number;
  Cp: number;
  Rp: number;
}

/** ngspice: 1 V step at `delay` (edge 1e-5 of an output interval, the event at its middle) into L_p + R_p, node C_p || (R_s + C_s). */
function simulate(loop: Loop, Rs: number, Cs: number, interval: number, span: number, delay: number): { time: number[]; node: number[] } {
  const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-snubber-'));
  try {
    const edge = interval * 1e-5;
    const netlist = [
      'ringbench snubbed loop step',
      `V1 in 0 PULSE(0 1 ${delay} ${edge} ${edge} 1 2)`,
      `R1 in a ${loop.Rp || 1e-9}`,
      `L1 a out ${loop.Lp}`,
      `C1 out 0 ${loop.Cp}`,
      `R2 out b ${Rs}`,
      `C2 b 0 ${Cs}`,
      '.options reltol=1e-7 abstol=1e-15 vntol=1e-12 chgtol=1e-20',
      `.tran ${interval} ${span} 0 ${interval / INTERNAL_STEPS_PER_POINT}`,
      '.control',
      'run',
      'linearize v(out)',
      'set wr_singlescale',
      'set numdgt=12',
      'wrdata out.txt v(out)',
      'quit',
      '.endc',
      '.end',
    ].join('\n');
    writeFileSync(path.join(dir, 'loop.cir'), `${netlist}\n`);
    const run = spawnSync('ngspice', ['-b', 'loop.cir'], { cwd: dir, encoding: 'utf8' });
    if (run.status !== 0) throw new Error(`ngspice failed: ${run.stderr}`);
    const rows = readFileSync(path.join(dir, 'out.txt'), 'utf8').trim().split('\n').map((line) => line.trim().split(/\s+/).map(Number));
    return { time: rows.map((r) => r[0] - delay - edge / 2), node: rows.map((r) => r[1]) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe.skipIf(!simulator)('snubbed loop step response against ngspice (ngspice on PATH)', () => {
  it.each([
    { label: 'README switch node, 4 C_p', loop: { Lp: 6.4979e-9, Cp: 390.28e-12, Rp: 0.2801 }, ratio: 4 },
    { label: 'README switch node, 3 C_p', loop: { Lp: 6.4979e-9, Cp: 390.28e-12, Rp: 0.2801 }, ratio: 3 },
    { label: 'gate loop, 8 C_p', loop: { Lp: 8e-9, Cp: 1.5e-9, Rp: 0.1 }, ratio: 8 },
  ])('$label: overshoot and 2 % settling time', ({ loop, ratio }) => {
    const s = suggestSnubber({ L: quantity(loop.Lp, null, 'H'), C: quantity(loop.Cp, null, 'F'), R: quantity(loop.Rp, null, 'ohm') }, { capacitanceRatio: ratio });
    const interval = Math.sqrt(loop.Lp * loop.Cp) / POINTS_PER_TIME_UNIT;
    const { time, node } = simulate(loop, s.R.value, s.C.value, interval, 3 * s.predicted.step.settlingTime!, 10 * interval);
    const overshoot = Math.max(...node) - 1;
    let lastOutside = 0;
    node.forEach((v, k) => {
      if (Math.abs(v - 1) > s.settlingBand) lastOutside = k;
    });
    expect(Math.abs(s.predicted.step.overshoot - overshoot)).toBeLessThan(2e-4);
    expect(s.predicted.step.settlingTime! - time[lastOutside]).toBeGreaterThan(-0.01 * interval);
    expect(s.predicted.step.settlingTime! - time[lastOutside]).toBeLessThan(1.01 * interval);
  }, 60_000);
});
