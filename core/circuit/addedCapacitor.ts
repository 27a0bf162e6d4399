// Parasitic loop L, C and R by the added-capacitor method: known capacitors in parallel with the
// node lower the natural frequency, and 1 / (2 pi f)^2 = L_p (C_p + C_added) is a straight line.
import { quantity, type Quantity } from '../quantity';
import { formatEngineering, formatMeasured } from '../units/format';
import { chiSquareLimit99 } from './chiSquareLimit';
import { CircuitInputError } from './errors';
import { checkRingCapture, type RingCaptureSetup } from './measurementChecks';
import { toleranceToRelativeUncertainty } from './tolerance';

export interface AddedCapacitorMeasurement {
  /** Capacitance added in parallel with the node, F (0 for the bare loop). */
  addedC: number;
  /** Relative tolerance of the added part (rectangular, GUM 4.3.7). Default 0. */
  addedCTolerance?: number;
  /** This part's own value at the operating voltage over its nominal value; replaces options.dcBias for it. */
  derating?: CapacitorDerating;
  /**
   * Undamped natural frequency f0 = omega0 / (2 pi) from the fit, Hz. Not the ring (damped)
   * frequency: f = 1 / (2 pi sqrt(L C)) holds for omega0 only, and f_d = sqrt(f0^2 - (alpha / 2 pi)^2)
   * would read low by an amount that changes from capture to capture.
   */
  frequency: Quantity;
  /** Neper frequency alpha from the same fit, s^-1. */
  alpha: Quantity;
  /** Sample interval of this capture, s (for the samples-per-period check). */
  sampleInterval?: number;
  /** The capture's name in messages (a file name). Default 'capture N'. */
  label?: string;
}

export interface AddedCapacitorOptions {
  /** Probe capacitance in parallel with the node in every capture, F. Default 0. */
  probeC?: number;
  /** Relative tolerance of probeC (rectangular). Default 0. */
  probeCTolerance?: number;
  /** Scope or probe bandwidth, Hz, for the bandwidth check. Default: no check. */
  bandwidth?: number;
  /** Sample interval used for every capture without its own, s. Default: no check. */
  sampleInterval?: number;
  /**
   * One DC-bias factor for every added capacitor without its own derating (class-II ceramics of one kind): its
   * error moves all of them together, so it is propagated as one shared error. Default: none (factor 1).
   */
  dcBias?: CapacitorDerating;
  /** The switch's output capacitance at the operating voltage (small-signal), F, with its relative tolerance. */
  switchC?: { value: number; tolerance?: number };
}

/** A capacitor's value at the operating voltage as a fraction of its nominal value. */
export interface CapacitorDerating {
  /** C at the operating voltage / C nominal, in (0, 1]. */
  factor: number;
  /** Relative tolerance of the factor (rectangular half-width, as the part tolerances). Default 0. */
  tolerance?: number;
}

/** One capture on the line 1 / (2 pi f0)^2 = L_p (C_p + C_probe + C_effective). */
export interface LinePoint {
  /** The added capacitance at the operating voltage (nominal x factor), with the part's and the factor's uncertainty. */
  effectiveC: Quantity;
  /** The factor applied to the nominal value, and where it came from. */
  factor: number;
  factorSource: 'none' | 'derating' | 'dc-bias';
  /** y_i - (L_p x_i + L_p C_p), s^2. */
  residual: number;
  /** The residual over the point's own standard uncertainty sqrt(u(y)^2 + (L_p u(x))^2); null without frequency uncertainties. */
  residualSigmas: number | null;
}

/** C_p split into the switch's output capacitance as entered and the rest of the node. */
export interface SwitchCapacitanceSplit {
  /** As entered, at the operating voltage. */
  switchC: Quantity;
  /** C_p - switchC: layout, diode, heat-sink and other capacitance at the node; null when switchC exceeds C_p clearly. */
  rest: Quantity | null;
}

