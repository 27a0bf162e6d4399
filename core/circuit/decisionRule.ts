// Conformance decisions with the measurement uncertainty taken into account: the four zones of a
// measured value against its limits, and acceptance under a decision rule (ISO 14253-1:2017, ILAC-G8:09/2019).

/**
 * Where a measured value's interval value ± U sits against the closed specification zone [lower, upper]:
 * pass: the whole interval inside (conformance proven); fail: no point of it inside (nonconformance proven);
 * conditional-pass: the value inside, the interval crossing a limit; conditional-fail: the value outside,
 * the interval crossing back. An interval that just touches a limit from inside is a pass, from outside a
 * conditional fail (it shares that point with the zone); a value exactly at a limit is inside.
 */
export type DecisionZone = 'pass' | 'conditional-pass' | 'conditional-fail' | 'fail';

export const DECISION_ZONES: readonly DecisionZone[] = ['pass', 'conditional-pass', 'conditional-fail', 'fail'];

/**
 * simple-acceptance: accepted when the value is within the limits, guard band w = 0 (ILAC-G8:09/2019 4.2.1,
 * "shared risk"). guarded-acceptance: accepted when the value is within the limits narrowed by w (ILAC-G8
 * 4.2.2; JCGM 106:2012 8.3.2; ISO 14253-1:2017 proof of conformance). guarded-rejection: rejected only when
 * the value is beyond the limits widened by w (JCGM 106:2012 8.3.3; ISO 14253-1:2017 proof of nonconformance).
 */
export type DecisionRuleName = 'simple-acceptance' | 'guarded-acceptance' | 'guarded-rejection';

export const DECISION_RULE_NAMES: readonly DecisionRuleName[] = ['simple-acceptance', 'guarded-acceptance', 'guarded-rejection'];

/** Lower and upper limit in SI base units (the overshoot in %); null where the zone is open. */
export interface QuantityLimits {
  lower: number | null;
  upper: number | null;
}

/** The rule as a design file states it; what it leaves out takes the defaults below. */
export interface DecisionRuleSpec {
  name: DecisionRuleName;
  /** Guard band w as a multiple of the expanded uncertainty U. */
  guardBandFactor?: number;
  /** k in U = k u. */
  coverageFactor?: number;
}

/** The rule a verdict was decided by, as its JSON carries it. */
export interface DecisionRule {
  name: DecisionRuleName;
  /** w = guardBandFactor × U; 0 under simple acceptance. */
  guardBandFactor: number;
  /** k in U = k u. */
  coverageFactor: number;
  /** 'design' when the design file chose the rule, 'default' when it did not. */
  source: 'design' | 'default';
  /** The clauses the rule follows. */
  reference: string;
}

/**
 * Default rule: guarded acceptance with w = U, the default of ISO 14253-1:2017 for proving conformance
 * (the uncertainty counts against the one who claims conformance: here the bench checking its own build),
 * and the guard band ILAC-G8:09/2019 4.2.2 gives as the usual choice (w = U).
 */
export const DEFAULT_RULE_NAME: DecisionRuleName = 'guarded-acceptance';
/** w = 1 × U: with k = 2 the chance of accepting a value truly at a limit is at most about 2.5 % (ILAC-G8:09/2019 4.2.2). */
export const DEFAULT_GUARD_BAND_FACTOR = 1;
/** k = 2: about 95 % coverage for a normal distribution (JCGM 100:2008, GUM 6.3.3). */
export const DEFAULT_COVERAGE_FACTOR = 2;

const REFERENCES: Record<DecisionRuleName, string> = {
  'simple-acceptance': 'ILAC-G8:09/2019 4.2.1 (binary, w = 0); zones per ILAC-G8:09/2019 4.2.3 and ISO 14253-1:2017',
  'guarded-acceptance': 'ILAC-G8:09/2019 4.2.2 (acceptance limit = tolerance limit − w); JCGM 106:2012 8.3.2; zones per ISO 14253-1:2017',
  'guarded-rejection': 'JCGM 106:2012 8.3.3 (acceptance limit = tolerance limit + w); zones per ILAC-G8:09/2019 4.2.3 and ISO 14253-1:2017',
};

/** The rule fully specified from what a design states (or nothing). */
export function resolveDecisionRule(spec: DecisionRuleSpec | undefined): DecisionRule {
  const name = spec?.name ?? DEFAULT_RULE_NAME;
  const guardBandFactor = name === 'simple-acceptance' ? 0 : (spec?.guardBandFactor ?? DEFAULT_GUARD_BAND_FACTOR);
  return { name, guardBandFactor, coverageFactor: spec?.coverageFactor ?? DEFAULT_COVERAGE_FACTOR, source: spec ? 'design' : 'default', reference: REFERENCES[name] };
}

/** How deep inside the limits a value sits: the smaller signed distance to a limit (negative outside, Infinity when both are open). */
function depthInside(value: number, limits: QuantityLimits): number {
  const fromLower = limits.lower === null ? Infinity : value - limits.lower;
  const fromUpper = limits.upper === null ? Infinity : limits.upper - value;
  return Math.min(fromLower, fromUpper);
}

/** The zone of a value with expanded uncertainty U (0 when unknown: the value alone decides). */
export function decisionZone(value: number, expandedUncertainty: number, limits: QuantityLimits): DecisionZone {
  const depth = depthInside(value, limits);
  if (depth >= expandedUncertainty) return 'pass';
  if (depth >= 0) return 'conditional-pass';
  if (depth >= -expandedUncertainty) return 'conditional-fail';
  return 'fail';
}

/**
 * Whether the rule accepts the value: within the limits moved by the guard band w = guardBandFactor × U
 * (inward for guarded acceptance, outward for guarded rejection, not at all for simple acceptance). With
 * w = U, guarded acceptance accepts exactly the pass zone and guarded rejection everything but the fail zone.
 */
export function accepts(rule: DecisionRule, value: number, expandedUncertainty: number, limits: QuantityLimits): boolean {
  const depth = depthInside(value, limits);
  const guardBand = rule.guardBandFactor * expandedUncertainty;
  if (rule.name === 'guarded-acceptance') return depth >= guardBand;
  if (rule.name === 'guarded-rejection') return depth >= -guardBand;
  return depth >= 0;
}

/** The unit's zone from its quantities': any fail is a fail, else the worse conditional zone, else a pass. */
export function combineZones(zones: readonly DecisionZone[]): DecisionZone {
  return zones.reduce<DecisionZone>((worst, zone) => (DECISION_ZONES.indexOf(zone) > DECISION_ZONES.indexOf(worst) ? zone : worst), 'pass');
}

/** One line naming the rule and its parameters, and whether the design chose it. */
export function describeDecisionRule(rule: DecisionRule): string {
  const band = rule.name === 'simple-acceptance' ? 'no guard band (w = 0)' : `guard band w = ${rule.guardBandFactor} U`;
  const chosen = rule.source === 'design' ? 'chosen by the design' : 'the default, a design may set decisionRule';
  return `${rule.name}, ${band}, U = k u with k = ${rule.coverageFactor} (${chosen}); after ${rule.reference}`;
}
