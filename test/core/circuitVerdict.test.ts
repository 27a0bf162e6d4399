// checkDesign: the in/out rule, derived components, the RMS difference and the likely cause.
import { describe, expect, it } from 'vitest';
import type { Design } from '../../core/circuit/design';
import { predictResponse } from '../../core/circuit/predict';
import type { Topology } from '../../core/circuit/relations';
import { checkDesign, type FittedResponse } from '../../core/circuit/verdict';
import { quantity } from '../../core/quantity';
import { evaluateResponse } from '../../core/response/secondOrder';

type Name = 'R' | 'L' | 'C';

function makeDesign(topology: Topology, R: number, L: number, C: number, tol: Record<Name, number>): Design {
  return {
    format: 'ringbench-design',
    version: 1,
    name: 'unit under test',
    topology,
    components: { R: { value: R, tolerance: tol.R }, L: { value: L, tolerance: tol.L }, C: { value: C, tolerance: tol.C } },
    source: { kind: 'step', amplitude: 12, initialLevel: 0 },
    probe: 'capacitor-voltage',
  };
}

/** A fit as the board with values R, L, C would give it, with relative uncertainties ua and uw. */
function fitOf(topology: Topology, R: number, L: number, C: number, ua = 1e-3, uw = 1e-4): FittedResponse {
  // Series alpha = R / (2L), parallel alpha = 1 / (2RC), omega0 = 1 / sqrt(LC) (derived, circuit laws).
  const alpha = topology === 'series' ? R / (2 * L) : 1 / (2 * R * C);
  const omega0 = 1 / Math.sqrt(L * C);
  const zeta = alpha / omega0;
  const uz = zeta * Math.hypot(ua, uw);
  return {
    alpha: quantity(alpha, ua * alpha, 's^-1'),
    omega0: quantity(omega0, uw * omega0, 'rad/s'),
    zeta: quantity(zeta, uz, ''),
    Q: quantity(1 / (2 * zeta), (1 / (2 * zeta)) * Math.hypot(ua, uw), ''),
    t0: quantity(0, 0, 's'),
  };
}

const GATE = { topology: 'series' as Topology, R: 5.6, L: 20e-9, C: 2.2e-9 };
const TOL = { R: 0.05, L: 0.1, C: 0.02 };
const time = Float64Array.from({ length: 400 }, (_, k) => k * 0.05e-9);