export interface ParasiticExtraction {
  /** Loop inductance L_p. */
  L: Quantity;
  /** Node capacitance C_p, probe capacitance removed. */
  C: Quantity;
  /** Loop resistance R_p = 2 alpha L_p (series-loop assumption), alpha of the bare loop. */
  R: Quantity;
  /** sqrt(L_p / C_p). */
  characteristicImpedance: Quantity;
  /**
   * Residual of the straight-line fit, null with two captures (the line is exact). chiSquare is
   * weighted by the frequency uncertainties, or by unit relative weights when some are missing.
   */
  residual: { chiSquare: number; dof: number } | null;
  /** Each capture's point on the line, in the order given. */
  points: LinePoint[];
  /** With options.switchC: C_p split into the switch and the rest; else null. */
  switchSplit: SwitchCapacitanceSplit | null;
  warnings: string[];
  /** How the values were obtained (the assumptions behind R_p). */
  notes: string[];
}

/** A frequency ratio squared below this leaves C_p poorly determined (derived: 20 % in C). */
const MIN_CAPACITANCE_RATIO = 1.2;
/**
 * The added capacitance must lower f0 by more than this many combined standard uncertainties: a smaller
 * drop may be noise, and C_p = C_add / ((f1 / f2)^2 - 1) is then undetermined (its relative uncertainty
 * passes 1/3, where the first-order propagation no longer holds).
 */
const SEPARATION_SIGMAS = 3;
/** The switch's capacitance may exceed C_p by this many combined standard uncertainties before the rest is withheld. */
const SWITCH_EXCESS_SIGMAS = 2;

/**
 * L_p and C_p by weighted least squares of y_i = 1 / (2 pi f_i)^2 against x_i = C_added,i + C_probe, where
 * C_added,i is the part's value at the operating voltage (nominal x its derating, or the DC-bias factor):
 * y = L_p x + L_p C_p. With two captures this is the closed form C_p = C_add / ((f1 / f2)^2 - 1),
 * L_p = 1 / ((2 pi f1)^2 C_p). Uncertainty is first order from the frequencies (weights 1 / u(y)^2;
 * scaled by the Birge ratio sqrt(chi^2 / dof) when that exceeds 1, so an inconsistent set does not
 * claim more precision than it shows), the added-part tolerances and the probe tolerance.
 */
