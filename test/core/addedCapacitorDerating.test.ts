// The added-capacitor method with real capacitors: derating per capture and a shared DC-bias factor fitted as a
// weighted line, the switch's output capacitance split off C_p, and the L_p cross-check from a turn-on edge.
import { describe, expect, it } from 'vitest';
import { extractParasitics, type AddedCapacitorMeasurement, type CapacitorDerating } from '../../core/circuit/addedCapacitor';
import { crossCheckInductance, inductanceFromEdge } from '../../core/circuit/edgeInductance';
import { CircuitInputError } from '../../core/circuit/errors';
import { quantity } from '../../core/quantity';
import { turnOnEdge } from './turnOnEdgeCapture';

const L = 15e-9;
const CP = 220e-12;

/** f0 = 1 / (2 pi sqrt(L (C_p + C_add))) (derived from the LC resonance, trade-facts.md: added-capacitor method). */
function naturalFrequency(addedEffective: number): number {
  return 1 / (2 * Math.PI * Math.sqrt(L * (CP + addedEffective)));
}

function point(addedC: number, effective: number, relU: number, shift = 0, derating?: CapacitorDerating): AddedCapacitorMeasurement {
  const f = naturalFrequency(effective) * (1 + shift);
  return { addedC, derating, frequency: quantity(f, relU * f, 'Hz'), alpha: quantity(2e7, 2e5, 's^-1') };
}

/**
 * Weighted least squares of y = a x + b by the normal equations (Bevington and Robinson, Data Reduction and Error
 * Analysis, the straight-line fit; chapter from memory): slope, intercept and the slope's variance S / Delta.
 */
function weightedLine(x: number[], y: number[], w: number[]) {
  const sum = (f: (i: number) => number) => x.reduce((s, _, i) => s + f(i), 0);
  const S = sum((i) => w[i]);
  const Sx = sum((i) => w[i] * x[i]);
  const Sy = sum((i) => w[i] * y[i]);
  const Sxx = sum((i) => w[i] * x[i] * x[i]);
  const Sxy = sum((i) => w[i] * x[i] * y[i]);
  const delta = S * Sxx - Sx * Sx;
  const slope = (S * Sxy - Sx * Sy) / delta;
  const intercept = (Sxx * Sy - Sx * Sxy) / delta;
  const chiSquare = sum((i) => w[i] * (y[i] - slope * x[i] - intercept) ** 2);
  return { slope, intercept, slopeVariance: S / delta, chiSquare };
}

