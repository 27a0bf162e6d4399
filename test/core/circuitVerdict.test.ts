// checkDesign: the in/out rule, derived components, the RMS difference and the likely cause.
import { describe, expect, it } from 'vitest';
import type { Design } from '../../core/circuit/design';
import { predictResponse, responseForValues } from '../../core/circuit/predict';
import type { Topology } from '../../core/circuit/relations';
import { checkDesign, type FittedResponse } from '../../core/circuit/verdict';
import type { Probe } from '../../core/circuit/design';
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

  // Limits from the tolerances: the extremes over the 8 corners, exact for a power law (alpha = R / 2L here);
  // under the default rule (guarded acceptance, w = U, k = 2: ISO 14253-1:2017, ILAC-G8:09/2019 4.2.2) a
  // quantity is accepted when value ± 2u lies inside them.
  it('gives alpha the limits of its tolerance corners, R / 2L at R ± 5 % and L ∓ 10 %', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const alpha = checkDesign(d, fitOf(GATE.topology, GATE.R, GATE.L, GATE.C), { time, values: new Float64Array(time.length) }).quantities[0];
    expect(alpha.limits.lower).toBeCloseTo((GATE.R * 0.95) / (2 * GATE.L * 1.1), 3);
    expect(alpha.limits.upper).toBeCloseTo((GATE.R * 1.05) / (2 * GATE.L * 0.9), 3);
    expect(alpha.limitsFrom).toBe('tolerances');
  });

  it.each([
    { label: 'well inside', at: 0.5, zone: 'pass', accepted: true },
    { label: 'within U of the upper limit', at: 1 - 1e-3, zone: 'conditional-pass', accepted: false },
    { label: 'just beyond the upper limit', at: 1 + 1e-3, zone: 'conditional-fail', accepted: false },
    { label: 'far beyond', at: 1.5, zone: 'fail', accepted: false },
  ])('alpha $label of its upper limit: $zone', ({ at, zone, accepted }) => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const fit = fitOf(GATE.topology, GATE.R, GATE.L, GATE.C);
    const base = checkDesign(d, fit, { time, values: new Float64Array(time.length) }).quantities[0];
    const value = base.design.value + at * (base.limits.upper! - base.design.value);
    const moved = { ...fit, alpha: quantity(value, fit.alpha.stderr, 's^-1') };
    const q = checkDesign(d, moved, { time, values: new Float64Array(time.length) }).quantities[0];
    expect(q.zone).toBe(zone);
    expect(q.inTolerance).toBe(accepted);
    expect(q.expandedUncertainty).toBeCloseTo(2 * fit.alpha.stderr!, 6);
  });

  it("decides by the design's rule: simple acceptance takes a conditional pass on the value alone", () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const fit = fitOf(GATE.topology, GATE.R, GATE.L, GATE.C);
    const upper = checkDesign(d, fit, { time, values: new Float64Array(time.length) }).quantities[0].limits.upper!;
    const moved = { ...fit, alpha: quantity(upper - fit.alpha.stderr!, fit.alpha.stderr, 's^-1') };
    // No part taken as known: the derived R would carry alpha's move.
    const guarded = checkDesign(d, moved, { time, values: new Float64Array(time.length) }, { knownComponent: null });
    const simple = checkDesign({ ...d, decisionRule: { name: 'simple-acceptance' } }, moved, { time, values: new Float64Array(time.length) }, { knownComponent: null });
    expect(guarded.quantities[0].zone).toBe('conditional-pass');
    expect(simple.quantities[0].zone).toBe('conditional-pass');
    expect([guarded.pass, guarded.decision, guarded.rule.name, guarded.rule.source]).toEqual([false, 'conditional-pass', 'guarded-acceptance', 'default']);
    expect([simple.pass, simple.decision, simple.rule.name, simple.rule.source]).toEqual([true, 'conditional-pass', 'simple-acceptance', 'design']);
  });

  it('a part derived with another at its design value is shown, not counted, unless the design limits it', () => {
    // TOL C 2 % and R 5 %: R from alpha with L from omega0 and C carries C's tolerance; a 5 % part with C
    // at 5 % has U about 5.8 %, more than its own limits allow, so it cannot be proven in tolerance.
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, { R: 0.05, L: 0.1, C: 0.05 });
    const fit = fitOf(GATE.topology, GATE.R, GATE.L, GATE.C);
    const zeros = { time, values: new Float64Array(time.length) };
    const shown = checkDesign(d, fit, zeros);
    const R = shown.quantities.find((q) => q.name === 'R')!;
    expect([R.zone, R.inTolerance, R.counted]).toEqual(['conditional-pass', false, false]);
    expect([shown.pass, shown.decision, shown.likelyCause]).toEqual([true, 'pass', null]);
    expect(shown.notes.join(' ')).toMatch(/not counted in the decision unless the design limits them/);
    const limited = checkDesign({ ...d, limits: { R: { lower: GATE.R * 0.95, upper: GATE.R * 1.05 } } }, fit, zeros);
    expect(limited.quantities.find((q) => q.name === 'R')).toMatchObject({ zone: 'conditional-pass', counted: true, limitsFrom: 'design' });
    expect([limited.pass, limited.decision]).toEqual([false, 'conditional-pass']);
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
    // C from omega0 with L taken at its design value carries L's 10 % tolerance (U about 11.5 %): inside C's 2 % limits, not proven.
    const C = v.quantities.find((q) => q.name === 'C')!;
    expect(C.measured.value).toBeCloseTo(GATE.C, 15);
    expect(C.zone).toBe('conditional-pass');
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

describe('checkDesign: the levels and the source step', () => {
  /** The design of the gate loop with another probe, source and level tolerance. */
  function designWith(probe: Probe, amplitude: number, levelTolerance?: number): Design {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    return { ...d, probe, source: { kind: 'step', amplitude, initialLevel: 0, ...(levelTolerance === undefined ? {} : { levelTolerance }) } };
  }

  /** A fit of the board as built, driven by `amplitude`, levels with relative standard errors of 1e-4. */
  function builtFit(probe: Probe, amplitude: number): FittedResponse {
    const built = designWith(probe, amplitude);
    const params = responseForValues(built, { R: GATE.R, L: GATE.L, C: GATE.C });
    const unit = probe === 'inductor-current' ? 'A' : 'V';
    const level = (v: number) => quantity(v, 1e-4 * Math.max(Math.abs(v), 1e-3), unit);
    return { ...fitOf(GATE.topology, GATE.R, GATE.L, GATE.C), params, preLevel: level(params.yPre), finalValue: level(params.yFinal) };
  }

  const zeros = { time, values: new Float64Array(time.length) };

  it('a 48 V design against a 12 V capture fails on the final value, and names the source step as the cause', () => {
    const v = checkDesign(designWith('capacitor-voltage', 48), builtFit('capacitor-voltage', 12), zeros);
    const byName = Object.fromEntries(v.quantities.map((q) => [q.name, q]));
    expect(v.pass).toBe(false);
    expect(byName['final value'].inTolerance).toBe(false);
    expect(byName['initial level'].inTolerance).toBe(true);
    for (const name of ['alpha', 'omega0', 'zeta', 'Q', 'R', 'L']) expect(byName[name].inTolerance).toBe(true);
    expect(v.likelyCause!.component).toBe('source');
    expect(v.likelyCause!.change).toBeCloseTo(-0.75, 6);
    expect(v.likelyCause!.impliedValue.value).toBeCloseTo(12, 6);
    expect(v.likelyCause!.impliedValue.unit).toBe('V');
    expect(v.likelyCause!.explains).toBeCloseTo(1, 6);
  });

  it('the same board driven as designed passes, levels included', () => {
    const v = checkDesign(designWith('capacitor-voltage', 12), builtFit('capacitor-voltage', 12), zeros);
    expect(v.pass).toBe(true);
    expect(v.likelyCause).toBeNull();
    expect(v.quantities.map((q) => q.name)).toEqual(['alpha', 'omega0', 'zeta', 'Q', 'R', 'L', 'initial level', 'final value']);
  });

  it('a current probe, whose levels are both zero, fails on the swing (the peak current scales with the step)', () => {
    const v = checkDesign(designWith('inductor-current', 48), builtFit('inductor-current', 12), zeros);
    const swing = v.quantities.find((q) => q.name === 'swing')!;
    expect(swing.inTolerance).toBe(false);
    // Series step into a loop at rest: i(0+) = 0, di/dt(0+) = V / L, so the swing is V / (L omega0) = V sqrt(C / L) (derived, KVL).
    expect(swing.design.value).toBeCloseTo(48 * Math.sqrt(GATE.C / GATE.L), 9);
    expect(swing.measured.value).toBeCloseTo(12 * Math.sqrt(GATE.C / GATE.L), 9);
    expect(v.pass).toBe(false);
    expect(v.likelyCause!.component).toBe('source');
    expect(v.likelyCause!.change).toBeCloseTo(-0.75, 6);
  });

  it.each([
    { label: '8 % low passes the default 10 % level tolerance', amplitude: 12 * 0.92, tolerance: undefined, pass: true },
    { label: '8 % low fails a stated 5 %', amplitude: 12 * 0.92, tolerance: 0.05, pass: false },
    { label: '15 % low fails the default', amplitude: 12 * 0.85, tolerance: undefined, pass: false },
  ])('$label', ({ amplitude, tolerance, pass }) => {
    const v = checkDesign(designWith('capacitor-voltage', 12, tolerance), builtFit('capacitor-voltage', amplitude), zeros);
    expect(v.pass).toBe(pass);
    expect(v.notes.join(' ')).toMatch(tolerance === undefined ? /10 % \(the design states no source\.levelTolerance\)/ : /5 % \(source\.levelTolerance\)/);
  });

  it('an offset (both levels moved alike) is not read as a different step', () => {
    const fit = builtFit('capacitor-voltage', 12);
    const shifted = { ...fit, preLevel: quantity(2, 1e-3, 'V'), finalValue: quantity(14, 1e-3, 'V') };
    const v = checkDesign(designWith('capacitor-voltage', 12), shifted, zeros);
    expect(v.pass).toBe(false);
    expect(v.likelyCause!.component).toBe('source');
    expect(v.likelyCause!.explains).toBeLessThan(0.8);
    expect(v.notes.join(' ')).toMatch(/offset/);
  });

  it('a record that starts after the event does not check the level before it (not observed)', () => {
    const fit = { ...builtFit('capacitor-voltage', 12), t0: quantity(-1e-9, 1e-12, 's'), preLevel: quantity(30, 1, 'V') };
    const v = checkDesign(designWith('capacitor-voltage', 12), fit, zeros);
    expect(v.quantities.some((q) => q.name === 'initial level')).toBe(false);
    expect(v.pass).toBe(true);
    expect(v.notes.join(' ')).toMatch(/starts after the event/);
  });

  it("a coil current's swing follows C (sqrt(C / L)): a moved C is the cause, not the source", () => {
    // A parallel tank released from a charged capacitor, probed on the coil current.
    const tank = (C: number): Design => ({
      ...makeDesign('parallel', 150, 15e-6, C, { R: 0.1, L: 0.1, C: 0.05 }),
      source: { kind: 'natural', capacitorVoltage: 24, inductorCurrent: 0 },
      probe: 'inductor-current',
    });
    const params = responseForValues(tank(220e-9), { R: 150, L: 15e-6, C: 220e-9 });
    const fit = { ...fitOf('parallel', 150, 15e-6, 220e-9), params, preLevel: quantity(0, 1e-4, 'A'), finalValue: quantity(0, 1e-4, 'A') };
    const v = checkDesign(tank(330e-9), fit, zeros);
    const byName = Object.fromEntries(v.quantities.map((q) => [q.name, q]));
    expect(byName.swing.inTolerance).toBe(false);
    // Released from v_C = V with i_L = 0: di_L/dt = V / L, so the swing is V / (L omega0) = V sqrt(C / L) (derived, KCL).
    expect(byName.swing.measured.value).toBeCloseTo(24 * Math.sqrt(220e-9 / 15e-6), 9);
    expect(v.likelyCause!.component).toBe('C');
    expect(byName.C.inTolerance).toBe(false);
    expect(v.notes.join(' ')).toMatch(/levels move with C/);
  });

  it('without the fitted model there are no level rows (nothing to compare)', () => {
    const v = checkDesign(designWith('capacitor-voltage', 48), fitOf(GATE.topology, GATE.R, GATE.L, GATE.C), zeros);
    expect(v.quantities.some((q) => q.name === 'final value')).toBe(false);
  });
});

describe('checkDesign: the likely cause agrees with the table', () => {
  it.each([
    { component: 'C' as Name, change: 0.3 },
    { component: 'L' as Name, change: -0.25 },
    { component: 'R' as Name, change: 0.4 },
  ])('$component moved by $change: its own row is out, and the part taken as known is another', ({ component, change }) => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const built = { ...GATE, [component]: GATE[component] * (1 + change) };
    const v = checkDesign(d, fitOf(GATE.topology, built.R, built.L, built.C), { time, values: new Float64Array(time.length) });
    expect(v.likelyCause!.component).toBe(component);
    const row = v.quantities.find((q) => q.name === component)!;
    expect(row).toBeDefined();
    expect(row.inTolerance).toBe(false);
    expect(row.measured.value / built[component] - 1).toBeCloseTo(0, 6);
    for (const other of v.quantities.filter((q) => ['R', 'L', 'C'].includes(q.name) && q.name !== component)) expect(other.inTolerance).toBe(true);
  });

  it('a known part chosen by hand that is the likely cause is said to carry its change into the other rows', () => {
    const d = makeDesign(GATE.topology, GATE.R, GATE.L, GATE.C, TOL);
    const v = checkDesign(d, fitOf(GATE.topology, GATE.R, GATE.L, GATE.C * 1.3), { time, values: new Float64Array(time.length) }, { knownComponent: 'C' });
    expect(v.likelyCause!.component).toBe('C');
    expect(v.notes.join(' ')).toMatch(/likely cause is C, the part taken at its design value/);
  });
});
