// Decision zones and guard-banded acceptance at every boundary, the design file's limits and rule, and a
// verdict decided by them. Terms: ISO 14253-1:2017 (conformance and nonconformance zones), ILAC-G8:09/2019
// 4.2.1-4.2.3 (simple acceptance, guard band w, pass / conditional pass / conditional fail / fail), JCGM
// 106:2012 8.3 (acceptance limits; guarded acceptance and guarded rejection).
import { describe, expect, it } from 'vitest';
import { accepts, combineZones, decisionZone, describeDecisionRule, resolveDecisionRule, type DecisionRuleName } from '../../core/circuit/decisionRule';
import { DesignError, parseDesign, serializeDesign, type Design } from '../../core/circuit/design';
import { predictResponse } from '../../core/circuit/predict';
import { checkDesign, type FittedResponse } from '../../core/circuit/verdict';
import { CircuitInputError } from '../../core/circuit/errors';
import { quantity } from '../../core/quantity';

// Binary fractions throughout, so "exactly at" and "just touching" are exact in floating point.
const LIMITS = { lower: 1, upper: 2 };
const U = 0.125;

describe('decisionZone: value ± U against the closed limits [1, 2] (ILAC-G8:09/2019 4.2.3, ISO 14253-1:2017)', () => {
  it.each([
    { value: 1.5, zone: 'pass', why: 'the interval well inside' },
    { value: 1.125, zone: 'pass', why: 'the interval just touching the lower limit from inside' },
    { value: 1.875, zone: 'pass', why: 'the interval just touching the upper limit from inside' },
    { value: 1.0625, zone: 'conditional-pass', why: 'the value inside, the interval crossing the lower limit' },
    { value: 1, zone: 'conditional-pass', why: 'the value exactly at the lower limit (the limits belong to the zone)' },
    { value: 2, zone: 'conditional-pass', why: 'the value exactly at the upper limit' },
    { value: 2.0625, zone: 'conditional-fail', why: 'the value outside, the interval crossing back' },
    { value: 2.125, zone: 'conditional-fail', why: 'the interval just touching the upper limit from outside (shares that point)' },
    { value: 0.875, zone: 'conditional-fail', why: 'the interval just touching the lower limit from outside' },
    { value: 2.25, zone: 'fail', why: 'the interval wholly outside' },
    { value: 0.75, zone: 'fail', why: 'the interval wholly below' },
  ])('$value: $zone ($why)', ({ value, zone }) => {
    expect(decisionZone(value, U, LIMITS)).toBe(zone);
  });

  it('an open side never limits; an unknown U (0) decides on the value alone', () => {
    expect(decisionZone(1e9, U, { lower: 1, upper: null })).toBe('pass');
    expect(decisionZone(1.0625, U, { lower: 1, upper: null })).toBe('conditional-pass');
    expect(decisionZone(2, 0, LIMITS)).toBe('pass');
    expect(decisionZone(2.0625, 0, LIMITS)).toBe('fail');
  });

  it('an interval wider than the zone is never a pass', () => {
    expect(decisionZone(1.5, 0.75, LIMITS)).toBe('conditional-pass');
  });
});

describe('accepts: acceptance limits moved by the guard band w = r U (ILAC-G8:09/2019 4.2; JCGM 106:2012 8.3)', () => {
  const rule = (name: DecisionRuleName, guardBandFactor?: number) => resolveDecisionRule({ name, ...(guardBandFactor === undefined ? {} : { guardBandFactor }) });
  // Columns: the value, then accepted under simple acceptance, guarded acceptance (w = U), guarded rejection (w = U).
  it.each([
    { value: 1.5, zone: 'pass', simple: true, guarded: true, rejection: true },
    { value: 1.125, zone: 'pass', simple: true, guarded: true, rejection: true },
    { value: 1.0625, zone: 'conditional-pass', simple: true, guarded: false, rejection: true },
    { value: 1, zone: 'conditional-pass', simple: true, guarded: false, rejection: true },
    { value: 2.0625, zone: 'conditional-fail', simple: false, guarded: false, rejection: true },
    { value: 2.125, zone: 'conditional-fail', simple: false, guarded: false, rejection: true },
    { value: 2.25, zone: 'fail', simple: false, guarded: false, rejection: false },
  ])('$value ($zone): simple $simple, guarded acceptance $guarded, guarded rejection $rejection', ({ value, simple, guarded, rejection }) => {
    expect(accepts(rule('simple-acceptance'), value, U, LIMITS)).toBe(simple);
    expect(accepts(rule('guarded-acceptance'), value, U, LIMITS)).toBe(guarded);
    expect(accepts(rule('guarded-rejection'), value, U, LIMITS)).toBe(rejection);
  });

  it('a guard band of half U accepts a conditional pass deeper than w, not one nearer the limit', () => {
    expect(accepts(rule('guarded-acceptance', 0.5), 1.0625, U, LIMITS)).toBe(true);
    expect(accepts(rule('guarded-acceptance', 0.5), 1.03125, U, LIMITS)).toBe(false);
  });

  it('the default rule is guarded acceptance with w = U and k = 2, said to be the default', () => {
    expect(resolveDecisionRule(undefined)).toMatchObject({ name: 'guarded-acceptance', guardBandFactor: 1, coverageFactor: 2, source: 'default' });
    expect(resolveDecisionRule({ name: 'simple-acceptance' })).toMatchObject({ guardBandFactor: 0, coverageFactor: 2, source: 'design' });
  });

  it('the unit: any fail is a fail, else the worse conditional zone, else a pass', () => {
    expect(combineZones(['pass', 'conditional-pass', 'fail', 'conditional-fail'])).toBe('fail');
    expect(combineZones(['pass', 'conditional-pass', 'conditional-fail'])).toBe('conditional-fail');
    expect(combineZones(['pass', 'conditional-pass'])).toBe('conditional-pass');
    expect(combineZones(['pass', 'pass'])).toBe('pass');
  });
});