describe('added capacitors at the operating voltage', () => {
  it('three captures with their own deratings: the line through the effective values matches the closed-form weighted fit', () => {
    const nominal = [0, 470e-12, 1e-9];
    const factors = [1, 0.8, 0.6];
    const shifts = [0.002, -0.003, 0.001];
    const relU = 0.002;
    const measurements = nominal.map((c, i) => point(c, c * factors[i], relU, shifts[i], i === 0 ? undefined : { factor: factors[i] }));
    const r = extractParasitics(measurements);

    const x = nominal.map((c, i) => c * factors[i]);
    const y = measurements.map((m) => 1 / (2 * Math.PI * m.frequency.value) ** 2);
    // u(y) / y = 2 u(f) / f, weights 1 / u(y)^2.
    const w = y.map((yi) => 1 / (2 * yi * relU) ** 2);
    const line = weightedLine(x, y, w);
    expect(r.L.value / line.slope - 1).toBeCloseTo(0, 10);
    expect(r.C.value / (line.intercept / line.slope) - 1).toBeCloseTo(0, 10);
    expect(r.residual!.chiSquare / line.chiSquare - 1).toBeCloseTo(0, 8);
    // Exact factors and parts: the slope's error is the fit's own, scaled by the Birge ratio when chi^2 / dof > 1.
    expect(r.L.stderr! / Math.sqrt(line.slopeVariance * Math.max(1, line.chiSquare / 1)) - 1).toBeCloseTo(0, 8);

    expect(r.points.map((p) => p.effectiveC.value)).toEqual(x.map((v) => expect.closeTo(v, 20)));
    expect(r.points.map((p) => p.factorSource)).toEqual(['none', 'derating', 'derating']);
    r.points.forEach((p, i) => expect(p.residual).toBeCloseTo(y[i] - line.slope * x[i] - line.intercept, 30));
    expect(r.points.every((p) => p.residualSigmas !== null && Math.abs(p.residualSigmas) < 3)).toBe(true);
    expect(r.notes.join(' ')).toMatch(/at the operating voltage/);
  });

  it('ignoring the derating would read L_p and C_p wrong: the nominal values give another line', () => {
    const nominal = [0, 470e-12, 1e-9];
    const factors = [1, 0.8, 0.6];
    const derated = extractParasitics(nominal.map((c, i) => point(c, c * factors[i], 1e-4, 0, i ? { factor: factors[i] } : undefined)));
    const naive = extractParasitics(nominal.map((c, i) => point(c, c * factors[i], 1e-4)));
    expect(derated.L.value / L - 1).toBeCloseTo(0, 8);
    expect(derated.C.value / CP - 1).toBeCloseTo(0, 8);
    expect(Math.abs(naive.C.value / CP - 1)).toBeGreaterThan(0.1);
  });

  it('one DC-bias factor for every added ceramic: its error is shared, so L_p and C_p carry its whole relative uncertainty', () => {
    const dcBias = { factor: 0.6, tolerance: 0.1 };
    const nominal = [0, 470e-12, 1e-9];
    const r = extractParasitics(nominal.map((c) => point(c, c * dcBias.factor, 1e-7)), { dcBias });
    expect(r.L.value / L - 1).toBeCloseTo(0, 6);
    expect(r.points.map((p) => p.factorSource)).toEqual(['none', 'dc-bias', 'dc-bias']);
    // Every x scales by k: L_p goes as 1 / k and C_p as k, so each takes u(k) / k = 0.1 / sqrt(3) (GUM 4.3.7, rectangular).
    expect(r.L.stderr! / r.L.value).toBeCloseTo(0.1 / Math.sqrt(3), 4);
    expect(r.C.stderr! / r.C.value).toBeCloseTo(0.1 / Math.sqrt(3), 4);
  });

  it('the parts\' own deratings may err together (one curve read twice): L_p is never surer than with one shared factor', () => {
    const own = { factor: 0.6, tolerance: 0.1 };
    const nominal = [0, 470e-12, 1e-9];
    const r = extractParasitics(nominal.map((c, i) => point(c, c * own.factor, 1e-7, 0, i ? own : undefined)));
    expect(r.L.stderr! / r.L.value).toBeCloseTo(0.1 / Math.sqrt(3), 4);
    expect(r.C.stderr! / r.C.value).toBeCloseTo(0.1 / Math.sqrt(3), 4);
  });

  it('a capture\'s own derating replaces the DC-bias factor for it (a C0G part among class-II ceramics)', () => {
    const r = extractParasitics(
      [point(0, 0, 1e-5), point(470e-12, 470e-12, 1e-5, 0, { factor: 1 }), point(1e-9, 0.6e-9, 1e-5)],
      { dcBias: { factor: 0.6, tolerance: 0.05 } },
    );
    expect(r.points.map((p) => p.factorSource)).toEqual(['none', 'derating', 'dc-bias']);
    expect(r.points[1].effectiveC.value).toBeCloseTo(470e-12, 20);
    expect(r.L.value / L - 1).toBeCloseTo(0, 6);
  });

  it('refuses a derating factor outside (0, 1], naming the capture', () => {
    expect(() => extractParasitics([point(0, 0, 1e-4), point(470e-12, 470e-12, 1e-4, 0, { factor: 1.3 })])).toThrow(/measurements\[1\]\.derating\.factor/);
    expect(() => extractParasitics([point(0, 0, 1e-4), point(470e-12, 470e-12, 1e-4)], { dcBias: { factor: 0 } })).toThrow(CircuitInputError);
  });
});

