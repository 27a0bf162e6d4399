// suggestSnubber and cubicRoots: the starting values, the dissipation, and the poles of the snubbed loop.
import { describe, expect, it } from 'vitest';
import { cubicRoots, type Complex } from '../../core/circuit/cubicRoots';
import { CircuitInputError } from '../../core/circuit/errors';
import { loopStepResponse } from '../../core/circuit/loopStepResponse';
import { suggestSnubber, type SnubberLoop } from '../../core/circuit/snubber';
import { quantity } from '../../core/quantity';
import { createRandom } from '../../core/random';
import { integrateSnubbedStep, sampledStepMetrics } from './snubbedLoopIntegration';

const mul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
const inv = (a: Complex): Complex => {
  const d = a.re * a.re + a.im * a.im;
  return { re: a.re / d, im: -a.im / d };
};
const real = (x: number): Complex => ({ re: x, im: 0 });

/** Loop impedance R_p + s L_p + 1 / (s C_p + 1 / (R_s + 1 / (s C_s))): zero at a natural frequency (derived, circuit laws). */
function loopImpedance(s: Complex, Rp: number, Lp: number, Cp: number, Rs: number, Cs: number): Complex {
  const snubberBranch = inv(add(real(Rs), inv(mul(s, real(Cs)))));
  const node = inv(add(mul(s, real(Cp)), snubberBranch));
  return add(add(real(Rp), mul(s, real(Lp))), node);
}

describe('cubicRoots', () => {
  const cases: { label: string; c: [number, number, number, number]; roots: Complex[] }[] = [
    { label: '(z - 1)(z - 2)(z - 3)', c: [1, -6, 11, -6], roots: [real(1), real(2), real(3)] },
    { label: '2 (z + 1)(z^2 + 2z + 5)', c: [2, 6, 14, 10], roots: [real(-1), { re: -1, im: 2 }, { re: -1, im: -2 }] },
    { label: '(z + 0.5)(z^2 + 0.1 z + 1)', c: [1, 0.6, 1.05, 0.5], roots: [real(-0.5), { re: -0.05, im: Math.sqrt(1 - 0.0025) }, { re: -0.05, im: -Math.sqrt(1 - 0.0025) }] },
    { label: '(z + 1)^2 (z + 4)', c: [1, 6, 9, 4], roots: [real(-4), real(-1), real(-1)] },
  ];
  it.each(cases)('$label', ({ c, roots }) => {
    const got = cubicRoots(...c);
    const key = (z: Complex) => z.re * 1000 + z.im;
    const sortedGot = [...got].sort((a, b) => key(a) - key(b));
    const sortedWant = [...roots].sort((a, b) => key(a) - key(b));
    sortedGot.forEach((z, i) => {
      // A double root is only determined to about sqrt(machine epsilon).
      expect(Math.abs(z.re - sortedWant[i].re)).toBeLessThan(1e-7);
      expect(Math.abs(z.im - sortedWant[i].im)).toBeLessThan(1e-7);
    });
  });
});