describe('checkDesign', () => {
  it('passes a board built as designed, with zero margins and no cause', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const values = evaluateResponse(predictResponse(d), time);
    const v = checkDesign(d, fitOf(GATE.topology, GATE.R, GATE.L, GATE.C), { time, values });
    expect(v.pass).toBe(true);
    expect(v.likelyCause).toBeNull();
    expect(v.rmsDifference).toBeCloseTo(0, 12);
    for (const q of v.quantities) expect(q.marginSigma).toBeLessThan(1e-9);
    // C has the tightest tolerance, so R and L are derived from the fit with C known.
    expect(v.quantities.map((q) => q.name)).toEqual(['alpha', 'omega0', 'zeta', 'Q', 'R', 'L']);
  });

  it('propagates the tolerances to the design values as rectangular half-widths (GUM 4.3.7)', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const v = checkDesign(d, fitOf(GATE.topology, GATE.R, GATE.L, GATE.C), { time, values: new Float64Array(time.length) });
    const byName = Object.fromEntries(v.quantities.map((q) => [q.name, q]));
    const u = (t: number) => t / Math.sqrt(3);
    // Series: alpha = R / 2L; omega0 = (LC)^-1/2; zeta = (R/2) sqrt(C / L).
    expect(byName.alpha.design.stderr! / byName.alpha.design.value).toBeCloseTo(Math.hypot(u(0.05), u(0.1)), 12);
    expect(byName.omega0.design.stderr! / byName.omega0.design.value).toBeCloseTo(0.5 * Math.hypot(u(0.1), u(0.02)), 12);
    expect(byName.zeta.design.stderr! / byName.zeta.design.value).toBeCloseTo(Math.hypot(u(0.05), 0.5 * u(0.1), 0.5 * u(0.02)), 12);
    expect(byName.L.design.stderr! / byName.L.design.value).toBeCloseTo(u(0.1), 12);
  });

  // The rule: in tolerance when |fit - design| <= 2 sqrt(u_fit^2 + u_design^2).
  it.each([
    { k: 0, inTol: true },
    { k: 1.9, inTol: true },
    { k: -1.99, inTol: true },
    { k: 2.01, inTol: false },
    { k: -3, inTol: false },
  ])('alpha off by $k combined sigma is in tolerance: $inTol', ({ k, inTol }) => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const fit = fitOf(GATE.topology, GATE.R, GATE.L, GATE.C);
    const base = checkDesign(d, fit, { time, values: new Float64Array(time.length) }).quantities[0];
    const sigma = Math.hypot(fit.alpha.stderr!, base.design.stderr!);
    const moved = { ...fit, alpha: quantity(fit.alpha.value + k * sigma, fit.alpha.stderr, 's^-1') };
    const q = checkDesign(d, moved, { time, values: new Float64Array(time.length) }).quantities[0];
    expect(q.marginSigma).toBeCloseTo(Math.abs(k), 9);
    expect(q.inTolerance).toBe(inTol);
  });

  it('honours a stricter margin limit', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const fit = fitOf(GATE.topology, GATE.R * 1.05, GATE.L, GATE.C);
    const loose = checkDesign(d, fit, { time, values: new Float64Array(time.length) });
    const strict = checkDesign(d, fit, { time, values: new Float64Array(time.length) }, { marginLimit: 0.5 });
    expect(loose.quantities[0].inTolerance).toBe(true);
    expect(strict.quantities[0].inTolerance).toBe(false);
  });

  const moves = (['series', 'parallel'] as Topology[]).flatMap((topology) =>
    (['R', 'L', 'C'] as Name[]).flatMap((component) => [0.3, -0.25].map((change) => ({ topology, component, change }))),
  );
  it.each(moves)('$topology: finds $component moved by $change as the likely cause', ({ topology, component, change }) => {
    const nominal = topology === 'series' ? GATE : { R: 330, L: 47e-6, C: 10e-9 };
    const d = makeDesign(topology, nominal.R, nominal.L, nominal.C, { R: 0.01, L: 0.01, C: 0.01 });
    const built = { ...nominal, [component]: nominal[component] * (1 + change) };
    const v = checkDesign(d, fitOf(topology, built.R, built.L, built.C), { time, values: new Float64Array(time.length) }, { knownComponent: null });
    expect(v.pass).toBe(false);
    expect(v.likelyCause).not.toBeNull();
    expect(v.likelyCause!.component).toBe(component);
    expect(v.likelyCause!.change).toBeCloseTo(change, 9);
    expect(v.likelyCause!.explains).toBeCloseTo(1, 9);
    expect(v.likelyCause!.impliedValue.value / built[component] - 1).toBeCloseTo(0, 9);
  });

  it('says when no single component explains the deviation', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, { R: 0.01, L: 0.01, C: 0.01 });
    // R up 30 % and C up 30 %: alpha moves with R, omega0 with C; neither alone explains both.
    const v = checkDesign(d, fitOf('series', GATE.R * 1.3, GATE.L, GATE.C * 1.3), { time, values: new Float64Array(time.length) });
    expect(v.likelyCause!.explains).toBeLessThan(0.8);
    expect(v.notes.join(' ')).toMatch(/No single component/);
  });

  it('reports the sensitivities d ln(alpha)/d ln(X) and d ln(omega0)/d ln(X)', () => {
    const series = checkDesign(makeDesign('series', 1, 1e-6, 1e-9, TOL), fitOf('series', 1, 1e-6, 1e-9), { time, values: new Float64Array(time.length) });
    const parallel = checkDesign(makeDesign('parallel', 1e3, 1e-6, 1e-9, TOL), fitOf('parallel', 1e3, 1e-6, 1e-9), { time, values: new Float64Array(time.length) });
    expect(series.sensitivities.alpha).toEqual({ R: 1, L: -1, C: 0 });
    expect(series.sensitivities.omega0).toEqual({ R: 0, L: -0.5, C: -0.5 });
    expect(parallel.sensitivities.alpha).toEqual({ R: -1, L: 0, C: -1 });
  });

  it('derives the components with the chosen known part', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const fit = fitOf(GATE.topology, GATE.R * 1.2, GATE.L, GATE.C);
    const v = checkDesign(d, fit, { time, values: new Float64Array(time.length) }, { knownComponent: 'L' });
    const R = v.quantities.find((q) => q.name === 'R')!;
    expect(R.measured.value).toBeCloseTo(GATE.R * 1.2, 9);
    expect(R.inTolerance).toBe(false);
    expect(v.quantities.find((q) => q.name === 'C')!.inTolerance).toBe(true);
  });

  it('takes the RMS difference over the fit window only', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const predicted = evaluateResponse(predictResponse(d, 2e-9), time);
    const values = predicted.map((y, i) => y + (time[i] < 10e-9 ? 0.1 : 0.02));
    const fit = { ...fitOf(GATE.topology, GATE.R, GATE.L, GATE.C), t0: quantity(2e-9, 0, 's'), window: { start: 10e-9, end: 15e-9 } };
    expect(checkDesign(d, fit, { time, values }).rmsDifference).toBeCloseTo(0.02, 9);
    const { window: _, ...noWindow } = fit;
    const whole = checkDesign(d, noWindow, { time, values }).rmsDifference!;
    expect(whole).toBeGreaterThan(0.02);
  });

  it('notes an unknown fit uncertainty and falls back on the design tolerance', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const fit = fitOf(GATE.topology, GATE.R, GATE.L, GATE.C);
    const v = checkDesign(d, { ...fit, alpha: quantity(fit.alpha.value, null, 's^-1') }, { time, values: new Float64Array(time.length) });
    expect(v.notes.join(' ')).toMatch(/unknown/);
    expect(v.quantities[0].marginSigma).toBeCloseTo(0, 9);
  });
});