describe('the switch output capacitance at the operating voltage', () => {
  const captures = [point(0, 0, 1e-3), point(470e-12, 470e-12, 1e-3), point(1e-9, 1e-9, 1e-3)];

  it('is split off C_p with both uncertainties, and the note says its charge-equivalent value differs', () => {
    const r = extractParasitics(captures, { switchC: { value: 150e-12, tolerance: 0.1 } });
    const split = r.switchSplit!;
    expect(split.rest!.value).toBeCloseTo(r.C.value - 150e-12, 20);
    expect(split.rest!.stderr).toBeCloseTo(Math.hypot(r.C.stderr!, (150e-12 * 0.1) / Math.sqrt(3)), 20);
    expect(r.notes.join(' ')).toMatch(/small-signal value at the operating voltage.*Co\(tr\), Co\(er\)/);
  });

  it('a value clearly above C_p withholds the rest and says why', () => {
    const r = extractParasitics(captures, { switchC: { value: 400e-12 } });
    expect(r.switchSplit!.rest).toBeNull();
    expect(r.warnings.join(' ')).toMatch(/exceeds the node capacitance/);
  });
});

describe('L_p from a turn-on edge (v = L di/dt)', () => {
  it('recovers the loop L from seeded voltage and current captures within 3 standard errors', () => {
    for (let seed = 1; seed <= 12; seed++) {
      const edge = turnOnEdge({ L, seed });
      const r = inductanceFromEdge({ current: { time: edge.time, values: edge.current }, voltage: { time: edge.time, values: edge.voltage } });
      expect(Math.abs(r.L.value - L)).toBeLessThan(3 * r.L.stderr!);
      expect(r.L.stderr! / r.L.value).toBeLessThan(0.05);
      // 10-90 % of a 20 A ramp over 30 ns: 0.8 x 20 A / 24 ns.
      expect(r.didt.value / (20 / 30e-9) - 1).toBeCloseTo(0, 1);
      expect(r.plateauSource).toBe('voltage capture');
    }
  });

  it('an S-shaped rise, whose drop is no plateau, in 3 % current noise: L within its stated error, no bias from noisy crossings', () => {
    // Picking the last 10 % and first 90 % crossings of the raw samples shortened this rise and read L about 3.5 sigma low.
    const z: number[] = [];
    for (let seed = 31; seed <= 50; seed++) {
      const edge = turnOnEdge({ L, seed, shape: 'raised-cosine', currentNoise: 0.6, voltageNoise: 1.5, dt: 0.2e-9, samples: 2000 });
      const r = inductanceFromEdge({ current: { time: edge.time, values: edge.current }, voltage: { time: edge.time, values: edge.voltage } });
      z.push((r.L.value - L) / r.L.stderr!);
    }
    expect(Math.max(...z.map(Math.abs))).toBeLessThan(3.5);
    expect(Math.abs(z.reduce((a, b) => a + b, 0) / z.length)).toBeLessThan(0.7);
    expect(Math.sqrt(z.reduce((a, b) => a + b * b, 0) / z.length)).toBeLessThan(1.5);
  });

  it('agrees with the ring\'s L_p, and disagrees when the plateau given is wrong', () => {
    const edge = turnOnEdge({ L, seed: 7 });
    const current = { time: edge.time, values: edge.current };
    const ringL = quantity(15.2e-9, 0.4e-9, 'H');
    expect(crossCheckInductance(inductanceFromEdge({ current, voltage: { time: edge.time, values: edge.voltage } }), ringL).verdict).toBe('agree');
    expect(crossCheckInductance(inductanceFromEdge({ current, plateau: quantity(edge.drop, 0.2, 'V') }), ringL).verdict).toBe('agree');
    const wrong = crossCheckInductance(inductanceFromEdge({ current, plateau: quantity(1.6 * edge.drop, 0.2, 'V') }), ringL);
    expect(wrong.verdict).toBe('disagree');
    expect(wrong.difference.value).toBeGreaterThan(0);
  });

  it('refuses an edge too fast for the sample rate, and a voltage that does not drop', () => {
    const fast = turnOnEdge({ L, seed: 3, rise: 1e-9 });
    expect(() => inductanceFromEdge({ current: { time: fast.time, values: fast.current }, plateau: quantity(5, 0, 'V') })).toThrow(/rise spans only/);
    const edge = turnOnEdge({ L: 0, seed: 4 });
    expect(() => inductanceFromEdge({ current: { time: edge.time, values: edge.current }, voltage: { time: edge.time, values: edge.voltage } })).toThrow(
      /does not drop clearly/,
    );
  });
});