export function extractParasitics(
  measurements: readonly AddedCapacitorMeasurement[],
  options: AddedCapacitorOptions = {},
): ParasiticExtraction {
  const probeC = options.probeC ?? 0;
  const probeTolerance = options.probeCTolerance ?? 0;
  validate(measurements, options, probeC, probeTolerance);
  const factors = measurements.map((m) => appliedFactor(m, options.dcBias));
  // From here on every added capacitance is its value at the operating voltage.
  const effective = measurements.map((m, i) => ({ ...m, addedC: m.addedC * factors[i].factor }));
  checkSeparation(effective);
  const warnings: string[] = [];
  const n = effective.length;
  const x = effective.map((m) => m.addedC + probeC);
  const y = measurements.map((m) => 1 / (2 * Math.PI * m.frequency.value) ** 2);
  const weighted = measurements.every((m) => m.frequency.stderr !== null && m.frequency.stderr > 0);
  // u(y) / y = 2 u(f) / f; without stated uncertainties every capture gets the same relative weight.
  const w = measurements.map((m, i) =>
    weighted ? 1 / (2 * y[i] * (m.frequency.stderr as number) / m.frequency.value) ** 2 : 1 / y[i] ** 2,
  );

  const line = fitLine(x, y, w);
  const { slope, intercept, residuals } = line;
  if (!(slope > 0)) {
    throw new CircuitInputError('measurements', 'the natural frequency does not fall as capacitance is added; check the captures and the added values');
  }
  const capacitance = intercept / slope;
  if (!(capacitance > 0)) {
    throw new CircuitInputError(
      'measurements',
      `the fitted node capacitance is not positive (${formatEngineering(capacitance, 'F')}); is probeC larger than the node's own capacitance?`,
    );
  }

  const dof = n - 2;
  const chiSquare = residuals.reduce((sum, r, i) => sum + w[i] * r * r, 0);
  const residual = dof > 0 ? { chiSquare, dof } : null;
  const scale = frequencyScale(weighted, chiSquare, dof);
  warnings.push(...scale.warnings);
  // Standard uncertainties of each x_i, F: the part's tolerance, its own derating factor's, the shared DC-bias factor's.
  const toleranceU = effective.map((m) => m.addedC * toleranceToRelativeUncertainty(m.addedCTolerance ?? 0));
  const ownFactorU = effective.map((m, i) => m.addedC * factors[i].ownRelativeU);
  const dcBiasU = effective.map((m, i) => m.addedC * factors[i].sharedRelativeU);
  // Parts' own deratings may err independently or together (parts of one kind read off one curve): both are
  // propagated and each result takes the larger.
  const covariances = [
    lineCovariance(line, x, w, toleranceU.map((u, i) => u * u + ownFactorU[i] ** 2), [dcBiasU], probeC, probeTolerance, scale.value),
    lineCovariance(line, x, w, toleranceU.map((u) => u * u), [dcBiasU, ownFactorU], probeC, probeTolerance, scale.value),
  ];
  const propagate = (g: [number, number]): number | null => {
    const spread = (cov: number[][] | null) => (cov === null ? null : Math.sqrt(Math.max(0, g[0] * g[0] * cov[0][0] + 2 * g[0] * g[1] * cov[0][1] + g[1] * g[1] * cov[1][1])));
    const [independent, together] = covariances.map(spread);
    return independent === null || together === null ? null : Math.max(independent, together);
  };
  const L = quantity(slope, propagate([1, 0]), 'H');
  const C = quantity(capacitance, steeperSide(propagate([-intercept / slope ** 2, 1 / slope]), line, scale.value), 'F');
  const z0 = slope / Math.sqrt(intercept);
  const Z0 = quantity(z0, propagate([1 / Math.sqrt(intercept), -z0 / (2 * intercept)]), 'ohm');

  const bare = bareIndex(effective);
  const alpha = effective[bare].alpha;
  const rValue = 2 * alpha.value * slope;
  const rRel =
    alpha.stderr === null || L.stderr === null ? null : Math.hypot(alpha.stderr / alpha.value, L.stderr / L.value);
  const R = quantity(rValue, rRel === null ? null : rValue * rRel, 'ohm');

  warnings.push(...checkSpread(x, capacitance), ...checkDamping(effective, bare), ...checkCaptures(effective, options));
  const notes = [
    'R_p = 2 alpha L_p assumes a series loop (alpha = R / (2 L)), with alpha from the capture with the least added capacitance.',
  ];
  if (factors.some((f) => f.source !== 'none')) {
    notes.push(
      'each added capacitance is taken at the operating voltage (nominal x its derating or the DC-bias factor), and the line is fitted to those values; ' +
        'the DC-bias factor\'s error is shared by its parts, and the parts\' own deratings are taken as erring independently or together, whichever gives the larger uncertainty.',
    );
  }
  const points = effective.map((m, i): LinePoint => {
    const u = Math.hypot(toleranceU[i], ownFactorU[i], dcBiasU[i], probeC * toleranceToRelativeUncertainty(probeTolerance));
    const uy = weighted ? 1 / Math.sqrt(w[i]) : null;
    return {
      effectiveC: quantity(m.addedC, u, 'F'),
      factor: factors[i].factor,
      factorSource: factors[i].source,
      residual: residuals[i],
      residualSigmas: uy === null ? null : residuals[i] / Math.hypot(uy, slope * u),
    };
  });
  const switchSplit = options.switchC ? splitSwitch(C, options.switchC, warnings, notes) : null;
  return { L, C, R, characteristicImpedance: Z0, residual, points, switchSplit, warnings, notes };
}

