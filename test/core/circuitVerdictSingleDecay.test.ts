// checkDesign with a single decay (a first-order fit): tau against a dominant slow root, else refused; never a NaN row.
import { describe, expect, it } from 'vitest';
import type { Design } from '../../core/circuit/design';
import { CircuitInputError } from '../../core/circuit/errors';
import { decayRates, predictResponse } from '../../core/circuit/predict';
import { checkDesign, singleDecayRefusal, type FittedResponse } from '../../core/circuit/verdict';
import { quantity } from '../../core/quantity';
import { evaluateResponse } from '../../core/response/secondOrder';

const STEP = 12;
const TOL = { R: 0.05, L: 0.1, C: 0.02 };

function seriesDesign(R: number, L: number, C: number): Design {
  return {
    format: 'ringbench-design',
    version: 1,
    name: 'unit under test',
    topology: 'series',
    components: { R: { value: R, tolerance: TOL.R }, L: { value: L, tolerance: TOL.L }, C: { value: C, tolerance: TOL.C } },
    source: { kind: 'step', amplitude: STEP, initialLevel: 0 },
    probe: 'capacitor-voltage',
  };
}

/** A first-order fit as fitResponse gives it: the ring quantities NaN with no standard error, tau with 0.5 %. */
function singleDecay(tau: number, finalValue = STEP): FittedResponse {
  const none = (unit: string) => quantity(NaN, null, unit);
  return {
    alpha: none('s^-1'),
    omega0: none('rad/s'),
    zeta: none(''),
    Q: none(''),
    tau: quantity(tau, 0.005 * tau, 's'),
    t0: quantity(0, 1e-9, 's'),
    params: { t0: 0, yPre: 0, yFinal: finalValue, alpha: 1 / tau, omega0: 1 / tau, a: -finalValue, b: 0 },
    preLevel: quantity(0, 0.01, 'V'),
    finalValue: quantity(finalValue, 0.01, 'V'),
  };
}

// Series alpha = R / 2L, omega0 = 1 / sqrt(LC) (circuit laws): L 10 uH, C 1 uF gives omega0 = 316.2 krad/s.
const L = 10e-6;
const C = 1e-6;
const RINGING = seriesDesign(1, L, C); // zeta 0.158
const CLOSE_ROOTS = seriesDesign(7.6, L, C); // zeta 1.20: roots within a factor of 3.5
const DOMINANT = seriesDesign(20, L, C); // zeta 3.16: roots a factor of 39 apart
const time = Float64Array.from({ length: 500 }, (_, k) => k * 0.5e-6);

function samplesOf(design: Design) {
  return { time, values: evaluateResponse(predictResponse(design), time) };
}

describe('decayRates', () => {
  it('gives the two real roots of an overdamped design, their product omega0^2, and none for a ring', () => {
    const rates = decayRates(DOMINANT)!;
    const alpha = 20 / (2 * L);
    const omega0Squared = 1 / (L * C);
    expect(rates.slow * rates.fast).toBeCloseTo(omega0Squared, -3);
    expect(rates.slow + rates.fast).toBeCloseTo(2 * alpha, 6);
    // The two time constants add up to 2 alpha / omega0^2 = RC = 20 us; far overdamped, the slow one is nearly all of it.
    expect(1 / rates.slow + 1 / rates.fast).toBeCloseTo(20e-6, 15);
    expect(1 / rates.slow).toBeGreaterThan(0.97 * 20e-6);
    expect(decayRates(RINGING)).toBeNull();
  });
});

describe('checkDesign with a single decay', () => {
  it('refuses a design that rings: no verdict, the reason names the single decay and the predicted ring', () => {
    const fit = singleDecay(20e-6);
    expect(singleDecayRefusal(RINGING, fit)).toMatch(/^the fit found a single decay \(first-order, tau .*\) where 'unit under test' predicts a ring \(f0 50\.33 kHz, zeta 0\.158\)/);
    expect(() => checkDesign(RINGING, fit, samplesOf(RINGING))).toThrow(CircuitInputError);
    expect(() => checkDesign(RINGING, fit, samplesOf(RINGING))).toThrow(/single decay \(first-order/);
  });

  it('refuses a design whose two decays are close (neither dominates)', () => {
    expect(singleDecayRefusal(CLOSE_ROOTS, singleDecay(20e-6))).toMatch(/predicts two decays \(zeta 1\.20\) within a factor of 5 of each other/);
  });

  it('refuses a design that limits a ring quantity a single decay does not measure (zeta), never passing it unchecked', () => {
    const slowTau = 1 / decayRates(DOMINANT)!.slow;
    const limited: Design = { ...DOMINANT, limits: { zeta: { lower: 3, upper: 3.3 } } };
    const call = () => checkDesign(limited, singleDecay(slowTau), samplesOf(DOMINANT));
    expect(call).toThrow(CircuitInputError);
    expect(call).toThrow(/the design limits zeta, which this capture does not decide \(a single decay gives tau alone\)/);
  });

  it('has nothing to refuse for a second-order fit', () => {
    expect(singleDecayRefusal(RINGING, { tau: undefined })).toBeNull();
  });

  it('checks tau against the slow time constant of a design it dominates, and the levels: every row finite, no R, L, C', () => {
    const slowTau = 1 / decayRates(DOMINANT)!.slow;
    const v = checkDesign(DOMINANT, singleDecay(slowTau), samplesOf(DOMINANT));
    expect(v.quantities.map((q) => q.name)).toEqual(['tau', 'initial level', 'final value']);
    for (const q of v.quantities) {
      expect(Number.isFinite(q.measured.value)).toBe(true);
      expect(Number.isFinite(q.design.value)).toBe(true);
      expect(Number.isFinite(q.marginSigma)).toBe(true);
    }
    expect(v.pass).toBe(true);
    expect(v.likelyCause).toBeNull();
    const tau = v.quantities[0];
    expect(tau.design.unit).toBe('s');
    expect(tau.design.value).toBeCloseTo(slowTau, 12);
    // Near 1 / RC the slow time constant goes as R C: its uncertainty about sqrt(u_R^2 + u_C^2), the tolerances / sqrt(3).
    expect(tau.design.stderr! / slowTau).toBeGreaterThan(0.9 * Math.hypot(TOL.R, TOL.C) / Math.sqrt(3));
    expect(tau.design.stderr! / slowTau).toBeLessThan(1.1 * Math.hypot(TOL.R, TOL.C, 0.03 * TOL.L) / Math.sqrt(3));
    expect(v.notes.join(' ')).toMatch(/A single decay: tau is checked against the design's slow time constant/);
  });

  it('fails a decay 30 % slower than designed with a finite margin, and names the source when the final level is off', () => {
    const slowTau = 1 / decayRates(DOMINANT)!.slow;
    const slow = checkDesign(DOMINANT, singleDecay(1.3 * slowTau), samplesOf(DOMINANT));
    expect(slow.pass).toBe(false);
    const tau = slow.quantities.find((q) => q.name === 'tau')!;
    expect(tau.inTolerance).toBe(false);
    expect(Number.isFinite(tau.marginSigma)).toBe(true);
    expect(slow.likelyCause).toBeNull();

    const lowStep = checkDesign(DOMINANT, singleDecay(slowTau, STEP / 4), samplesOf(DOMINANT));
    expect(lowStep.pass).toBe(false);
    expect(lowStep.likelyCause?.component).toBe('source');
    expect(lowStep.likelyCause?.change).toBeCloseTo(-0.75, 2);
  });
});
