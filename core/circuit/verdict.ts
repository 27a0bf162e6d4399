// A built board against its design: each response quantity and level decided against its limits with the
// measurement uncertainty (pass, conditional pass, conditional fail, fail under a named decision rule; a single
// decay's tau against the slow time constant of a design it dominates), the waveform difference, and the
// single change (a component, or the source's step) that best explains a deviation.
import { quantity, type Quantity } from '../quantity';
import { evaluateResponse, type ResponseParams } from '../response/secondOrder';
import { componentsFromResponse } from './components';
import { combineZones, resolveDecisionRule, type DecisionRule, type DecisionZone, type QuantityLimits } from './decisionRule';
import type { Design, DesignSource, LimitedQuantity } from './design';
import { CircuitInputError } from './errors';
import { decayRates, designLevels, predictResponse, probeUnit, responseSwing, type DesignLevels } from './predict';
import { toleranceLimits, widenLimits } from './quantityLimits';
import { deviates, judgeQuantity, undecidedLimits, type VerdictQuantity } from './quantityVerdict';
import {
  COMPONENT_NAMES,
  COMPONENT_UNITS,
  RESPONSE_UNITS,
  evaluatePowerLaw,
  powerLawRelativeUncertainty,
  responseRelations,
  type ComponentName,
  type ResponseQuantityName,
} from './relations';
import { toleranceToRelativeUncertainty } from './tolerance';
import { METRICS, NO_STEP_METRICS, limitedTransitionRows, type FittedTransitions } from './transitionLimits';
import { alphaOmega0Correlation } from '../fit/correlation';
import { formatEngineering, formatWithUncertainty } from '../units/format';

export type { VerdictQuantity } from './quantityVerdict';

/** The parts of a response fit the verdict reads (a ResponseFit has them all). */
export interface FittedResponse {
  alpha: Quantity;
  omega0: Quantity;
  zeta: Quantity;
  Q: Quantity;
  /**
   * Time constant of a single decay (a first-order fit), s; its alpha, omega0, zeta and Q are then NaN. It
   * is checked against the design's slow time constant when that root dominates (singleDecayRefusal).
   */
  tau?: Quantity;
  /** Event time; the prediction is placed there. Default 0. */
  t0?: Quantity;
  /** Fit window; the RMS difference is taken over it. Default: the whole record. */
  window?: { start: number; end: number };
  correlation?: { names: string[]; matrix: number[][] } | null;
  /** The fitted model; its levels and its start are checked against the design's. Absent: no level rows. */
  params?: ResponseParams;
  /** Fitted level before the event with its standard error. Default: params.yPre, no standard error. */
  preLevel?: Quantity;
  /** True when the fit saw no samples before the event: the level before it and the swing at it are not checked. */
  startsInResponse?: boolean;
  /** True when t0 is no event time (the fit saw none and none was given): the prediction is not placed, so no rmsDifference. */
  eventTimeUnknown?: boolean;
  /** Fitted final value with its standard error. Default: params.yFinal, no standard error. */
  finalValue?: Quantity;
  /** The fitted model's step metrics (a FitSummary's); read only for the overshoot and settling limits a design states. */
  transitions?: FittedTransitions;
}

export interface CheckOptions {
  /** Component taken from the design to derive the other two from the fit; null for none. Default: the tightest tolerance. */
  knownComponent?: ComponentName | null;
}

export interface LikelyCause {
  /** A component, or 'source' when the levels are off: the source's step (or initial state) differs from the design's. */
  component: ComponentName | 'source';
  /** Relative change from the design value (0.1 = 10 % higher). */
  change: number;
  /** The value the change implies, SI base units (stderr null: a diagnostic, not a measurement). */
  impliedValue: Quantity;
  /**
   * Fraction of the deviation this change accounts for, 0 to 1: of the squared log deviation of (alpha,
   * omega0) for a component, of the squared level deviations in design uncertainties for the source.
   */
  explains: number;
}

