// extractParasitics (added-capacitor method) on exact and noisy synthetic natural frequencies.
import { describe, expect, it } from 'vitest';
import { extractParasitics, type AddedCapacitorMeasurement } from '../../core/circuit/addedCapacitor';
import { CircuitInputError } from '../../core/circuit/errors';
import { createRandom } from '../../core/random';
import { quantity } from '../../core/quantity';

/** f0 = 1 / (2 pi sqrt(L C)) (derived, trade-facts.md: added-capacitor method). */
function naturalFrequency(L: number, C: number): number {
  return 1 / (2 * Math.PI * Math.sqrt(L * C));
}

function measurement(L: number, C: number, addedC: number, relU = 0, alpha = 1e7): AddedCapacitorMeasurement {
  const f = naturalFrequency(L, C + addedC);
  return { addedC, frequency: quantity(f, relU * f, 'Hz'), alpha: quantity(alpha, 0.01 * alpha, 's^-1') };
}

const LOOPS = [
  { label: 'buck switch node', L: 15e-9, C: 220e-12, added: [0, 470e-12] },
  { label: 'gate-drive loop', L: 8e-9, C: 1.5e-9, added: [0, 4.7e-9] },
  { label: 'LC input filter', L: 2.2e-6, C: 10e-6, added: [0, 22e-6] },
  { label: 'switch node, four captures', L: 15e-9, C: 220e-12, added: [0, 220e-12, 470e-12, 1e-9] },
];

