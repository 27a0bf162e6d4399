// The probe correction's uncertainties with the probe's own tolerance: each checked against a numerical first-order
// propagation (GUM 5.1.2, the law of propagation of uncertainty, by central differences) of the closed forms
// f0 = 1 / (2 pi sqrt(L C)) with the probe's C in parallel with the loop's.
import { describe, expect, it } from 'vitest';
import { probeCorrection } from '../../core/circuit/setupProbe';

/** sqrt(sum (df/dx_i u_i)^2) for independent inputs, derivatives by central differences. */
function propagated(f: (x: number[]) => number, x: number[], u: number[]): number {
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    const h = x[i] * 1e-6;
    const up = [...x];
    const down = [...x];
    up[i] += h;
    down[i] -= h;
    sum += (((f(up) - f(down)) / (2 * h)) * u[i]) ** 2;
  }
  return Math.sqrt(sum);
}

const F0 = { value: 10e6, stderr: 2e3, unit: 'Hz' };
const PROBE = 12e-12;
const PROBE_REL = 0.1 / Math.sqrt(3);

describe('probe correction with the probe capacitance uncertain', () => {
  it('C known: the loaded C and the unloaded f0 carry the probe term', () => {
    const C = { value: 220e-12, stderr: 220e-12 * 0.01, unit: 'F' };
    const r = probeCorrection(F0, C, 'C', PROBE, PROBE_REL)!;
    const inputs = [F0.value, C.value, PROBE];
    const u = [F0.stderr, C.stderr, PROBE * PROBE_REL];
    const unloadedF0 = ([f0, c, p]: number[]) => f0 * Math.sqrt((c + p) / c);
    expect(r.unloadedF0.stderr! / propagated(unloadedF0, inputs, u)).toBeCloseTo(1, 6);
    expect(r.loadedC.stderr! / propagated(([, c, p]) => c + p, inputs, u)).toBeCloseTo(1, 6);
  });

  it('L known: the unloaded C and f0 carry the probe term', () => {
    const lRel = 0.02;
    const f0Rel = F0.stderr / F0.value;
    const L = 1e-6;
    const cValue = 1 / ((2 * Math.PI * F0.value) ** 2 * L);
    // C read from f0 and L: its relative uncertainty is sqrt(4 f0_rel^2 + L_rel^2).
    const C = { value: cValue, stderr: cValue * Math.hypot(2 * f0Rel, lRel), unit: 'F' };
    const r = probeCorrection(F0, C, 'L', PROBE, PROBE_REL)!;
    const inputs = [F0.value, L, PROBE];
    const u = [F0.stderr, L * lRel, PROBE * PROBE_REL];
    const loopC = (f0: number, l: number) => 1 / ((2 * Math.PI * f0) ** 2 * l);
    const unloadedF0 = ([f0, l, p]: number[]) => 1 / (2 * Math.PI * Math.sqrt(l * (loopC(f0, l) - p)));
    expect(r.unloadedF0.stderr! / propagated(unloadedF0, inputs, u)).toBeCloseTo(1, 6);
    expect(r.unloadedC.stderr! / propagated(([f0, l, p]) => loopC(f0, l) - p, inputs, u)).toBeCloseTo(1, 6);
  });

  it('taken as exact (0) it adds nothing', () => {
    const C = { value: 220e-12, stderr: 2.2e-12, unit: 'F' };
    expect(probeCorrection(F0, C, 'C', PROBE, 0)!.loadedC.stderr).toBe(C.stderr);
  });
});