interface AppliedFactor {
  factor: number;
  source: LinePoint['factorSource'];
  /** Relative standard uncertainty of the part's own derating factor (0 without one). */
  ownRelativeU: number;
  /** Relative standard uncertainty of the shared DC-bias factor when it applies (else 0). */
  sharedRelativeU: number;
}

/** The bare loop has nothing to derate; a part's own derating replaces the DC-bias factor. */
function appliedFactor(m: AddedCapacitorMeasurement, dcBias: CapacitorDerating | undefined): AppliedFactor {
  const none: AppliedFactor = { factor: 1, source: 'none', ownRelativeU: 0, sharedRelativeU: 0 };
  if (m.addedC === 0) return none;
  if (m.derating) return { ...none, factor: m.derating.factor, source: 'derating', ownRelativeU: toleranceToRelativeUncertainty(m.derating.tolerance ?? 0) };
  if (dcBias) return { ...none, factor: dcBias.factor, source: 'dc-bias', sharedRelativeU: toleranceToRelativeUncertainty(dcBias.tolerance ?? 0) };
  return none;
}

/**
 * C_p - C_switch with their uncertainties added in quadrature (C_p's includes the frequencies; the switch value's
 * tolerance is its own). A switch value clearly above C_p cannot be the small-signal value at the ring's voltage.
 */
function splitSwitch(C: Quantity, given: { value: number; tolerance?: number }, warnings: string[], notes: string[]): SwitchCapacitanceSplit {
  const switchC = quantity(given.value, given.value * toleranceToRelativeUncertainty(given.tolerance ?? 0), 'F');
  const u = C.stderr === null ? null : Math.hypot(C.stderr, switchC.stderr ?? 0);
  const excess = switchC.value - C.value;
  notes.push(
    'the switch output capacitance is the small-signal value at the operating voltage, the one the ring sees; the charge- and energy-equivalent ' +
      'values (Co(tr), Co(er): equal charge or energy from 0 V to that voltage) average C over the whole swing and are larger where C falls ' +
      'with voltage (derived from their definitions; the datasheet terms are common practice), so they do not belong here.',
  );
  if (u === null ? excess > 0 : excess > SWITCH_EXCESS_SIGMAS * u) {
    warnings.push(
      `the switch output capacitance entered (${formatEngineering(switchC.value, 'F')}) exceeds the node capacitance C_p (${formatMeasured(C)}) ` +
        'beyond their uncertainties, so the rest of the node is not given: is it a charge- or energy-equivalent value, or one at a lower voltage?',
    );
    return { switchC, rest: null };
  }
  return { switchC, rest: quantity(-excess, u, 'F') };
}

interface LineFit {
  slope: number;
  intercept: number;
  /** Inverse of the normal matrix A = sum w_i (x_i, 1)(x_i, 1)^T. */
  inverse: number[][];
  residuals: number[];
}

function fitLine(x: number[], y: number[], w: number[]): LineFit {
  let sw = 0, sx = 0, sxx = 0, sy = 0, sxy = 0;
  for (let i = 0; i < x.length; i++) {
    sw += w[i];
    sx += w[i] * x[i];
    sxx += w[i] * x[i] * x[i];
    sy += w[i] * y[i];
    sxy += w[i] * x[i] * y[i];
  }
  const det = sxx * sw - sx * sx;
  const inverse = [
    [sw / det, -sx / det],
    [-sx / det, sxx / det],
  ];
  const slope = inverse[0][0] * sxy + inverse[0][1] * sy;
  const intercept = inverse[1][0] * sxy + inverse[1][1] * sy;
  const residuals = x.map((xi, i) => y[i] - slope * xi - intercept);
  return { slope, intercept, inverse, residuals };
}

/**
 * Factor on the line fit's own covariance A^-1 for the frequency part: 1 with stated uncertainties
 * (the Birge ratio squared chi^2 / dof when above 1), the residual variance without them, null when
 * two captures without uncertainties leave nothing to estimate it from.
 */