describe('extractParasitics', () => {
  it.each(LOOPS)('$label: recovers L_p and C_p from exact frequencies', ({ L, C, added }) => {
    const r = extractParasitics(added.map((a) => measurement(L, C, a, 1e-4)));
    expect(r.L.value / L - 1).toBeCloseTo(0, 9);
    expect(r.C.value / C - 1).toBeCloseTo(0, 9);
    expect(r.characteristicImpedance.value / Math.sqrt(L / C) - 1).toBeCloseTo(0, 9);
    if (added.length > 2) {
      expect(r.residual!.dof).toBe(added.length - 2);
      expect(r.residual!.chiSquare).toBeLessThan(1e-12);
    } else {
      expect(r.residual).toBeNull();
    }
  });

  it('two captures reproduce C_p = C_add / ((f1 / f2)^2 - 1), L_p = 1 / ((2 pi f1)^2 C_p) (derived, trade-facts.md)', () => {
    const f1 = 87.3e6;
    const f2 = 52.1e6;
    const cAdd = 470e-12;
    const cp = cAdd / ((f1 / f2) ** 2 - 1);
    const lp = 1 / ((2 * Math.PI * f1) ** 2 * cp);
    const r = extractParasitics([
      { addedC: 0, frequency: quantity(f1, 1e3, 'Hz'), alpha: quantity(1e7, 1e4, 's^-1') },
      { addedC: cAdd, frequency: quantity(f2, 1e3, 'Hz'), alpha: quantity(1e7, 1e4, 's^-1') },
    ]);
    expect(r.C.value / cp - 1).toBeCloseTo(0, 12);
    expect(r.L.value / lp - 1).toBeCloseTo(0, 12);
  });

  it('halving the frequency means C_add = 3 C_p (derived, trade-facts.md)', () => {
    const r = extractParasitics([
      { addedC: 0, frequency: quantity(100e6, 1e4, 'Hz'), alpha: quantity(1e7, 1e4, 's^-1') },
      { addedC: 300e-12, frequency: quantity(50e6, 1e4, 'Hz'), alpha: quantity(1e7, 1e4, 's^-1') },
    ]);
    expect(r.C.value).toBeCloseTo(100e-12, 22);
  });

  it('removes the probe capacitance that sits in every capture', () => {
    const L = 15e-9;
    const C = 220e-12;
    const probe = 10e-12; // 10x passive probe, about 10 pF (common practice, trade-facts.md)
    const ms = [0, 470e-12, 1e-9].map((a) => measurement(L, C + probe, a, 1e-4));
    const r = extractParasitics(ms, { probeC: probe });
    expect(r.C.value / C - 1).toBeCloseTo(0, 9);
    expect(r.L.value / L - 1).toBeCloseTo(0, 9);
  });

  it('R_p = 2 alpha L_p with alpha of the capture with the least added capacitance (series-loop assumption)', () => {
    const L = 15e-9;
    const ms = [measurement(L, 220e-12, 470e-12, 1e-4, 1.7e7), measurement(L, 220e-12, 0, 1e-4, 1.6e7)];
    const r = extractParasitics(ms);
    expect(r.R.value).toBeCloseTo(2 * 1.6e7 * L, 12);
    expect(r.notes.join(' ')).toMatch(/series loop/);
    // alpha 1e-2 relative and L_p's own uncertainty add in quadrature.
    expect(r.R.stderr! / r.R.value).toBeCloseTo(Math.hypot(0.01, r.L.stderr! / r.L.value), 12);
  });

  it('warns when alpha moves by more than 10 % between captures', () => {
    const ms = [measurement(15e-9, 220e-12, 0, 1e-4, 1e7), measurement(15e-9, 220e-12, 470e-12, 1e-4, 1.3e7)];
    expect(extractParasitics(ms).warnings.join(' ')).toMatch(/alpha changes/);
  });

  // Seeded Monte Carlo of the whole extraction against its first-order uncertainties: frequency
  // noise at the stated stderr and added-part values drawn uniformly within their tolerance.
  it.each([
    { label: 'two captures, 5 % part', added: [0, 470e-12], tol: 0.05, relU: 1e-3 },
    { label: 'four captures, 2 % parts', added: [0, 220e-12, 470e-12, 1e-9], tol: 0.02, relU: 2e-3 },
    { label: 'three captures, exact parts', added: [0, 470e-12, 1e-9], tol: 0, relU: 1e-3 },
  ])('stderr of L_p, C_p and Z0 matches a seeded Monte Carlo ($label)', ({ added, tol, relU }) => {
    const L = 15e-9;
    const C = 220e-12;
    const nominal = added.map((a) => ({ ...measurement(L, C, a, relU), addedCTolerance: tol }));
    const r = extractParasitics(nominal);
    const random = createRandom(77);
    const draws = 4000;
    const acc = { L: [0, 0], C: [0, 0], Z: [0, 0] };
    for (let k = 0; k < draws; k++) {
      const ms = added.map((a) => {
        const trueAdded = a * (1 + tol * (2 * random.uniform() - 1));
        const f = naturalFrequency(L, C + trueAdded) * (1 + relU * random.normal());
        // The nominal (marked) value and the nominal uncertainties are what the user enters.
        return { addedC: a, addedCTolerance: tol, frequency: quantity(f, relU * f, 'Hz'), alpha: quantity(1e7, 1e5, 's^-1') };
      });
      const x = extractParasitics(ms);
      const add = (key: 'L' | 'C' | 'Z', v: number) => {
        acc[key][0] += v;
        acc[key][1] += v * v;
      };
      add('L', x.L.value);
      add('C', x.C.value);
      add('Z', x.characteristicImpedance.value);
    }
    const sd = (key: 'L' | 'C' | 'Z') => Math.sqrt(acc[key][1] / draws - (acc[key][0] / draws) ** 2);
    // 4000 draws estimate a standard deviation to about 1 %.
    for (const [key, q] of [['L', r.L], ['C', r.C], ['Z', r.characteristicImpedance]] as const) {
      expect(q.stderr! / sd(key)).toBeGreaterThan(0.95);
      expect(q.stderr! / sd(key)).toBeLessThan(1.05);
    }
  });

  // C_p = C_add / ((f1 / f2)^2 - 1) has the frequencies' drop in its denominator: near the separation limit a first-order
  // error bar understates it on the side where the drop read large. Seeded draws of two frequencies whose true drop is
  // a few combined standard uncertainties; only the draws the extraction accepts count, as a user sees only those.
  it.each([
    { label: 'true drop 4 sigma, near the limit of 3', sigmas: 4, least: 0.94, most: 0.99 },
    { label: 'true drop 30 sigma, far from it', sigmas: 30, least: 0.94, most: 0.965 },
  ])('C_p within 2 of its stated standard uncertainties as often as L_p ($label)', ({ sigmas, least, most }) => {
    const L = 15e-9;
    const C = 220e-12;
    const f1 = naturalFrequency(L, C);
    const u = 1e-3 * f1;
    const f2 = f1 - sigmas * Math.SQRT2 * u;
    // The capacitance that lowers f0 from f1 to f2: (f1 / f2)^2 = (C + C_add) / C (derived, trade-facts.md).
    const added = C * ((f1 / f2) ** 2 - 1);
    const random = createRandom(21);
    let accepted = 0;
    let covered = 0;
    for (let k = 0; k < 4000; k++) {
      const draw = (f: number, addedC: number) => ({ addedC, frequency: quantity(f + u * random.normal(), u, 'Hz'), alpha: quantity(1e7, 1e5, 's^-1') });
      const pair = [draw(f1, 0), draw(f2, added)];
      let r;
      try {
        r = extractParasitics(pair);
      } catch {
        continue;
      }
      accepted++;
      if (Math.abs(r.C.value - C) <= 2 * r.C.stderr!) covered++;
    }
    expect(accepted).toBeGreaterThan(3000);
    expect(covered / accepted).toBeGreaterThan(least);
    expect(covered / accepted).toBeLessThan(most);
  });

  it('flags captures that disagree with one L_p, C_p and widens the uncertainty (Birge ratio)', () => {
    const L = 15e-9;
    const C = 220e-12;
    const good = [0, 220e-12, 470e-12, 1e-9].map((a) => measurement(L, C, a, 1e-4));
    const bad = good.map((m, i) => (i === 2 ? { ...m, frequency: quantity(m.frequency.value * 1.01, m.frequency.stderr, 'Hz') } : m));
    const clean = extractParasitics(good);
    const off = extractParasitics(bad);
    expect(clean.warnings.join(' ')).not.toMatch(/do not agree/);
    expect(off.warnings.join(' ')).toMatch(/do not agree/);
    expect(off.C.stderr!).toBeGreaterThan(10 * clean.C.stderr!);
    expect(off.residual!.chiSquare / off.residual!.dof).toBeGreaterThan(50);
  });

  it('without frequency uncertainties takes the scatter about the line, or gives none for two captures', () => {
    const L = 15e-9;
    const C = 220e-12;
    const two = extractParasitics([measurement(L, C, 0), measurement(L, C, 470e-12)]);
    expect(two.L.stderr).toBeNull();
    expect(two.C.stderr).toBeNull();
    expect(two.warnings.join(' ')).toMatch(/no uncertainty/);
    const random = createRandom(5);
    const three = [0, 470e-12, 1e-9].map((a) => {
      const m = measurement(L, C, a);
      return { ...m, frequency: quantity(m.frequency.value * (1 + 1e-3 * random.normal()), null, 'Hz') };
    });
    const r = extractParasitics(three);
    expect(r.C.stderr).not.toBeNull();
    expect(r.C.stderr!).toBeGreaterThan(0);
  });

  it('warns when the added capacitance barely moves the frequency', () => {
    const r = extractParasitics([measurement(15e-9, 220e-12, 0, 1e-4), measurement(15e-9, 220e-12, 22e-12, 1e-4)]);
    expect(r.warnings.join(' ')).toMatch(/poorly/);
  });

  // Measurement checks: bandwidth / 3 and 10 samples per period are common practice (no single source).
  it.each([
    { label: 'ring above bandwidth / 3 (common practice)', options: { bandwidth: 200e6 }, pattern: /third of the/, warns: true },
    { label: 'ring below bandwidth / 3 (common practice)', options: { bandwidth: 500e6 }, pattern: /third of the/, warns: false },
    { label: 'under 10 samples per period (common practice)', options: { sampleInterval: 2e-9 }, pattern: /samples/, warns: true },
    { label: 'over 10 samples per period (common practice)', options: { sampleInterval: 0.2e-9 }, pattern: /samples/, warns: false },
    // 500 MSa/s: a 412 MHz ring (500 - 87.6) would show as the bare 87.6 MHz one, and 500 MHz passes it (sampling theorem).
    { label: 'a bandwidth passing the alias of the ring', options: { bandwidth: 500e6, sampleInterval: 2e-9 }, pattern: /412\.\d+ MHz would show as this 87\.\d+ MHz ring/, warns: true },
    { label: 'a sample rate whose aliases the bandwidth stops', options: { bandwidth: 500e6, sampleInterval: 0.2e-9 }, pattern: /would show as/, warns: false },
  ])('$label', ({ options, pattern, warns }) => {
    // Bare switch node at 87.6 MHz; with 470 pF added 50 MHz.
    const r = extractParasitics([measurement(15e-9, 220e-12, 0, 1e-4), measurement(15e-9, 220e-12, 470e-12, 1e-4)], options);
    expect(pattern.test(r.warnings.join(' '))).toBe(warns);
  });

  describe('captures that cannot separate L_p and C_p are refused, never printed as a number', () => {
    const bare = { addedC: 0, frequency: quantity(99.942e6, 12e3, 'Hz'), alpha: quantity(2.16e7, 6e4, 's^-1'), label: 'before.csv' };

    it('the same capture twice (frequencies equal) names both captures and their f0', () => {
      const call = () => extractParasitics([bare, { ...bare, addedC: 470e-12, label: 'again.csv' }]);
      expect(call).toThrow(CircuitInputError);
      expect(call).toThrow(/cannot separate L_p and C_p: before\.csv \(added 0 F, f0 99\.942 MHz ± 12 kHz.*again\.csv \(added 470 pF, f0 99\.942 MHz/);
    });

    it.each([
      { label: 'a drop of 2 combined sigma is refused', sigmas: 2, refused: true },
      { label: 'a drop of 4 combined sigma is measured', sigmas: 4, refused: false },
    ])('$label (the limit is 3)', ({ sigmas, refused }) => {
      const drop = sigmas * Math.hypot(12e3, 12e3);
      const call = () => extractParasitics([bare, { ...bare, addedC: 470e-12, frequency: quantity(99.942e6 - drop, 12e3, 'Hz') }]);
      if (refused) expect(call).toThrow(/cannot separate/);
      else expect(call().C.stderr! / call().C.value).toBeLessThan(0.5);
    });

    it('a frequency that rises with the added capacitance names the two captures', () => {
      const call = () =>
        extractParasitics([
          { ...bare, addedC: 1e-9, label: 'with-1n.csv' },
          { ...bare, addedC: 0, frequency: quantity(67.3e6, 12e3, 'Hz'), label: 'with-0.csv' },
        ]);
      expect(call).toThrow(/does not fall as capacitance is added: with-1n\.csv \(added 1 nF, f0 99\.942 MHz.*rings above with-0\.csv \(added 0 F, f0 67\.300 MHz/);
    });

    it('captures scattered about the line by as much as the added capacitance moves it (C_p no longer bounded)', () => {
      // The middle capture rings 60 % above the line through the other two: each pair still falls clearly.
      const ms = [0, 470e-12, 1e-9].map((a) => measurement(15e-9, 220e-12, a, 1e-4)).map((m, i) => (i === 1 ? { ...m, frequency: quantity(m.frequency.value * 1.6, m.frequency.stderr, 'Hz') } : m));
      expect(() => extractParasitics(ms)).toThrow(/cannot separate L_p and C_p: they scatter about the line/);
    });

    it('without labels the captures are numbered; without uncertainties equal frequencies are still refused', () => {
      const plain = { addedC: 0, frequency: quantity(50e6, null, 'Hz'), alpha: quantity(1e7, null, 's^-1') };
      expect(() => extractParasitics([plain, { ...plain, addedC: 1e-9 }])).toThrow(/capture 2 \(added 1 nF, f0 50 MHz \(uncertainty not estimable\)\) rings above capture 1/);
    });
  });

  const invalid: { label: string; ms: AddedCapacitorMeasurement[]; options?: object; field: string }[] = [
    { label: 'one capture', ms: [measurement(15e-9, 220e-12, 0)], field: 'measurements' },
    { label: 'no distinct added value', ms: [measurement(15e-9, 220e-12, 0), measurement(15e-9, 220e-12, 0)], field: 'measurements' },
    { label: 'negative added value', ms: [measurement(15e-9, 220e-12, 0), { ...measurement(15e-9, 220e-12, 1e-10), addedC: -1e-10 }], field: 'measurements[1].addedC' },
    { label: 'zero frequency', ms: [measurement(15e-9, 220e-12, 0), { ...measurement(15e-9, 220e-12, 1e-10), frequency: quantity(0, null, 'Hz') }], field: 'measurements[1].frequency' },
    { label: 'frequency rising with capacitance', ms: [measurement(15e-9, 220e-12, 470e-12), { ...measurement(15e-9, 220e-12, 0), addedC: 1e-9 }], field: 'measurements' },
    { label: 'probe larger than the node', ms: [measurement(15e-9, 220e-12, 0), measurement(15e-9, 220e-12, 470e-12)], options: { probeC: 300e-12 }, field: 'measurements' },
    { label: 'bad tolerance', ms: [measurement(15e-9, 220e-12, 0), { ...measurement(15e-9, 220e-12, 1e-10), addedCTolerance: 2 }], field: 'measurements[1].addedCTolerance' },
  ];
  it.each(invalid)('throws CircuitInputError naming $field for $label', ({ ms, options, field }) => {
    const call = () => extractParasitics(ms, options);
    expect(call).toThrow(CircuitInputError);
    try {
      call();
    } catch (e) {
      expect((e as CircuitInputError).field).toBe(field);
    }
  });
});
