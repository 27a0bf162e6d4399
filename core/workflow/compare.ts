// Two captures of the same circuit, before and after a change: how alpha, omega0 (and R, L, C) moved,
// with the combined uncertainty of each difference and a verdict on whether the change is significant.

import { componentsFromResponse } from '../circuit/components';
import { alphaOmega0Correlation } from '../fit/correlation';
import { quantity, type Quantity } from '../quantity';
import { hertz } from '../report/resultRows';
import { fitSucceeded, type FitSummary } from '../report/fitSummary';
import type { ChangeVerdict, Comparison, QuantityChange } from '../report/comparisonText';
import { measureCapture, type MeasureRequest, type MeasureResult } from './measure';
import { knownPartValue, type KnownPartRequest } from './measuredComponents';
import { setupRefusal } from './setupChecks';
import { formatWithUncertainty } from '../units/format';

/**
 * Coverage factor of each difference shown: k = 2 gives about 95 % for a normal distribution
 * (GUM, JCGM 100:2008, 6.3.3).
 */
export const COVERAGE_FACTOR = 2;
/**
 * 95th percentile of chi-square with 2 degrees of freedom (= -2 ln 0.05, exact for dof 2): the joint
 * test of the change in (alpha, omega0), with their correlation in each fit.
 */
const JOINT_LIMIT_95 = -2 * Math.log(0.05);

const SIGNIFICANCE = `A difference is significant when it exceeds ${COVERAGE_FACTOR} combined standard uncertainties (about 95 %, GUM 6.3.3)`;
const SIGNIFICANCE_NOTE = `${SIGNIFICANCE}.`;
const JOINT_NOTE = `${SIGNIFICANCE}; the verdict tests alpha and omega0 jointly, with each fit's correlation, at 95 % (chi-square, 2 degrees of freedom).`;

export type ComparisonSide = Omit<MeasureRequest, 'knownPart' | 'design' | 'eventTime'>;

export interface CompareRequest {
  before: ComparisonSide;
  after: ComparisonSide;
  /** The same known part for both: R, L and C are compared too. */
  knownPart?: KnownPartRequest;
}

export function compareCaptures(request: CompareRequest): Comparison {
  const before = measureCapture({ ...request.before, knownPart: request.knownPart });
  const after = measureCapture({ ...request.after, knownPart: request.knownPart });
  return compareMeasurements(before, after, request.knownPart);
}

/**
 * The comparison of two measurements already made (with the known part both were derived with, if any). Two rings
 * (or second-order responses) compare alpha, omega0 and what follows from them; two single decays compare tau. No
 * change is judged (undetermined) when a fit failed, a setup check refused a capture, or one capture holds a single
 * decay and the other a second-order response: they have no quantity in common.
 */
export function compareMeasurements(before: MeasureResult, after: MeasureResult, knownPart?: KnownPartRequest): Comparison {
  const a = before.summary;
  const b = after.summary;
  const common = { before: a, after: b, beforeCautions: before.cautions, afterCautions: after.cautions, coverageFactor: COVERAGE_FACTOR };
  const reason = undeterminedReason(before, after);
  if (reason) return { ...common, quantities: [], jointChiSquare: null, verdict: 'undetermined', reason, notes: [SIGNIFICANCE_NOTE] };
  if (a.tau && b.tau) {
    const notes = [SIGNIFICANCE_NOTE, ...(knownPart ? ['R, L and C are not compared: a single decay (one time constant) cannot give two parts.'] : [])];
    const tau = change('tau', a.tau, b.tau);
    return { ...common, quantities: [tau], jointChiSquare: null, ...judgeDecay(tau), notes };
  }
  const notes = [JOINT_NOTE];
  const quantities = rateChanges(a, b);
  if (knownPart) {
    quantities.push(...componentChanges(a, b, knownPart));
    notes.push(`R, L and C are compared without the tolerance of the known part (${knownPartValue(knownPart.known)}): the same part is assumed in both captures, so its error is common to both and cancels in the difference.`);
  }
  const joint = jointChiSquare(a, b);
  return { ...common, quantities, jointChiSquare: joint, ...judge(joint, quantities), notes };
}

/** Why no change can be judged between the two measurements, or null when it can. */
function undeterminedReason(before: MeasureResult, after: MeasureResult): string | null {
  const sides = [before, after];
  const failed = sides.map((m) => m.summary).find((s) => !fitSucceeded(s));
  if (failed) return `the fit of ${failed.file} failed (${failed.status}): ${failed.message}`;
  const refused = sides.find((m) => setupRefusal(m.setupChecks));
  if (refused) return `a setup check refused ${refused.summary.file}: ${setupRefusal(refused.setupChecks)!.message}`;
  const decay = sides.map((m) => m.summary).find((s) => s.tau);
  const ring = sides.map((m) => m.summary).find((s) => !s.tau);
  if (decay && ring) {
    return (
      `${decay.file} holds a single decay (first-order, tau ${formatWithUncertainty(decay.tau!)}) and ${ring.file} a second-order response: ` +
      'no quantity is common to both, so no change can be judged (a single decay may also be a ring its noise hides)'
    );
  }
  return null;
}