export interface Verdict {
  /** Every counted quantity accepted under the rule (the decision a script reads: check exits 0, else 3). */
  pass: boolean;
  /** The unit's zone over the counted quantities: any fail is a fail, else the worse conditional zone, else a pass (combineZones). */
  decision: DecisionZone;
  /** The decision rule the quantities were decided by, and whether the design chose it. */
  rule: DecisionRule;
  quantities: VerdictQuantity[];
  /** RMS of measured minus predicted over the fit window, unit of the probe; null when the window holds no samples or the event time is unknown. */
  rmsDifference: number | null;
  likelyCause: LikelyCause | null;
  /** d ln(alpha) / d ln(X) and d ln(omega0) / d ln(X) for X in R, L, C. */
  sensitivities: Record<'alpha' | 'omega0', Record<ComponentName, number>>;
  notes: string[];
}

/**
 * Level tolerance when the design states none: room for a scope's DC gain error of a few % of full scale,
 * a probe's attenuation tolerance and the source's own setting (common practice, from memory), while a
 * step of another size (48 V designed, 12 V built) is far outside it.
 */
const DEFAULT_LEVEL_TOLERANCE = 0.1;
/** A single change explaining less than this share of the deviation is reported with a note saying so. */
const EXPLAINS_WELL = 0.8;
/**
 * A design's slow root dominates its response when the fast root is at least this many times faster: the
 * dominant-pole approximation (common practice, a factor of 5 to 10). It holds from zeta 1.34 on.
 */
const SLOW_ROOT_DOMINANCE = 5;
/** Preference among equal tolerances when choosing the known component: capacitors are usually the best known. */
const KNOWN_PREFERENCE: ComponentName[] = ['C', 'L', 'R'];

/** The rows a design may limit directly under their own name (f0 stands in for omega0 when limited). */
const DIRECT_ROWS: readonly string[] = ['zeta', 'Q', 'R', 'L', 'C'] satisfies LimitedQuantity[];

/**
 * Each quantity has limits: those the design states (limits.<name>), else the extremes over the corners of
 * the component tolerances (quantityLimits.ts); the levels' limits add the level tolerance of the larger of
 * the level and the swing. Its zone compares value ± U (U = k u_measured) with the limits, and the design's
 * decision rule (default: guarded acceptance, w = U, k = 2) accepts it or not (decisionRule.ts). The board
 * passes when every counted quantity is accepted (R, L or C derived with another part at its design value
 * counts only when the design limits it: VerdictQuantity.counted); its decision is the worst counted zone.
 * A limited overshoot or settling time is a row too (transitionLimits.ts). The margin in sigma (against the
 * design's value and its rectangular tolerance uncertainty, GUM 4.3.7) is kept as information. The likely
 * cause names the source when a level deviates, else the component; R, L and C are derived taking a part
 * other than the likely cause at its design value, so the table shows the change where the cause puts it.
 */