describe('suggestSnubber', () => {
  const loop = { L: quantity(15e-9, 0.3e-9, 'H'), C: quantity(220e-12, 5e-12, 'F'), R: quantity(0.5, 0.02, 'ohm') };

  it('starts from R = sqrt(L_p / C_p) and C = 4 C_p within the 3 to 4 C_p range (common practice, trade-facts.md)', () => {
    const s = suggestSnubber(loop);
    expect(s.R.value).toBeCloseTo(Math.sqrt(15e-9 / 220e-12), 12);
    expect(s.C.value).toBeCloseTo(4 * 220e-12, 22);
    expect(s.capacitanceRange.min).toBeCloseTo(3 * 220e-12, 22);
    expect(s.capacitanceRange.max).toBeCloseTo(4 * 220e-12, 22);
    // u(R) / R = (1/2) sqrt(u_L^2 / L^2 + u_C^2 / C^2) for independent L and C (first order).
    expect(s.R.stderr! / s.R.value).toBeCloseTo(0.5 * Math.hypot(0.3 / 15, 5 / 220), 12);
    expect(s.notes.join(' ')).toMatch(/starting point/);
  });

  it('uses a given characteristic impedance with its uncertainty', () => {
    const z0 = quantity(8.3, 0.1, 'ohm');
    expect(suggestSnubber({ ...loop, characteristicImpedance: z0 }).R).toEqual(z0);
  });

  it.each([
    { C: 220e-12, V: 48, f: 500e3, power: 4 * 220e-12 * 48 * 48 * 500e3 },
    { C: 1e-9, V: 400, f: 100e3, power: 4e-9 * 400 * 400 * 100e3 },
  ])('dissipates C V^2 f_sw (derived: C V^2 / 2 per charge and per discharge): C_p $C, $V V, $f Hz', ({ C, V, f, power }) => {
    const s = suggestSnubber({ L: loop.L, C: quantity(C, null, 'F') }, { voltage: V, switchingFrequency: f });
    expect(s.powerAt!.power).toBeCloseTo(power, 9);
    expect(s.powerPerVoltSquaredHertz).toBeCloseTo(4 * C, 22);
    expect(suggestSnubber({ L: loop.L, C: quantity(C, null, 'F') }).powerAt).toBeNull();
  });

  it.each([
    { label: 'buck switch node, 4 C_p', Rp: 0.5, Lp: 15e-9, Cp: 220e-12, ratio: 4 },
    { label: 'buck switch node, 3 C_p', Rp: 0.5, Lp: 15e-9, Cp: 220e-12, ratio: 3 },
    { label: 'lossless gate loop, 4 C_p', Rp: 0, Lp: 8e-9, Cp: 1.5e-9, ratio: 4 },
    { label: 'lossy loop, 10 C_p', Rp: 3, Lp: 15e-9, Cp: 220e-12, ratio: 10 },
  ])('$label: every reported pole zeroes the loop impedance, and the ring is damped harder', ({ Rp, Lp, Cp, ratio }) => {
    const s = suggestSnubber({ L: quantity(Lp, null, 'H'), C: quantity(Cp, null, 'F'), R: quantity(Rp, null, 'ohm') }, { capacitanceRatio: ratio });
    const z0 = Math.sqrt(Lp / Cp);
    expect(s.predicted.poles).toHaveLength(3);
    for (const p of s.predicted.poles) {
      const z = loopImpedance(p, Rp, Lp, Cp, s.R.value, s.C.value);
      expect(Math.hypot(z.re, z.im) / z0).toBeLessThan(1e-9);
      expect(p.re).toBeLessThan(0);
    }
    expect(s.before.alpha).toBeCloseTo(Rp / (2 * Lp), 6);
    expect(s.before.omega0).toBeCloseTo(1 / Math.sqrt(Lp * Cp), 0);
    expect(s.predicted.zeta).toBeGreaterThan(s.before.zeta);
    expect(s.predicted.zeta).toBeGreaterThan(0.3);
    expect(s.predicted.Q).toBeCloseTo(1 / (2 * s.predicted.zeta), 12);
  });

  it.each([
    { label: 'voltage without frequency', options: { voltage: 48 }, field: 'options.switchingFrequency' },
    { label: 'frequency without voltage', options: { switchingFrequency: 1e5 }, field: 'options.voltage' },
    { label: 'zero ratio', options: { capacitanceRatio: 0 }, field: 'options.capacitanceRatio' },
  ])('throws CircuitInputError for $label', ({ options, field }) => {
    expect(() => suggestSnubber(loop, options)).toThrow(CircuitInputError);
    expect(() => suggestSnubber(loop, options)).toThrow(new RegExp(`^${field.replace('.', '\\.')}:`));
  });

  it('throws for a non-positive loop inductance', () => {
    expect(() => suggestSnubber({ ...loop, L: quantity(0, null, 'H') })).toThrow(/^loop\.L:/);
  });
});