function rateChanges(a: FitSummary, b: FitSummary): QuantityChange[] {
  return [
    change('alpha', a.alpha, b.alpha),
    change('omega0', a.omega0, b.omega0),
    change('f0', hertz(a.omega0), hertz(b.omega0)),
    change('zeta', a.zeta, b.zeta),
    change('Q', a.Q, b.Q),
  ];
}

/** R, L, C of each capture from its own fit and the known part taken as exact. */
function componentChanges(a: FitSummary, b: FitSummary, knownPart: KnownPartRequest): QuantityChange[] {
  const exact = { ...knownPart.known, tolerance: 0 };
  const partsOf = (s: FitSummary) => componentsFromResponse(s.alpha, s.omega0, knownPart.topology, exact, alphaOmega0Correlation(s.correlation));
  const pa = partsOf(a);
  const pb = partsOf(b);
  return (['R', 'L', 'C'] as const).filter((name) => name !== knownPart.known.name).map((name) => change(name, pa[name], pb[name]));
}

function change(name: string, before: Quantity, after: Quantity): QuantityChange {
  const u = before.stderr === null || after.stderr === null ? null : Math.hypot(before.stderr, after.stderr);
  const delta = after.value - before.value;
  const sigmas = u === null || !(u > 0) ? null : Math.abs(delta) / u;
  return {
    name,
    before,
    after,
    difference: quantity(delta, u, before.unit),
    relative: before.value === 0 ? null : delta / Math.abs(before.value),
    sigmas,
    significant: sigmas === null ? null : sigmas > COVERAGE_FACTOR,
  };
}

/** d^T (S_a + S_b)^-1 d for d = the change in (alpha, omega0); null without both uncertainties. */
function jointChiSquare(a: FitSummary, b: FitSummary): number | null {
  const cov = (s: FitSummary) => {
    if (s.alpha.stderr === null || s.omega0.stderr === null) return null;
    const rho = alphaOmega0Correlation(s.correlation);
    const c = rho * s.alpha.stderr * s.omega0.stderr;
    return [s.alpha.stderr ** 2, c, s.omega0.stderr ** 2];
  };
  const ca = cov(a);
  const cb = cov(b);
  if (!ca || !cb) return null;
  const [saa, sao, soo] = [ca[0] + cb[0], ca[1] + cb[1], ca[2] + cb[2]];
  const det = saa * soo - sao * sao;
  if (!(det > 0)) return null;
  const da = b.alpha.value - a.alpha.value;
  const dw = b.omega0.value - a.omega0.value;
  return (soo * da * da - 2 * sao * da * dw + saa * dw * dw) / det;
}

/** Two single decays: tau changed when it moved beyond the coverage factor times its combined standard uncertainty. */
function judgeDecay(tau: QuantityChange): { verdict: ChangeVerdict; reason: string } {
  if (tau.sigmas === null) return { verdict: 'undetermined', reason: 'an uncertainty of tau could not be estimated, so no change can be judged' };
  const against = `${tau.sigmas.toFixed(1)} σ ${tau.significant ? '>' : '<='} ${COVERAGE_FACTOR}`;
  return tau.significant
    ? { verdict: 'changed', reason: `tau moved beyond chance (${against})` }
    : { verdict: 'no significant change', reason: `the change in tau is within what the noise explains (${against})` };
}

function judge(joint: number | null, quantities: readonly QuantityChange[]): { verdict: ChangeVerdict; reason: string } {
  if (joint === null) return { verdict: 'undetermined', reason: 'an uncertainty of alpha or omega0 could not be estimated, so no change can be judged' };
  const moved = quantities.filter((q) => q.significant).map((q) => q.name);
  if (joint > JOINT_LIMIT_95) {
    return { verdict: 'changed', reason: `alpha and omega0 moved jointly beyond chance (chi-square ${joint.toPrecision(3)} > ${JOINT_LIMIT_95.toPrecision(3)})${moved.length ? `: ${moved.join(', ')} changed` : ''}` };
  }
  return { verdict: 'no significant change', reason: `the change in alpha and omega0 is within what the noise explains (chi-square ${joint.toPrecision(3)} <= ${JOINT_LIMIT_95.toPrecision(3)})` };
}