export function checkDesign(
  design: Design,
  fit: FittedResponse,
  measured: { time: ArrayLike<number>; values: ArrayLike<number> },
  options: CheckOptions = {},
): Verdict {
  if (measured.time.length !== measured.values.length) {
    throw new CircuitInputError('measured.values', `length ${measured.values.length} differs from the time axis (${measured.time.length})`);
  }
  const refusal = singleDecayRefusal(design, fit);
  if (refusal) throw new CircuitInputError('fit', refusal);
  const rule = resolveDecisionRule(design.decisionRule);
  // The rule itself is the verdict's `rule` (every face shows it on its own line), not a note.
  const notes: string[] = [LIMITS_NOTE];
  const judge = (name: string, designQ: Quantity, measuredQ: Quantity, fromTolerances: () => QuantityLimits) => {
    const stated = DIRECT_ROWS.includes(name) ? design.limits?.[name as LimitedQuantity] : undefined;
    return stated ? judgeQuantity(name, designQ, measuredQ, stated, 'design', rule) : judgeQuantity(name, designQ, measuredQ, fromTolerances(), 'tolerances', rule);
  };
  const relations = responseRelations(design.topology);
  const values = nominalValues(design);
  const relU = {} as Record<ComponentName, number>;
  for (const name of COMPONENT_NAMES) relU[name] = toleranceToRelativeUncertainty(design.components[name].tolerance);
  const designRate = (name: ResponseQuantityName) => {
    const v = evaluatePowerLaw(relations[name], values);
    return quantity(v, Math.abs(v) * powerLawRelativeUncertainty(relations[name], relU), RESPONSE_UNITS[name]);
  };

  const quantities: VerdictQuantity[] = [];
  if (fit.tau) {
    quantities.push(judge('tau', slowTimeConstant(design), fit.tau, () => toleranceLimits(design, (d) => 1 / (decayRates(d)?.slow ?? NaN))));
    notes.push(
      "A single decay: tau is checked against the design's slow time constant, and the levels; one time constant cannot tell which part moved, so no R, L, C or component cause is derived.",
    );
  } else {
    for (const name of ['alpha', 'omega0', 'zeta', 'Q'] as ResponseQuantityName[]) {
      if (name === 'omega0' && design.limits?.f0) {
        quantities.push(judgeQuantity('f0', inHertz(designRate('omega0')), inHertz(fit.omega0), design.limits.f0, 'design', rule));
        continue;
      }
      quantities.push(judge(name, designRate(name), fit[name], () => toleranceLimits(design, (d) => evaluatePowerLaw(relations[name], nominalValues(d)))));
    }
  }
  const unknown = (fit.tau ? [fit.tau] : [fit.alpha, fit.omega0]).some((q) => q.stderr === null);
  if (unknown) notes.push('Some fitted uncertainties are unknown: those quantities are decided on their value alone (U unknown) and their margins use the design tolerance alone.');

  const physical = derivesParts(fit);
  const sensitivities = {
    alpha: { ...relations.alpha.exponents },
    omega0: { ...relations.omega0.exponents },
  };
  const componentCause = physical ? explainDeviation(designRate('alpha').value, designRate('omega0').value, fit, sensitivities, values) : null;
  const rateOut = !fit.tau && quantities.slice(0, 2).some(deviates);
  const known =
    options.knownComponent === undefined ? tightestComponent(design, rateOut ? componentCause?.component : undefined) : options.knownComponent;
  if (known !== null && physical) {
    const spec = design.components[known];
    const derived = componentsFromResponse(fit.alpha, fit.omega0, design.topology, { name: known, value: spec.value, tolerance: spec.tolerance }, alphaOmega0Correlation(fit.correlation));
    for (const name of COMPONENT_NAMES.filter((n) => n !== known)) {
      const designQ = quantity(values[name], values[name] * relU[name], COMPONENT_UNITS[name]);
      const row = judge(name, designQ, derived[name], () => toleranceLimits(design, (d) => d.components[name].value));
      quantities.push({ ...row, counted: row.limitsFrom === 'design' });
    }
    notes.push(`R, L, C from the fit take ${known} at its design value (${known} has the tightest tolerance unless chosen).`);
    if (quantities.some((q) => !q.counted)) {
      notes.push(`The derived parts carry ${known}'s tolerance: shown for diagnosis, not counted in the decision unless the design limits them (limits.R, limits.L, limits.C).`);
    }
  }
  if (!physical && !fit.tau) notes.push('The fitted alpha or omega0 is not positive: no components or likely cause can be derived.');
  quantities.push(...limitedTransitionRows(design, fit.transitions, fit.t0?.value ?? 0, rule));
  const unused = DIRECT_ROWS.concat('f0').filter((name) => design.limits?.[name as LimitedQuantity] && !quantities.some((q) => q.name === name));
  if (unused.length) {
    const why = fit.tau
      ? TAU_ALONE
      : !physical
        ? NO_PART_DERIVED
        : known === null
          ? 'no part is derived from the fit'
          : `${known} is taken at its design value to derive the others`;
    undecidedLimits(unused, why);
  }
  const shapeOut = quantities.some(deviates);
  if (shapeOut && componentCause) {
    if (componentCause.explains < EXPLAINS_WELL) notes.push('No single component explains the deviation well: more than one part may have moved, or the topology differs.');
    if (componentCause.component === known) {
      notes.push(`The likely cause is ${known}, the part taken at its design value to derive the others: their rows carry its change.`);
    }
  }

  const startsAfterEvent = fit.startsInResponse === true || (measured.time.length > 0 && (fit.t0?.value ?? 0) < measured.time[0]);
  const observed = observedLevels(design, fit, startsAfterEvent);
  const levels = observed ? levelRows(design, observed, rule) : [];
  quantities.push(...levels);
  if (observed) notes.push(...levelNotes(design, startsAfterEvent, levels));
  if (fit.eventTimeUnknown) notes.push('No event time is known (the record holds none): the prediction is not placed, so it is not compared with the samples.');
  let likelyCause = shapeOut ? componentCause : null;
  if (observed && levels.some(deviates)) {
    // The levels may follow the part that moved (a coil current's swing goes as sqrt(C / L)): the source is
    // named only when the levels still deviate with that part at its implied value.
    const moved =
      shapeOut && componentCause && componentCause.explains >= EXPLAINS_WELL && componentCause.component !== 'source'
        ? withComponent(design, componentCause.component, 1 + componentCause.change)
        : design;
    const movedRows = moved === design ? levels : levelRows(moved, observed, rule);
    if (moved !== design && !movedRows.some(deviates)) {
      notes.push(`The levels move with ${componentCause!.component}: at its implied value they are in tolerance.`);
    } else {
      likelyCause = sourceCause(moved, movedRows);
    }
  }
  if (likelyCause?.component === 'source') {
    if (likelyCause.explains < EXPLAINS_WELL) {
      notes.push('The levels are not the design\'s scaled by one source step: an offset (probe or source) or a different initial state is more likely.');
    }
    if (shapeOut && componentCause) {
      notes.push(
        `The response's shape differs too: ${componentCause.component} about ${(Math.abs(componentCause.change) * 100).toFixed(1)} % ` +
          `${componentCause.change >= 0 ? 'high' : 'low'} explains ${(componentCause.explains * 100).toFixed(0)} % of the alpha and omega0 deviation.`,
      );
    }
  }

  const counted = quantities.filter((q) => q.counted);
  return {
    pass: counted.every((q) => q.inTolerance),
    decision: combineZones(counted.map((q) => q.zone)),
    rule,
    quantities,
    rmsDifference: rmsDifference(design, fit, measured),
    likelyCause,
    sensitivities,
    notes,
  };
}