describe('the snubbed loop step response', () => {
  // The README's switch node: L_p 6.4979 nH, C_p 390.28 pF, R_p 280.1 mOhm (from the sample captures).
  const readmeLoop = { L: quantity(6.4979e-9, null, 'H'), C: quantity(390.28e-12, null, 'F'), R: quantity(0.2801, null, 'ohm') };

  it.each<{ label: string; loop: SnubberLoop; ratio: number }>([
    { label: 'README switch node, 4 C_p', loop: readmeLoop, ratio: 4 },
    { label: 'README switch node, 3 C_p', loop: readmeLoop, ratio: 3 },
    { label: 'lossless gate loop, 4 C_p', loop: { L: quantity(8e-9, null, 'H'), C: quantity(1.5e-9, null, 'F') }, ratio: 4 },
    { label: 'lossy loop, 10 C_p', loop: { L: quantity(15e-9, null, 'H'), C: quantity(220e-12, null, 'F'), R: quantity(3, null, 'ohm') }, ratio: 10 },
  ])('$label: overshoot and settling agree with an RK4 integration of the circuit equations (independent, in this test)', ({ loop, ratio }) => {
    const s = suggestSnubber(loop, { capacitanceRatio: ratio });
    const Lp = loop.L.value;
    const Cp = loop.C.value;
    const interval = Math.sqrt(Lp * Cp) / 200;
    const samples = integrateSnubbedStep({ Lp, Cp, Rp: loop.R?.value ?? 0, Rs: s.R.value, Cs: s.C.value }, 3 * s.predicted.step.settlingTime!, interval);
    const numeric = sampledStepMetrics(samples, s.settlingBand);
    expect(Math.abs(s.predicted.step.overshoot - numeric.overshoot)).toBeLessThan(1e-4);
    // The sampled last exit lies within one sample interval before the exact one.
    expect(s.predicted.step.settlingTime! - numeric.settlingTime).toBeGreaterThanOrEqual(-1e-9 * interval);
    expect(s.predicted.step.settlingTime! - numeric.settlingTime).toBeLessThan(interval * 1.001);
  });

  it('the README loop: the third pole is slower than the pair, so the node overshoots far more than zeta 0.568 promises, and says so', () => {
    const s = suggestSnubber(readmeLoop);
    expect(s.predicted.zeta).toBeCloseTo(0.568, 3);
    expect(Math.abs(s.predicted.otherPole)).toBeLessThan(s.predicted.alpha);
    expect(s.predicted.pairDominant).toBe(false);
    // exp(-pi zeta / sqrt(1 - zeta^2)) at zeta 0.568 (handbook relation for a second-order step).
    expect(s.predicted.pairOvershoot).toBeCloseTo(Math.exp((-Math.PI * 0.5681) / Math.sqrt(1 - 0.5681 ** 2)), 3);
    expect(s.predicted.step.overshoot).toBeGreaterThan(0.27);
    expect(s.predicted.step.overshoot).toBeGreaterThan(2 * s.predicted.pairOvershoot);
    expect(s.notes.join(' ')).toMatch(/ringing pole pair does not dominate.*overshoots 28\.\d %.*would overshoot 11\.\d %/);
    // The larger capacitor damps harder (C = 3 C_p overshoots more).
    expect(suggestSnubber(readmeLoop, { capacitanceRatio: 3 }).predicted.step.overshoot).toBeGreaterThan(s.predicted.step.overshoot);
  });

  it('a pair far slower than the third pole dominates: the step overshoot is close to what its zeta implies, and no note', () => {
    // A large snubber resistor next to a small capacitor: the snubber branch barely loads the node.
    const s = suggestSnubber({ L: quantity(10e-9, null, 'H'), C: quantity(1e-9, null, 'F'), characteristicImpedance: quantity(0.4, null, 'ohm') }, { capacitanceRatio: 1 });
    expect(s.predicted.pairDominant).toBe(true);
    expect(Math.abs(s.predicted.step.overshoot - s.predicted.pairOvershoot)).toBeLessThan(0.05);
    expect(s.notes.join(' ')).not.toMatch(/does not dominate/);
  });

  it('the bare loop: overshoot exp(-pi zeta / sqrt(1 - zeta^2)) (handbook relation), and a lossless loop never settles', () => {
    const s = suggestSnubber(readmeLoop);
    const zeta = s.before.zeta;
    expect(s.before.step.overshoot).toBeCloseTo(Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 6);
    expect(s.before.step.peakTime!).toBeCloseTo(Math.PI / s.before.omegaD!, 15);
    const lossless = suggestSnubber({ L: readmeLoop.L, C: readmeLoop.C });
    expect(lossless.before.step.settlingTime).toBeNull();
    expect(lossless.before.step.overshoot).toBe(1);
  });

  it.each([1e-4, 1e-2, 0.28, 3, 50])('the bare loop with R_p = %s ohm: overshoot exp(-pi zeta / sqrt(1 - zeta^2)) from Q 0.1 to 40000 (handbook relation)', (Rp) => {
    const s = suggestSnubber({ L: readmeLoop.L, C: readmeLoop.C, R: quantity(Rp, null, 'ohm') });
    const zeta = s.before.zeta;
    const expected = zeta < 1 ? Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)) : 0;
    expect(Math.abs(s.before.step.overshoot - expected)).toBeLessThan(1e-7);
    expect(s.before.step.settlingTime!).toBeGreaterThan(0);
  });

  it('the overshoot error bounds the spread from the loop uncertainties (seeded Monte Carlo, parts held), and is not far above it', () => {
    const loop = { L: quantity(6.5e-9, 0.2e-9, 'H'), C: quantity(390e-12, 15e-12, 'F'), R: quantity(0.28, 0.03, 'ohm') };
    const s = suggestSnubber(loop);
    const random = createRandom(4242);
    const draws = 800;
    let sum = 0;
    let sumSquares = 0;
    for (let k = 0; k < draws; k++) {
      const drawn = {
        L: quantity(loop.L.value + loop.L.stderr! * random.normal(), null, 'H'),
        C: quantity(loop.C.value + loop.C.stderr! * random.normal(), null, 'F'),
        R: quantity(loop.R.value + loop.R.stderr! * random.normal(), null, 'ohm'),
      };
      // The parts as suggested for the estimated loop (R_s, C_s held), the loop as drawn: what the bench would see.
      const overshoot = suggestSnubber({ ...drawn, characteristicImpedance: s.R }, { capacitanceRatio: s.C.value / drawn.C.value }).predicted.step.overshoot;
      sum += overshoot;
      sumSquares += overshoot ** 2;
    }
    const sd = Math.sqrt(sumSquares / draws - (sum / draws) ** 2);
    const stated = s.predicted.stepStderr!.overshoot;
    // 800 draws estimate a standard deviation to about 2.5 %.
    expect(stated).toBeGreaterThan(0.95 * sd);
    expect(stated).toBeLessThan(2 * sd);
  });

  it('the step metrics have no error bar when a loop value has none', () => {
    expect(suggestSnubber({ L: quantity(6.5e-9, null, 'H'), C: quantity(390e-12, 1e-12, 'F') }).predicted.stepStderr).toBeNull();
    expect(suggestSnubber({ L: quantity(6.5e-9, 1e-11, 'H'), C: quantity(390e-12, 1e-12, 'F') }).predicted.stepStderr!.overshoot).toBeGreaterThan(0);
  });

  it('a repeated pole (real double root) gives finite metrics close to its neighbours', () => {
    // (s + 1)^2 (s + 4) / 4 with no zero: final value 1.
    const repeated = loopStepResponse([1], [{ re: -4, im: 0 }, { re: -1, im: 0 }, { re: -1, im: 0 }], 0.25);
    const near = loopStepResponse([1], [{ re: -4, im: 0 }, { re: -1.001, im: 0 }, { re: -0.999, im: 0 }], 0.25 * 1.001 * 0.999);
    expect(Number.isFinite(repeated.metrics.settlingTime)).toBe(true);
    expect(repeated.metrics.overshoot).toBe(0);
    expect(repeated.metrics.settlingTime!).toBeCloseTo(near.metrics.settlingTime!, 2);
    expect(repeated.at(0)).toBeCloseTo(0, 6);
  });
});