function frequencyScale(weighted: boolean, chiSquare: number, dof: number): { value: number | null; warnings: string[] } {
  if (weighted) {
    const warnings =
      dof > 0 && chiSquare > chiSquareLimit99(dof)
        ? [
            `the captures do not agree with one L_p and C_p (chi^2 / dof = ${(chiSquare / dof).toFixed(2)}, above the 1 % limit); ` +
              'uncertainties are scaled up by sqrt(chi^2 / dof). Check the added values and that the node did not change between captures.',
          ]
        : [];
    return { value: dof > 0 ? Math.max(1, chiSquare / dof) : 1, warnings };
  }
  if (dof === 0) {
    return { value: null, warnings: ['frequency uncertainties were not all given and two captures leave no residual: L_p and C_p have no uncertainty.'] };
  }
  return {
    value: chiSquare / dof,
    warnings: ['frequency uncertainties were not all given: the frequency part of the uncertainty comes from the scatter about the line.'],
  };
}

/**
 * Covariance of (slope, intercept) to first order: the frequency part scale * A^-1, plus each x_i's own
 * variance through d(slope, intercept)/d x_i = w_i A^-1 (r_i - slope x_i, -slope), plus each group of errors
 * that move several x_i together (one standard uncertainty per x_i, F, zero where the group does not reach),
 * and the probe tolerance, which moves every x_i together. Null when the frequency part is unknown.
 */
function lineCovariance(
  line: LineFit,
  x: number[],
  w: number[],
  partVariances: readonly number[],
  sharedGroups: readonly (readonly number[])[],
  probeC: number,
  probeTolerance: number,
  scale: number | null,
): number[][] | null {
  if (scale === null) return null;
  const { inverse, slope, residuals } = line;
  const cov = inverse.map((row) => row.map((v) => v * scale));
  const addOuter = (g: [number, number], variance: number) => {
    cov[0][0] += g[0] * g[0] * variance;
    cov[0][1] += g[0] * g[1] * variance;
    cov[1][0] += g[0] * g[1] * variance;
    cov[1][1] += g[1] * g[1] * variance;
  };
  const probeGradient: [number, number] = [0, 0];
  const groupGradients = sharedGroups.map((): [number, number] => [0, 0]);
  partVariances.forEach((variance, i) => {
    const g = applyInverse(inverse, w[i] * (residuals[i] - slope * x[i]), -w[i] * slope);
    addOuter(g, variance);
    probeGradient[0] += g[0];
    probeGradient[1] += g[1];
    sharedGroups.forEach((u, k) => {
      groupGradients[k][0] += g[0] * u[i];
      groupGradients[k][1] += g[1] * u[i];
    });
  });
  for (const gradient of groupGradients) addOuter(gradient, 1);
  addOuter(probeGradient, (probeC * toleranceToRelativeUncertainty(probeTolerance)) ** 2);
  return cov;
}

/**
 * C_p = intercept / slope, and the frequencies reach the slope as the drop of f0 between captures: C_p goes as one
 * over that drop, so its first-order uncertainty understates the side where the drop read large (the draws the
 * separation check lets through near its limit). The uncertainty is taken at the slope one frequency standard
 * uncertainty lower, where 1 / slope is steeper: divided by 1 - u_f(slope) / slope. This holds C_p's interval as
 * L_p's (linear in the drop) holds near the limit, and tends to the first order as the drop grows (seeded Monte
 * Carlo in test/core/circuitAddedCapacitor.test.ts). The added parts' tolerances enter C_p linearly and need none.
 */
function steeperSide(u: number | null, line: LineFit, frequencyScale: number | null): number | null {
  if (u === null || frequencyScale === null) return u;
  const relative = Math.sqrt(frequencyScale * line.inverse[0][0]) / line.slope;
  if (!(relative < 1)) {
    throw new CircuitInputError(
      'measurements',
      'the captures cannot separate L_p and C_p: they scatter about the line 1 / (2 pi f0)^2 = L_p (C_p + C_added) by as much as the added capacitance moves it; check the added values and that the node did not change between captures',
    );
  }
  return u / (1 - relative);
}

