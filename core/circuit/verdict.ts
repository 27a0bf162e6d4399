// A built board against its design: each response quantity in or out of tolerance, the waveform
// difference, and the single component change that best explains what moved.
import { quantity, type Quantity } from '../quantity';
import { evaluateResponse } from '../response/secondOrder';
import { componentsFromResponse } from './components';
import type { Design } from './design';
import { CircuitInputError } from './errors';
import { predictResponse } from './predict';
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
import { alphaOmega0Correlation } from '../fit/correlation';

/** The parts of a response fit the verdict reads (a ResponseFit has them all). */
export interface FittedResponse {
  alpha: Quantity;
  omega0: Quantity;
  zeta: Quantity;
  Q: Quantity;
  /** Event time; the prediction is placed there. Default 0. */
  t0?: Quantity;
  /** Fit window; the RMS difference is taken over it. Default: the whole record. */
  window?: { start: number; end: number };
  correlation?: { names: string[]; matrix: number[][] } | null;
}

export interface CheckOptions {
  /** Component taken from the design to derive the other two from the fit; null for none. Default: the tightest tolerance. */
  knownComponent?: ComponentName | null;
  /** A quantity is in tolerance when its margin is at most this many sigma. Default 2. */
  marginLimit?: number;
}

export interface VerdictQuantity {
  name: string;
  design: Quantity;
  measured: Quantity;
  /** |measured - design| / sqrt(u_measured^2 + u_design^2). */
  marginSigma: number;
  inTolerance: boolean;
}

export interface LikelyCause {
  component: ComponentName;
  /** Relative change from the design value (0.1 = 10 % higher). */
  change: number;
  /** The value the change implies, SI base units (stderr null: a diagnostic, not a measurement). */
  impliedValue: Quantity;
  /** Fraction of the squared log deviation of (alpha, omega0) this change accounts for, 0 to 1. */
  explains: number;
}

export interface Verdict {
  pass: boolean;
  quantities: VerdictQuantity[];
  /** RMS of measured minus predicted over the fit window, unit of the probe; null when the window holds no samples. */
  rmsDifference: number | null;
  likelyCause: LikelyCause | null;
  /** d ln(alpha) / d ln(X) and d ln(omega0) / d ln(X) for X in R, L, C. */
  sensitivities: Record<'alpha' | 'omega0', Record<ComponentName, number>>;
  notes: string[];
}

const DEFAULT_MARGIN = 2;
/** Preference among equal tolerances when choosing the known component: capacitors are usually the best known. */
const KNOWN_PREFERENCE: ComponentName[] = ['C', 'L', 'R'];

/**
 * Rule: a quantity is in tolerance when |measured - design| <= 2 sqrt(u_measured^2 + u_design^2),
 * u_design propagated to first order from the component tolerances read as rectangular half-widths
 * (u = tol / sqrt(3), GUM 4.3.7). With a precise fit, a value at the edge of a worst-case tolerance
 * sits at sqrt(3) = 1.73 sigma, so the rule accepts up to about 1.15 times the tolerance half-width.
 * The board passes when every quantity is in tolerance.
 */
export function checkDesign(
  design: Design,
  fit: FittedResponse,
  measured: { time: ArrayLike<number>; values: ArrayLike<number> },
  options: CheckOptions = {},
): Verdict {
  const limit = options.marginLimit ?? DEFAULT_MARGIN;
  if (!(limit > 0)) throw new CircuitInputError('options.marginLimit', `must be a positive number of sigma, got ${limit}`);
  if (measured.time.length !== measured.values.length) {
    throw new CircuitInputError('measured.values', `length ${measured.values.length} differs from the time axis (${measured.time.length})`);
  }
  const notes: string[] = [
    `In tolerance: within ${limit} sigma of the design, the design uncertainty from the tolerances as rectangular half-widths (GUM 4.3.7).`,
  ];
  const relations = responseRelations(design.topology);
  const values = { R: design.components.R.value, L: design.components.L.value, C: design.components.C.value };
  const relU = {} as Record<ComponentName, number>;
  for (const name of COMPONENT_NAMES) relU[name] = toleranceToRelativeUncertainty(design.components[name].tolerance);

  const quantities: VerdictQuantity[] = [];
  for (const name of ['alpha', 'omega0', 'zeta', 'Q'] as ResponseQuantityName[]) {
    const v = evaluatePowerLaw(relations[name], values);
    const designQ = quantity(v, Math.abs(v) * powerLawRelativeUncertainty(relations[name], relU), RESPONSE_UNITS[name]);
    quantities.push(compare(name, designQ, fit[name], limit));
  }
  if (fit.alpha.stderr === null || fit.omega0.stderr === null) notes.push('Some fitted uncertainties are unknown: the margins use the design tolerance alone.');

  const physical = fit.alpha.value > 0 && fit.omega0.value > 0;
  const known = options.knownComponent === undefined ? tightestComponent(design) : options.knownComponent;
  if (known !== null && physical) {
    const spec = design.components[known];
    const derived = componentsFromResponse(fit.alpha, fit.omega0, design.topology, { name: known, value: spec.value, tolerance: spec.tolerance }, alphaOmega0Correlation(fit.correlation));
    for (const name of COMPONENT_NAMES.filter((n) => n !== known)) {
      const designQ = quantity(values[name], values[name] * relU[name], COMPONENT_UNITS[name]);
      quantities.push(compare(name, designQ, derived[name], limit));
    }
    notes.push(`R, L, C from the fit take ${known} at its design value (${known} has the tightest tolerance unless chosen).`);
  }
  if (!physical) notes.push('The fitted alpha or omega0 is not positive: no components or likely cause can be derived.');

  const sensitivities = {
    alpha: { ...relations.alpha.exponents },
    omega0: { ...relations.omega0.exponents },
  };
  const deviated = quantities.slice(0, 2).some((q) => !q.inTolerance);
  let likelyCause: LikelyCause | null = null;
  if (physical && deviated) {
    likelyCause = explainDeviation(quantities[0], quantities[1], sensitivities, values);
    if (likelyCause.explains < 0.8) notes.push('No single component explains the deviation well: more than one part may have moved, or the topology differs.');
  }

  return {
    pass: quantities.every((q) => q.inTolerance),
    quantities,
    rmsDifference: rmsDifference(design, fit, measured),
    likelyCause,
    sensitivities,
    notes,
  };
}

function compare(name: string, design: Quantity, measured: Quantity, limit: number): VerdictQuantity {
  const diff = Math.abs(measured.value - design.value);
  const sigma = Math.hypot(measured.stderr ?? 0, design.stderr ?? 0);
  const marginSigma = sigma > 0 ? diff / sigma : diff === 0 ? 0 : Infinity;
  return { name, design, measured, marginSigma, inTolerance: marginSigma <= limit };
}

function tightestComponent(design: Design): ComponentName {
  return KNOWN_PREFERENCE.reduce((best, name) =>
    design.components[name].tolerance < design.components[best].tolerance ? name : best,
  );
}


/**
 * The single component change delta = ln(X_new / X_design) minimising |d - delta s_X|^2 in log space,
 * d = (ln alpha_fit / alpha_design, ln omega0_fit / omega0_design), s_X the sensitivities. Unweighted:
 * a weighted norm would let the far more precise omega0 make any candidate "explain" nearly all.
 */
function explainDeviation(
  alpha: VerdictQuantity,
  omega0: VerdictQuantity,
  s: Verdict['sensitivities'],
  values: Record<ComponentName, number>,
): LikelyCause {
  const da = Math.log(alpha.measured.value / alpha.design.value);
  const dw = Math.log(omega0.measured.value / omega0.design.value);
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