const LIMITS_NOTE =
  'Limits: those the design states (limits), else the extremes over the corners of the component tolerances; each zone compares the measured value ± U with them.';

/** omega0 as the natural frequency f0 = omega0 / 2 pi, Hz. */
function inHertz(omega: Quantity): Quantity {
  return quantity(omega.value / (2 * Math.PI), omega.stderr === null ? null : omega.stderr / (2 * Math.PI), 'Hz');
}

function nominalValues(design: Design): Record<ComponentName, number> {
  return { R: design.components.R.value, L: design.components.L.value, C: design.components.C.value };
}

/**
 * Why a fit cannot be checked against a design quantity by quantity, or null when it can: a single decay
 * (a first-order fit) compares only with a design whose slow root dominates its response; a design that
 * rings, or whose two decays are close, predicts a response a single decay does not measure.
 */
export function singleDecayRefusal(design: Design, fit: Pick<FittedResponse, 'tau'>): string | null {
  if (!fit.tau) return null;
  const rates = decayRates(design);
  if (rates && rates.fast >= SLOW_ROOT_DOMINANCE * rates.slow) return null;
  const relations = responseRelations(design.topology);
  const values = { R: design.components.R.value, L: design.components.L.value, C: design.components.C.value };
  const omega0 = evaluatePowerLaw(relations.omega0, values);
  const zeta = (evaluatePowerLaw(relations.alpha, values) / omega0).toPrecision(3);
  const predicted = rates
    ? `two decays (zeta ${zeta}) within a factor of ${SLOW_ROOT_DOMINANCE} of each other, neither dominant`
    : `a ring (f0 ${formatEngineering(omega0 / (2 * Math.PI), 'Hz')}, zeta ${zeta})`;
  return (
    `the fit found a single decay (first-order, tau ${formatWithUncertainty(fit.tau)}) where '${design.name}' predicts ${predicted}: ` +
    'not comparable quantity by quantity, so nothing was checked (a ring the capture missed: sample rate, bandwidth, probe point; or far more damping than designed)'
  );
}