function applyInverse(inverse: number[][], a: number, b: number): [number, number] {
  return [inverse[0][0] * a + inverse[0][1] * b, inverse[1][0] * a + inverse[1][1] * b];
}

/** The capture with the least added capacitance: its damping is the loop's own. */
function bareIndex(measurements: readonly AddedCapacitorMeasurement[]): number {
  let best = 0;
  measurements.forEach((m, i) => {
    if (m.addedC < measurements[best].addedC) best = i;
  });
  return best;
}

/**
 * Refuses captures whose f0 rises with added capacitance beyond their uncertainty (the order or the values
 * are mixed up), and a set whose least- and most-loaded captures are not SEPARATION_SIGMAS apart (the same
 * capture twice, or a part too small to move the ring): either would print an L_p and C_p with no meaning.
 */
function checkSeparation(measurements: readonly AddedCapacitorMeasurement[]): void {
  const named = measurements.map((m, i) => ({ ...m, name: m.label ?? `capture ${i + 1}` }));
  const describe = (m: (typeof named)[number]) => `${m.name} (added ${formatEngineering(m.addedC, 'F')}, f0 ${formatMeasured(m.frequency)})`;
  const combined = (a: AddedCapacitorMeasurement, b: AddedCapacitorMeasurement) => Math.hypot(a.frequency.stderr ?? 0, b.frequency.stderr ?? 0);
  const fallsClearly = (less: AddedCapacitorMeasurement, more: AddedCapacitorMeasurement) =>
    less.frequency.value - more.frequency.value > SEPARATION_SIGMAS * combined(less, more);
  for (const less of named) {
    for (const more of named) {
      if (more.addedC <= less.addedC) continue;
      const u = combined(less, more);
      const rise = more.frequency.value - less.frequency.value;
      if (rise > SEPARATION_SIGMAS * u || (u === 0 && rise >= 0)) {
        throw new CircuitInputError(
          'measurements',
          `the natural frequency does not fall as capacitance is added: ${describe(more)} rings above ${describe(less)}; check the order of the captures and the added values`,
        );
      }
    }
  }
  const least = named.reduce((a, b) => (b.addedC < a.addedC ? b : a));
  const most = named.reduce((a, b) => (b.addedC > a.addedC ? b : a));
  if (!fallsClearly(least, most)) {
    throw new CircuitInputError(
      'measurements',
      `the captures cannot separate L_p and C_p: ${describe(least)} and ${describe(most)} differ by less than ${SEPARATION_SIGMAS} combined ` +
        'standard uncertainties of f0; the added capacitor must lower f0 clearly (is the same capture given twice?)',
    );
  }
}

function checkSpread(x: number[], capacitance: number): string[] {
  const ratio = (capacitance + Math.max(...x)) / (capacitance + Math.min(...x));
  if (ratio >= MIN_CAPACITANCE_RATIO) return [];
  return [
    `the added capacitance moved the natural frequency by only ${((1 - 1 / Math.sqrt(ratio)) * 100).toFixed(1)} %, so C_p is poorly ` +
      'determined; adding about 3 C_p halves the frequency (derived), a usual working choice (common practice).',
  ];
}

/** Series-loop assumption: alpha = R / (2 L) does not depend on C, so the captures should share alpha. */
function checkDamping(measurements: readonly AddedCapacitorMeasurement[], bare: number): string[] {
  const ref = measurements[bare].alpha;
  const moved = measurements.some((m, i) => {
    if (i === bare) return false;
    const diff = Math.abs(m.alpha.value - ref.value);
    const sigma = ref.stderr !== null && m.alpha.stderr !== null ? Math.hypot(ref.stderr, m.alpha.stderr) : 0;
    return diff > 3 * sigma && diff > 0.1 * ref.value;
  });
  if (!moved) return [];
  return [
    'alpha changes by more than 10 % (and 3 sigma) between captures: the added part brings its own loss (ESR) or the damping ' +
      'is not a series resistance, so R_p is only indicative.',
  ];
}