const BASE = {
  format: 'ringbench-design',
  version: 1,
  name: 'gate loop with stated limits',
  topology: 'series',
  components: { R: { value: '5.6', tolerance: 0.05 }, L: { value: '20n', tolerance: 0.1 }, C: { value: '2.2n', tolerance: 0.02 } },
  source: { kind: 'step', amplitude: 12 },
  probe: 'capacitor-voltage',
};

describe('design file: limits and decisionRule', () => {
  it('reads limits with SI prefixes (overshoot in %) and the rule, and writes them back', () => {
    const design = parseDesign(
      JSON.stringify({
        ...BASE,
        limits: { f0: { lower: '20M', upper: '28M' }, zeta: { upper: 0.5 }, overshoot: { upper: '40 %' }, settlingTime2: { lower: null, upper: '100n' } },
        decisionRule: { name: 'guarded-rejection', guardBandFactor: 0.5, coverageFactor: 3 },
      }),
    );
    expect(design.limits).toEqual({ f0: { lower: 20e6, upper: 28e6 }, zeta: { lower: null, upper: 0.5 }, overshoot: { lower: null, upper: 40 }, settlingTime2: { lower: null, upper: 100e-9 } });
    expect(design.decisionRule).toEqual({ name: 'guarded-rejection', guardBandFactor: 0.5, coverageFactor: 3 });
    expect(parseDesign(serializeDesign(design))).toEqual(design);
  });

  it.each([
    [{ limits: { f1: { upper: 1 } } }, 'limits.f1', /unknown field/],
    [{ limits: { zeta: {} } }, 'limits.zeta', /needs a lower or an upper limit/],
    [{ limits: { zeta: { lower: 0.5, upper: 0.2 } } }, 'limits.zeta', /lower \(0\.5\) must be below upper \(0\.2\)/],
    [{ limits: { L: { lower: '-1n' } } }, 'limits.L.lower', /must not be negative/],
    [{ limits: { C: { upper: '2.2 furlongs' } } }, 'limits.C.upper', /could not read/],
    [{ limits: { overshoot: { upper: 'a lot' } } }, 'limits.overshoot.upper', /percentage/],
    [{ limits: { Q: { span: 2 } } }, 'limits.Q.span', /unknown field/],
    [{ decisionRule: { name: 'best-guess' } }, 'decisionRule.name', /must be one of/],
    [{ decisionRule: { name: 'simple-acceptance', guardBandFactor: 1 } }, 'decisionRule.guardBandFactor', /no guard band/],
    [{ decisionRule: { name: 'guarded-acceptance', guardBandFactor: -1 } }, 'decisionRule.guardBandFactor', /0 or more/],
    [{ decisionRule: { name: 'guarded-acceptance', coverageFactor: 0 } }, 'decisionRule.coverageFactor', /1 or more/],
    // Guarded rejection accepts up to w beyond a limit: with w above U it would accept a unit proven out of tolerance.
    [{ decisionRule: { name: 'guarded-rejection', guardBandFactor: 1.5 } }, 'decisionRule.guardBandFactor', /at most 1 under guarded-rejection/],
    // The coverage probability written where k belongs: U = 0.95 u would narrow the guard band below one standard uncertainty.
    [{ decisionRule: { name: 'guarded-acceptance', coverageFactor: 0.95 } }, 'decisionRule.coverageFactor', /not the coverage probability/],
    // One ring gives alpha and omega0: two of R, L and C with the third taken at its design value.
    [{ limits: { R: { upper: 6 }, L: { upper: '22n' }, C: { upper: '2.3n' } } }, 'limits', /limits R, L and C.*at most two/],
    [{ source: { kind: 'natural', capacitorVoltage: 12 }, limits: { overshoot: { upper: 25 } } }, 'limits.overshoot', /needs a step source/],
  ])('%j is refused at %s', (extra, path, message) => {
    let error: unknown;
    try {
      parseDesign(JSON.stringify({ ...BASE, ...extra }));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(DesignError);
    expect((error as DesignError).path).toBe(path);
    expect((error as DesignError).message).toMatch(message);
  });
});

describe('checkDesign with limits stated in the design', () => {
  const design = parseDesign(JSON.stringify(BASE));
  const p = predictResponse(design);
  /** The fit of a board built exactly as designed, with small relative errors. */
  const fit: FittedResponse = {
    alpha: quantity(p.alpha, 1e-3 * p.alpha, 's^-1'),
    omega0: quantity(p.omega0, 1e-3 * p.omega0, 'rad/s'),
    zeta: quantity(p.alpha / p.omega0, 1.4e-3 * (p.alpha / p.omega0), ''),
    Q: quantity(p.omega0 / (2 * p.alpha), 1.4e-3 * (p.omega0 / (2 * p.alpha)), ''),
    t0: quantity(0, 0, 's'),
    transitions: {
      reason: null,
      model: { overshoot: quantity(30, 0.5, '%'), settlingTime2: quantity(50e-9, 1e-9, 's'), settlingTime5: quantity(40e-9, 1e-9, 's') },
    },
  };
  const zeros = { time: [0, 1e-9], values: [0, 0] };
  const f0 = p.omega0 / (2 * Math.PI);

  it('f0 stands in for omega0 with the stated limits; zeta keeps its own; overshoot gets a row', () => {
    const stated: Design = { ...design, limits: { f0: { lower: f0 * 0.99, upper: f0 * 1.01 }, zeta: { lower: 0, upper: 1 }, overshoot: { lower: null, upper: 25 } } };
    const v = checkDesign(stated, fit, zeros);
    const byName = Object.fromEntries(v.quantities.map((q) => [q.name, q]));
    expect(v.quantities.map((q) => q.name)).toEqual(['alpha', 'f0', 'zeta', 'Q', 'R', 'L', 'overshoot']);
    expect(byName.f0).toMatchObject({ limits: { lower: f0 * 0.99, upper: f0 * 1.01 }, limitsFrom: 'design', zone: 'pass', inTolerance: true });
    expect(byName.f0.measured.unit).toBe('Hz');
    expect(byName.zeta).toMatchObject({ limits: { lower: 0, upper: 1 }, limitsFrom: 'design' });
    expect(byName.Q.limitsFrom).toBe('tolerances');
    // Overshoot 30 % ± 1 % against at most 25 %: wholly outside.
    expect(byName.overshoot).toMatchObject({ zone: 'fail', inTolerance: false, expandedUncertainty: 1 });
    expect([v.decision, v.pass]).toEqual(['fail', false]);
  });

  it('f0 limits tighter than the measurement: a conditional pass, rejected by default and accepted by simple acceptance', () => {
    // U = 2 × 0.1 % of f0: a value 0.15 % inside the upper limit is within U of it.
    const limits = { f0: { lower: f0 * 0.9, upper: f0 * 1.0015 } };
    const guarded = checkDesign({ ...design, limits }, fit, zeros);
    const simple = checkDesign({ ...design, limits, decisionRule: { name: 'simple-acceptance' } }, fit, zeros);
    expect(guarded.quantities.find((q) => q.name === 'f0')!.zone).toBe('conditional-pass');
    expect([guarded.decision, guarded.pass]).toEqual(['conditional-pass', false]);
    expect([simple.decision, simple.pass]).toEqual(['conditional-pass', true]);
    expect(describeDecisionRule(guarded.rule)).toMatch(/^guarded-acceptance, guard band w = 1 U, U = k u with k = 2 \(the default/);
    expect(describeDecisionRule(simple.rule)).toMatch(/^simple-acceptance, no guard band \(w = 0\), U = k u with k = 2 \(chosen by the design/);
  });

  it('a limited step metric the fit did not measure is refused, never passed unchecked', () => {
    const call = () => checkDesign({ ...design, limits: { settlingTime5: { lower: null, upper: 1e-6 } } }, { ...fit, transitions: { reason: 'a ringdown about one level has no step', model: null } }, zeros);
    expect(call).toThrow(CircuitInputError);
    expect(call).toThrow(/the design limits settlingTime5, which this capture does not decide \(a ringdown about one level has no step\)/);
  });

  it('a part the design limits is derived from the fit, not taken at its design value (C has the tightest tolerance)', () => {
    // Built as designed (C 2.2 nF) against limits of 2.0 to 2.1 nF: C is out, whatever the tightest tolerance.
    const v = checkDesign({ ...design, limits: { C: { lower: 2.0e-9, upper: 2.1e-9 } } }, fit, zeros);
    const row = v.quantities.find((q) => q.name === 'C');
    // The value outside, its interval (R's 5 % tolerance carried through) reaching back across the limit.
    expect(row).toMatchObject({ counted: true, limitsFrom: 'design', zone: 'conditional-fail', inTolerance: false });
    // R (5 %) is now the part taken at its design value: L = R / (2 alpha), C = 1 / (omega0^2 L) (series, circuit laws).
    expect(row!.measured.value).toBeCloseTo((2 * p.alpha) / (5.6 * p.omega0 ** 2), 20);
    expect(v.pass).toBe(false);
  });
});