/** Why a limit goes undecided (checkDesign refuses it, undecidedByCapture gives no verdict for it). */
const TAU_ALONE = 'a single decay gives tau alone';
const NO_PART_DERIVED = 'the fitted alpha or omega0 is not positive, so no part is derived';

/** Whether R, L and C follow from the fit: a second-order fit with positive alpha and omega0. */
function derivesParts(fit: Pick<FittedResponse, 'tau' | 'alpha' | 'omega0'>): boolean {
  return !fit.tau && fit.alpha.value > 0 && fit.omega0.value > 0;
}

/**
 * Why this capture's fit cannot decide a limit the design states, or null: a single decay gives tau alone, rates
 * that are not positive derive no part, a fit with no step metrics has none to limit. The capture's answer, not the
 * design's fault: no verdict (checkDesign would refuse the limits as bad input, never pass them unchecked).
 */
export function undecidedByCapture(design: Design, fit: Pick<FittedResponse, 'tau' | 'alpha' | 'omega0' | 'transitions'>): string | null {
  const limited = (names: readonly string[]) => names.filter((name) => design.limits?.[name as LimitedQuantity]);
  const undecided: [string[], string][] = [];
  if (fit.tau) undecided.push([limited([...DIRECT_ROWS, 'f0']), TAU_ALONE]);
  else if (!derivesParts(fit)) undecided.push([limited(COMPONENT_NAMES), NO_PART_DERIVED]);
  if (!fit.transitions?.model) undecided.push([limited(METRICS), fit.transitions?.reason ?? NO_STEP_METRICS]);
  const found = undecided.filter(([names]) => names.length > 0);
  if (found.length === 0) return null;
  const said = found.map(([names, why]) => `${names.join(', ')} (${why})`).join('; ');
  return `this capture does not decide the design limits ${said}, so nothing was checked against '${design.name}'`;
}

/** Relative step of a part for the slow time constant's sensitivity to it: small beside the way from zeta 1.34 (SLOW_ROOT_DOMINANCE) to critical damping. */
const SENSITIVITY_STEP = 1e-6;

/**
 * The design's slow time constant 1 / s_slow (a dominant root: singleDecayRefusal), its uncertainty the
 * parts' relative uncertainties times its sensitivities d ln tau / d ln X, in quadrature (first order).
 */
function slowTimeConstant(design: Design): Quantity {
  const tau = (d: Design) => 1 / decayRates(d)!.slow;
  const nominal = tau(design);
  let squares = 0;
  for (const name of COMPONENT_NAMES) {
    const sensitivity = Math.log(tau(withComponent(design, name, 1 + SENSITIVITY_STEP)) / nominal) / Math.log1p(SENSITIVITY_STEP);
    squares += (sensitivity * toleranceToRelativeUncertainty(design.components[name].tolerance)) ** 2;
  }
  return quantity(nominal, nominal * Math.sqrt(squares), 's');
}

/**
 * The part taken at its design value to derive the other two: never one the design limits (its limit would go
 * undecided), nor `except` when another is left (the likely cause: it did not stay at its design value); the
 * tightest tolerance among the rest.
 */
function tightestComponent(design: Design, except?: ComponentName | 'source'): ComponentName {
  const free = KNOWN_PREFERENCE.filter((name) => !design.limits?.[name]);
  const candidates = [free.filter((name) => name !== except), free, KNOWN_PREFERENCE].find((list) => list.length > 0)!;
  return candidates.reduce((best, name) => (design.components[name].tolerance < design.components[best].tolerance ? name : best));
}

const LEVEL_NAMES: Record<keyof DesignLevels, string> = { preLevel: 'initial level', finalValue: 'final value', swing: 'swing' };

/**
 * The fit's levels in the probe's unit; the one before the event and the swing at it are null when the record
 * starts after it, the swing null for a single decay too (the swing is a ring's amplitude at omega0).
 */
interface ObservedLevels {
  preLevel: Quantity | null;
  finalValue: Quantity;
  swing: Quantity | null;
}