function checkCaptures(measurements: readonly AddedCapacitorMeasurement[], options: AddedCapacitorOptions): string[] {
  return measurements.flatMap((m, i) => {
    const setup: RingCaptureSetup = { bandwidth: options.bandwidth, sampleInterval: m.sampleInterval ?? options.sampleInterval };
    return checkRingCapture(m.frequency.value, setup, `${m.label ?? `capture ${i + 1}`}:`);
  });
}

function validate(
  measurements: readonly AddedCapacitorMeasurement[],
  options: AddedCapacitorOptions,
  probeC: number,
  probeTolerance: number,
): void {
  if (!Array.isArray(measurements) || measurements.length < 2) {
    throw new CircuitInputError('measurements', 'need at least two captures (the bare loop and one with a capacitor added)');
  }
  measurements.forEach((m, i) => {
    const at = `measurements[${i}]`;
    if (!Number.isFinite(m.addedC) || m.addedC < 0) throw new CircuitInputError(`${at}.addedC`, `must be a finite capacitance >= 0 F, got ${m.addedC}`);
    checkTolerance(`${at}.addedCTolerance`, m.addedCTolerance);
    if (m.derating) checkDerating(`${at}.derating`, m.derating);
    if (!Number.isFinite(m.frequency?.value) || m.frequency.value <= 0) {
      throw new CircuitInputError(`${at}.frequency`, `must be a positive natural frequency in Hz, got ${m.frequency?.value}`);
    }
    if (!Number.isFinite(m.alpha?.value) || m.alpha.value <= 0) {
      throw new CircuitInputError(`${at}.alpha`, `must be a positive neper frequency in s^-1 (a decaying ring), got ${m.alpha?.value}`);
    }
    if (m.sampleInterval !== undefined && !(m.sampleInterval > 0)) {
      throw new CircuitInputError(`${at}.sampleInterval`, `must be a positive time in s, got ${m.sampleInterval}`);
    }
  });
  if (new Set(measurements.map((m) => m.addedC)).size < 2) {
    throw new CircuitInputError('measurements', 'need at least two different added capacitances');
  }
  if (!Number.isFinite(probeC) || probeC < 0) throw new CircuitInputError('options.probeC', `must be a finite capacitance >= 0 F, got ${probeC}`);
  checkTolerance('options.probeCTolerance', probeTolerance);
  if (options.dcBias) checkDerating('options.dcBias', options.dcBias);
  if (options.switchC) {
    if (!Number.isFinite(options.switchC.value) || !(options.switchC.value > 0)) {
      throw new CircuitInputError('options.switchC', `must be a positive capacitance in F, got ${options.switchC.value}`);
    }
    checkTolerance('options.switchC.tolerance', options.switchC.tolerance);
  }
  if (options.bandwidth !== undefined && !(options.bandwidth > 0)) {
    throw new CircuitInputError('options.bandwidth', `must be a positive frequency in Hz, got ${options.bandwidth}`);
  }
  if (options.sampleInterval !== undefined && !(options.sampleInterval > 0)) {
    throw new CircuitInputError('options.sampleInterval', `must be a positive time in s, got ${options.sampleInterval}`);
  }
}

function checkDerating(field: string, derating: CapacitorDerating): void {
  if (!Number.isFinite(derating.factor) || !(derating.factor > 0) || derating.factor > 1) {
    throw new CircuitInputError(`${field}.factor`, `must be a fraction in (0, 1] (the value at the operating voltage over the nominal one), got ${derating.factor}`);
  }
  checkTolerance(`${field}.tolerance`, derating.tolerance);
}

function checkTolerance(field: string, tolerance: number | undefined): void {
  if (tolerance !== undefined && (!Number.isFinite(tolerance) || tolerance < 0 || tolerance >= 1)) {
    throw new CircuitInputError(field, `must be a relative tolerance in [0, 1), got ${tolerance}`);
  }
}