function observedLevels(design: Design, fit: FittedResponse, startsAfterEvent: boolean): ObservedLevels | null {
  const p = fit.params;
  if (!p) return null;
  const unit = probeUnit(design);
  return {
    preLevel: startsAfterEvent ? null : (fit.preLevel ?? quantity(p.yPre, null, unit)),
    finalValue: fit.finalValue ?? quantity(p.yFinal, null, unit),
    swing: fit.tau || startsAfterEvent ? null : quantity(responseSwing(p.a, p.b - p.alpha * p.a, p.omega0), null, unit),
  };
}

/**
 * The observed levels against the design's: before the event and final; with the swing too when the
 * design's two levels are equal (a current or a resistor voltage, whose levels do not show the step).
 * Limits: the level's extremes over the tolerance corners, widened by the level tolerance of the larger of
 * the level and the swing. The design's uncertainty (for the margin): that level tolerance and the
 * component tolerances carried through to first order, all rectangular.
 */
function levelRows(design: Design, observed: ObservedLevels, rule: DecisionRule): VerdictQuantity[] {
  const unit = probeUnit(design);
  const expected = designLevels(design);
  const tolerance = levelTolerance(design);
  const u = toleranceToRelativeUncertainty(tolerance);
  const spread = componentSpread(design, expected);
  const row = (key: keyof DesignLevels, level: Quantity) => {
    const scale = key === 'swing' ? expected.swing : Math.max(Math.abs(expected[key]), expected.swing);
    const designed = quantity(expected[key], Math.hypot(u * scale, spread[key]), unit);
    const limits = widenLimits(toleranceLimits(design, (d) => designLevels(d)[key]), tolerance * scale);
    return judgeQuantity(LEVEL_NAMES[key], designed, level, limits, 'tolerances', rule);
  };
  const rows: VerdictQuantity[] = [];
  if (observed.preLevel) rows.push(row('preLevel', observed.preLevel));
  rows.push(row('finalValue', observed.finalValue));
  if (observed.swing && expected.preLevel === expected.finalValue) rows.push(row('swing', observed.swing));
  return rows.filter((q) => Number.isFinite(q.measured.value));
}

/** How far each level moves when each part moves by its standard uncertainty, in quadrature (first order). */
function componentSpread(design: Design, expected: DesignLevels): DesignLevels {
  const squares = { preLevel: 0, finalValue: 0, swing: 0 };
  for (const name of COMPONENT_NAMES) {
    const moved = designLevels(withComponent(design, name, 1 + toleranceToRelativeUncertainty(design.components[name].tolerance)));
    for (const key of Object.keys(squares) as (keyof DesignLevels)[]) squares[key] += (moved[key] - expected[key]) ** 2;
  }
  return { preLevel: Math.sqrt(squares.preLevel), finalValue: Math.sqrt(squares.finalValue), swing: Math.sqrt(squares.swing) };
}

function withComponent(design: Design, name: ComponentName, factor: number): Design {
  const components = { ...design.components, [name]: { ...design.components[name], value: design.components[name].value * factor } };
  return { ...design, components };
}

function levelTolerance(design: Design): number {
  return design.source.levelTolerance ?? DEFAULT_LEVEL_TOLERANCE;
}

function levelNotes(design: Design, startsAfterEvent: boolean, rows: readonly VerdictQuantity[]): string[] {
  const tolerance = levelTolerance(design);
  const stated = design.source.levelTolerance === undefined ? `${DEFAULT_LEVEL_TOLERANCE * 100} % (the design states no source.levelTolerance)` : `${tolerance * 100} % (source.levelTolerance)`;
  const notes = [
    `Level limits: the extremes over the tolerance corners widened by ${stated} of the larger of the level and the swing.`,
  ];
  if (startsAfterEvent) {
    const expected = designLevels(design);
    const swing = expected.preLevel === expected.finalValue ? ' and the swing at it are' : ' is';
    notes.push(`The record starts after the event: the level before it${swing} not observed, so not checked.`);
  }
  if (rows.some((q) => q.name === LEVEL_NAMES.swing)) {
    notes.push('The swing, sqrt(a^2 + (slope / omega0)^2) at the event, has no fitted standard error: it is decided on its value alone and its margin uses the design uncertainty alone.');
  }
  return notes;
}

/**
 * The source's step (or initial state) scaled by k: the levels are affine in k, so k follows by weighted
 * least squares over the level rows (weights 1 / u_design^2); `explains` is the share of the weighted
 * squared level deviation that the scaled source accounts for.
 */
function sourceCause(design: Design, rows: readonly VerdictQuantity[]): LikelyCause {
  const at = (k: number) => designLevels({ ...design, source: scaledSource(design.source, k) });
  const base = at(1);
  const doubled = at(2);
  let dg = 0;
  let gg = 0;
  let dd = 0;
  const terms = rows.map((q) => {
    const name = levelKey(q.name);
    const w = 1 / (q.design.stderr ?? 1) ** 2;
    const d = q.measured.value - base[name];
    const g = doubled[name] - base[name];
    dg += w * d * g;
    gg += w * g * g;
    dd += w * d * d;
    return { w, d, g };
  });
  const change = gg > 0 ? dg / gg : 0;
  const left = terms.reduce((sum, { w, d, g }) => sum + w * (d - change * g) ** 2, 0);
  const s = design.source;
  const stated = s.kind === 'step' ? s.amplitude : s.capacitorVoltage !== 0 ? s.capacitorVoltage : s.inductorCurrent;
  const unit = s.kind === 'step' ? (design.topology === 'series' ? 'V' : 'A') : s.capacitorVoltage !== 0 ? 'V' : 'A';
  return { component: 'source', change, impliedValue: quantity(stated * (1 + change), null, unit), explains: dd > 0 ? Math.max(0, 1 - left / dd) : 1 };
}

function scaledSource(source: DesignSource, k: number): DesignSource {
  return source.kind === 'step'
    ? { ...source, amplitude: source.amplitude * k }
    : { ...source, capacitorVoltage: source.capacitorVoltage * k, inductorCurrent: source.inductorCurrent * k };
}

function levelKey(rowName: string): keyof DesignLevels {
  return (Object.keys(LEVEL_NAMES) as (keyof DesignLevels)[]).find((key) => LEVEL_NAMES[key] === rowName)!;
}


/**
 * The single component change delta = ln(X_new / X_design) minimising |d - delta s_X|^2 in log space,
 * d = (ln alpha_fit / alpha_design, ln omega0_fit / omega0_design), s_X the sensitivities. Unweighted:
 * a weighted norm would let the far more precise omega0 make any candidate "explain" nearly all.
 */
function explainDeviation(
  designAlpha: number,
  designOmega0: number,
  fit: Pick<FittedResponse, 'alpha' | 'omega0'>,
  s: Verdict['sensitivities'],
  values: Record<ComponentName, number>,
): LikelyCause {
  const da = Math.log(fit.alpha.value / designAlpha);
  const dw = Math.log(fit.omega0.value / designOmega0);
  const total = da * da + dw * dw;
  let best: LikelyCause | null = null;
  for (const name of COMPONENT_NAMES) {
    const sa = s.alpha[name];
    const sw = s.omega0[name];
    const norm = sa * sa + sw * sw;
    if (norm === 0) continue;
    const delta = (da * sa + dw * sw) / norm;
    const left = (da - delta * sa) ** 2 + (dw - delta * sw) ** 2;
    const explains = total > 0 ? Math.max(0, 1 - left / total) : 1;
    if (best === null || explains > best.explains) {
      const implied = values[name] * Math.exp(delta);
      best = { component: name, change: Math.exp(delta) - 1, impliedValue: quantity(implied, null, COMPONENT_UNITS[name]), explains };
    }
  }
  return best as LikelyCause;
}

function rmsDifference(design: Design, fit: FittedResponse, measured: { time: ArrayLike<number>; values: ArrayLike<number> }): number | null {
  if (fit.eventTimeUnknown) return null;
  const prediction = evaluateResponse(predictResponse(design, fit.t0?.value ?? 0), measured.time);
  const start = fit.window?.start ?? -Infinity;
  const end = fit.window?.end ?? Infinity;
  let sum = 0;
  let count = 0;
  for (let i = 0; i < measured.time.length; i++) {
    const t = measured.time[i];
    if (t < start || t > end) continue;
    sum += (measured.values[i] - prediction[i]) ** 2;
    count++;
  }
  return count > 0 ? Math.sqrt(sum / count) : null;
}
