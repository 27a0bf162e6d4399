// How many ringing modes (and whether a slow term) the record holds: each candidate fitted to its minimum, then compared.
//
// The criterion is the Bayesian information criterion over the effective number of samples, the one the fit
// already ranks its layouts and the single decay by (modelSelection.ts): with thousands of samples AICc is
// AIC, whose penalty of 2 per parameter lets noise buy a spurious mode far more often than BIC's ln n
// (about 7 at a thousand samples); a false mode with a tight error bar is the outcome to avoid. A richer
// model must also pass an F-test of its residual drop (significance.ts) with the search over the extra
// mode's frequency counted (Bonferroni over the independent frequencies, as explainRecord counts the search
// for a response), and richer models are only tried when the one ring's residuals show structure (the gate).

import { FitInputError } from './fitInputError';
import { LAYOUTS, layoutValues } from './responseModel';
import { attemptT0, attemptValue, type Attempt } from './attempt';
import type { FitSet } from './fitSet';
import type { ModelOrder, ModelOrderRow, ResponseFitOptions } from './responseFit';
import { information } from './modelSelection';
import { nestedFTestTail } from './significance';
import { pValueText } from '../chiSquare';
import { modeSpec, NO_PRE_EVENT, parameterCount, solveModes, startConstraintOf, ModesWorkspace, type ModeRates, type ModeSpec } from './modesModel';
import { refineModes, type ModesFit } from './modesFit';
import { GRID_NYQUIST_SHARE, gridNyquist, residualAfter, ringStarts, slowStarts, type RingStart } from './modesStarts';
import { modelName, multiModeModel, ORDER_CRITERION, termAmplitudes, type MultiModeModel } from './modesResult';

/** Most ringing modes fitted (the pencil's closed-form eigenvalues reach three poles; three rings is already rare). */
export const MAX_MODES = 3;
/**
 * Level of the F-test (after the search correction) a richer model must pass: ten times stricter than the fit's
 * level for a ring over a decay, because the lag-one count of independent samples only partly allows for the
 * correlated residuals of a small model mismatch: a measured one-ring capture reached p = 4e-4 for a slow term
 * that moved the ring's omega_d by 3.7 standard errors from the one-ring fit (a judgment of ours).
 */
const SIGNIFICANCE_LEVEL = 1e-4;
/**
 * The gate: richer models are fitted only when one more term, at a pencil pole of the residual, explains
 * more than this many residual variances (noise alone: the best of a few dozen poles explains about 2 ln(count),
 * under 10), or when the residual variance is clearly above the noise (GATE_EXCESS). A judgment of ours.
 */
const GATE_VARIANCES = 25;
const GATE_EXCESS = 2;
/** Starts of each richer model refined to their minimum, the best by their residual after the linear solve. */
const REFINED_STARTS = 2;
/** Every term of an accepted richer model has an amplitude at least this many standard errors from zero. */
const SUPPORTED_SIGMAS = 3;
/** Fewest independent residuals the tests count beyond the parameters (as modelSelection.ts). */
const MIN_RESIDUAL_DOF = 10;

export interface ModeOrderOutcome {
  order: ModelOrder;
  /** The model with several rings or a slow term, chosen or forced; null when the one ring stands. */
  chosen: ModesFit | null;
}

interface Candidate {
  spec: ModeSpec;
  sse: number;
  parameters: number;
  fit: ModesFit | null;
}

/**
 * The number of ringing modes of a fitted ring (fitModeOrder), and the model with several when it was chosen or
 * forced, with its covariance: what the result's assembly takes (assembleFit's ModelChoice).
 */
export function ringModes(set: FitSet, best: Attempt, t0Start: number, noise: number, options: ResponseFitOptions): { modeOrder?: ModelOrder; multiMode?: MultiModeModel } {
  const found = fitModeOrder(set, best, t0Start, noise, options);
  if (!found) return {};
  return { modeOrder: found.order, ...(found.chosen ? { multiMode: multiModeModel(set, found.chosen) } : {}) };
}

/** Checks options.modes and options.slowTerm before anything is fitted: a bad value is the caller's error. */
export function checkModeOptions(options: ResponseFitOptions): void {
  forcedOrder(options);
}

/** Checks options.modes and options.slowTerm; the forced spec, or null when the order is to be chosen. */
function forcedOrder(options: ResponseFitOptions): { rings: number; slow: boolean } | null {
  const { modes, slowTerm } = options;
  if (modes === undefined) {
    if (slowTerm !== undefined) throw new FitInputError('slowTerm', 'is given without modes: a slow term is forced only together with the number of ringing modes');
    return null;
  }
  if (!(Number.isInteger(modes) && modes >= 1 && modes <= MAX_MODES)) throw new FitInputError('modes', `${modes} is not a whole number of ringing modes from 1 to ${MAX_MODES}`);
  return { rings: modes, slow: slowTerm ?? false };
}

/**
 * The order of a fitted ring: the one ring (best) against two and three rings and a ring on an exponential,
 * or the order forced by options. For a single decay, a ring riding on it; null when the decay stands.
 */
export function fitModeOrder(set: FitSet, best: Attempt, t0Start: number, noise: number, options: ResponseFitOptions = {}): ModeOrderOutcome | null {
  const forced = forcedOrder(options);
  const ringFitted = LAYOUTS[best.layout].order === 2;
  const base = { start: startConstraintOf(best.layout), fitsT0: LAYOUTS[best.layout].fitsT0 };
  const t0 = attemptT0(best, t0Start);
  const rate = attemptValue(best, 'alpha');
  // A single decay's fallback ring: ten times faster than the decay (the pencil's poles come first).
  const first: RingStart = ringFitted ? { alpha: rate, omega0: attemptValue(best, 'omega0') } : { alpha: rate, omega0: 10 * rate };
  const known: Known = ringFitted ? { rings: [first] } : { rings: [], slowRate: rate };
  const simple: Candidate = { spec: modeSpec(base, ringFitted ? 1 : 0, !ringFitted), sse: best.sse, parameters: best.values.length, fit: null };
  const simpleModel = layoutValues(best.layout, best.values, t0Start, set.time, set.block);
  const residual = residualAfter(set, simpleModel, t0);
  const search = new ModelSearch(set, t0, first);
  const against = `against ${modelName(simple.spec.rings, simple.spec.slow)}`;

  if (forced) {
    if (ringFitted && forced.rings === 1 && !forced.slow) return outcome([simple], simple, true, 'forced: one ringing mode', set, simpleModel);
    // Three rings are reached through two: the third starts from what two leave.
    let fit = search.fitOrder(modeSpec(base, Math.min(forced.rings, 2), forced.rings < 3 && forced.slow), known, residual);
    if (forced.rings === 3 && fit.fit) fit = search.fitOrder(modeSpec(base, forced.rings, forced.slow), { rings: fit.fit.rates.rings }, residualAfter(set, fit.model, t0));
    const rich = candidateOf(fit);
    const compared = compare(simple, rich, set, fit.model, true);
    return outcome([simple, rich], rich, true, `forced: ${modelName(forced.rings, forced.slow)} (${compared.text} ${against})`, set, fit.model);
  }

  const gate = gateOpens(set, best, residual, first, t0, noise);
  if (!ringFitted) {
    if (!gate.ring) return null;
    const fit = search.fitOrder(modeSpec(base, 1, true), known, residual);
    const rich = candidateOf(fit);
    const verdict = compare(simple, rich, set, fit.model);
    if (!verdict.accepted) return null;
    return outcome([simple, rich], rich, false, `${modelName(1, true)}: ${verdict.text} ${against}`, set, fit.model);
  }
  if (!gate.ring && !gate.slow) return outcome([simple], simple, false, `one ringing mode: the residuals hold no further ring or decay above the noise (${gate.text})`, set, simpleModel);

  const rows: Candidate[] = [simple];
  let chosen = simple;
  let chosenModel: Float64Array = simpleModel;
  let why = '';
  const consider = (simpler: Candidate, spec: ModeSpec, from: Known, rest: Float64Array) => {
    const fit = search.fitOrder(spec, from, rest);
    const rich = candidateOf(fit);
    rows.push(rich);
    const verdict = compare(simpler, rich, set, fit.model);
    return { rich, fit, verdict };
  };
  const twoRings = gate.ring ? consider(simple, modeSpec(base, 2, false), known, residual) : null;
  const ringOnSlow = gate.slow ? consider(simple, modeSpec(base, 1, true), known, residual) : null;
  const tried = [twoRings, ringOnSlow].filter((c) => c !== null);
  const winners = tried.filter((c) => c.verdict.accepted).sort((x, y) => x.verdict.richCriterion - y.verdict.richCriterion);
  if (winners.length > 0) {
    ({ rich: chosen } = winners[0]);
    chosenModel = winners[0].fit.model;
    why = `${modelName(chosen.spec.rings, chosen.spec.slow)}: ${winners[0].verdict.text} ${against}`;
  } else {
    why = `one ringing mode: ${tried.map((c) => `${modelName(c.rich.spec.rings, c.rich.spec.slow)} ${c.verdict.text}`).join('; ')}, not significant`;
  }
  if (twoRings && chosen === twoRings.rich && twoRings.fit.fit) {
    const two = twoRings.fit.fit;
    const rest = residualAfter(set, twoRings.fit.model, two.rates.t0);
    const three = consider(chosen, modeSpec(base, 3, false), { rings: two.rates.rings }, rest);
    if (three.verdict.accepted) {
      chosen = three.rich;
      chosenModel = three.fit.model;
      why = `three ringing modes: ${three.verdict.text} against two`;
    } else {
      why += `; a third ${three.verdict.text}, not significant`;
    }
  }
  return outcome(rows, chosen, false, why, set, chosenModel);
}

/** What a richer model starts from: the rings already fitted, and the slow rate of a decay already fitted. */
interface Known {
  rings: RingStart[];
  slowRate?: number;
}

function candidateOf(result: { fit: ModesFit | null; spec: ModeSpec }): Candidate {
  const fit = result.fit;
  return { spec: result.spec, sse: fit ? fit.sse : Infinity, parameters: parameterCount(result.spec), fit };
}

/** Independent samples: n (1 - rho) / (1 + rho), rho the lag-1 correlation of the residuals (as modelSelection.ts). */
function effectiveCount(set: FitSet, model: ArrayLike<number>, parameters: number): number {
  let c0 = 0;
  let c1 = 0;
  for (let i = 0; i < set.values.length; i++) {
    const r = set.values[i] - model[i];
    c0 += r * r;
    if (i > 0) c1 += r * (set.values[i - 1] - model[i - 1]);
  }
  const rho = c0 > 0 ? Math.max(0, c1 / c0) : 0;
  return Math.max((set.values.length * (1 - rho)) / (1 + rho), parameters + MIN_RESIDUAL_DOF);
}

/**
 * Why a richer model's rings are not distinct ringing modes, or null when they are: each must ring (zeta < 1)
 * and lie apart from every other by more than their two decay rates (alpha is the half-width of a ring's
 * spectral line, so closer lines merge into one: the resolution rule of common practice). Two rings closer
 * than that are how a least-squares fit bends one ring to a small model mismatch (a drifting frequency, a
 * slightly nonlinear part), which a capture with little noise shows as a significant drop in residual.
 */
function indistinctRings(fit: ModesFit, set: FitSet): string | null {
  const rings = fit.rates.rings.map((ring) => ({ ...ring, omegaD: Math.sqrt(Math.max(0, ring.omega0 ** 2 - ring.alpha ** 2)) }));
  const overdamped = rings.find((ring) => !(ring.alpha < ring.omega0));
  if (overdamped) return `finds a term with zeta ${(overdamped.alpha / overdamped.omega0).toPrecision(2)}, no ring`;
  const nyquist = gridNyquist(set);
  const aliased = rings.find((ring) => ring.omegaD > GRID_NYQUIST_SHARE * nyquist);
  if (aliased) return `finds a ring at ${(aliased.omegaD / nyquist).toPrecision(3)} of the Nyquist rate of the values fitted, the alternating pattern of the residual, no mode`;
  for (let j = 0; j < rings.length; j++) {
    for (let k = j + 1; k < rings.length; k++) {
      if (Math.abs(rings[j].omegaD - rings[k].omegaD) <= rings[j].alpha + rings[k].alpha) {
        return `finds two rings closer in frequency than their line widths (${(rings[j].omegaD / (2 * Math.PI)).toPrecision(4)} and ${(rings[k].omegaD / (2 * Math.PI)).toPrecision(4)} Hz), not two modes`;
      }
    }
  }
  return null;
}

/** The richer model against the simpler: both on the criterion, and the F-test with the frequency search counted. */
function compare(simple: Candidate, rich: Candidate, set: FitSet, richModel: ArrayLike<number>, forced = false) {
  if (!rich.fit || !(rich.sse < simple.sse)) {
    return { accepted: false, richCriterion: Infinity, text: rich.fit ? 'lowers the residual no further' : 'did not converge' };
  }
  const indistinct = forced ? null : indistinctRings(rich.fit, set);
  if (indistinct) return { accepted: false, richCriterion: Infinity, text: indistinct };
  const n = set.values.length;
  const nEff = effectiveCount(set, richModel, rich.parameters);
  const p = nestedFTestTail({ simpleSse: simple.sse, simpleParameters: simple.parameters, richSse: rich.sse, richParameters: rich.parameters, effectiveSamples: nEff }, n);
  // The extra term's rates were searched over the record's independent frequencies.
  const searched = Math.min(1, p * Math.max(1, nEff / 2));
  const richCriterion = information(rich.sse, rich.parameters, nEff);
  const gain = information(simple.sse, simple.parameters, nEff) - richCriterion;
  const drop = 100 * (1 - rich.sse / simple.sse);
  const significant = gain > 0 && searched < SIGNIFICANCE_LEVEL;
  // Each term the richer model holds must stand clear of zero by its own standard error, not only the residual drop.
  const weak = significant && !forced ? termAmplitudes(set, rich.fit).findIndex((q) => !(Math.abs(q.value) > SUPPORTED_SIGMAS * (q.stderr ?? Infinity))) : -1;
  if (weak >= 0) {
    const term = weak < rich.spec.rings ? `ring ${weak + 1}` : 'the slow term';
    return { accepted: false, richCriterion, text: `lowers the residual by ${(100 * (1 - rich.sse / simple.sse)).toPrecision(2)} %, but ${term}'s amplitude is within ${SUPPORTED_SIGMAS} standard errors of zero` };
  }
  return {
    accepted: significant,
    richCriterion,
    text: `lowers the residual by ${drop.toPrecision(2)} % (${ORDER_CRITERION} ${gain > 0 ? 'better' : 'worse'} by ${Math.abs(gain).toPrecision(3)}, F-test ${pValueText(searched)} with the search counted)`,
  };
}

/** The order table with every row's criterion over the effective samples of the chosen model's residuals. */
function outcome(rows: Candidate[], chosen: Candidate, forced: boolean, reason: string, set: FitSet, chosenModel: ArrayLike<number>): ModeOrderOutcome {
  const nEff = effectiveCount(set, chosenModel, Math.max(...rows.map((r) => r.parameters)));
  const table: ModelOrderRow[] = rows.map((row) => ({
    model: modelName(row.spec.rings, row.spec.slow),
    ringingModes: row.spec.rings,
    slowTerm: row.spec.slow,
    parameters: row.parameters,
    sse: row.sse,
    criterion: Number.isFinite(row.sse) ? information(row.sse, row.parameters, nEff) : Infinity,
    chosen: row === chosen,
  }));
  return { order: { criterion: ORDER_CRITERION, forced, reason, table }, chosen: chosen.fit };
}

/**
 * Whether the one ring's residuals show structure: the most one more ring or decay at a pencil pole of the
 * residual explains, in residual variances (its amplitudes solved linearly on the residual), or a residual
 * variance well above the noise.
 */
function gateOpens(set: FitSet, best: Attempt, residual: Float64Array, first: RingStart, t0: number, noise: number): { ring: boolean; slow: boolean; text: string } {
  const n = set.values.length;
  const variance = best.sse / Math.max(1, n - best.values.length);
  const excess = noise > 0 ? variance / (noise * noise) : Infinity;
  const tail = set.time.subarray(set.time.length - residual.length);
  const workspace = new ModesWorkspace(residual.length);
  let total = 0;
  for (let i = 0; i < residual.length; i++) total += residual[i] * residual[i];
  const explained = (alpha: number, omega0: number, columns: 1 | 2) => explainedByTerm(tail, residual, total, alpha, omega0, t0, columns, workspace);
  const inVariances = (sum: number) => (variance > 0 ? sum / variance : 0);
  const ring = inVariances(Math.max(0, ...ringStarts(set, residual, first).map((r) => explained(r.alpha, r.omega0, 2))));
  const slow = inVariances(Math.max(0, ...slowStarts(set, residual, first).map((rate) => explained(rate, rate, 1))));
  const mismatch = excess > GATE_EXCESS;
  const text = `one more ring explains at most ${ring.toPrecision(2)} residual variances, a slow term ${slow.toPrecision(2)} (gate at ${GATE_VARIANCES}); residual variance ${excess.toPrecision(3)}x the noise's`;
  return { ring: mismatch || ring > GATE_VARIANCES, slow: mismatch || slow > GATE_VARIANCES, text };
}

/**
 * Sum of squares of the residual (`total` of them in all) that e^(-alpha tau) (a C + b S) (or e^(-alpha tau) alone)
 * removes, its amplitudes by least squares.
 */
function explainedByTerm(
  time: Float64Array,
  residual: Float64Array,
  total: number,
  alpha: number,
  omega0: number,
  t0: number,
  columns: 1 | 2,
  workspace: ModesWorkspace,
): number {
  const set: FitSet = {
    time,
    values: residual,
    dt: NaN,
    range: NaN,
    samplesUsed: time.length,
    window: { start: time[0], end: time[time.length - 1] },
    decimation: null,
    block: null,
    warnings: [],
  };
  const spec = columns === 2 ? modeSpec(NO_PRE_EVENT, 1, false) : modeSpec(NO_PRE_EVENT, 0, true);
  const rates: ModeRates = { rings: columns === 2 ? [{ alpha, omega0 }] : [], slowRate: alpha, t0 };
  const { sse } = solveModes(set, spec, rates, workspace);
  return Number.isFinite(sse) ? Math.max(0, total - sse) : 0;
}

/** Fits models of the set from pencil starts on a residual: the starts ranked by the linear solve, the best few refined. */
class ModelSearch {
  private readonly workspace: ModesWorkspace;
  constructor(
    private readonly set: FitSet,
    private readonly t0: number,
    /** The ring the fallback starts are placed around. */
    private readonly first: RingStart,
  ) {
    this.workspace = new ModesWorkspace(set.time.length);
  }

  /**
   * The spec fitted from its best starts: the known rings, one more ring from each pencil pole of the residual
   * (three rings are reached through two), and the known slow rate or one from each real pole.
   */
  fitOrder(spec: ModeSpec, known: Known, residual: Float64Array): { spec: ModeSpec; fit: ModesFit | null; model: Float64Array } {
    const ringSets: RingStart[][] =
      spec.rings > known.rings.length ? ringStarts(this.set, residual, this.first).map((r) => [...known.rings, r]) : [known.rings.slice(0, spec.rings)];
    const slowOptions = spec.slow ? [...(known.slowRate ? [known.slowRate] : []), ...slowStarts(this.set, residual, this.first)] : [0];
    const starts: ModeRates[] = [];
    for (const rings of ringSets) for (const slowRate of slowOptions) starts.push({ rings, slowRate, t0: this.t0 });
    const ranked = starts
      .map((rates) => ({ rates, sse: solveModes(this.set, spec, rates, this.workspace).sse }))
      .filter((s) => Number.isFinite(s.sse))
      .sort((x, y) => x.sse - y.sse)
      .slice(0, REFINED_STARTS);
    let bestFit: ModesFit | null = null;
    for (const { rates } of ranked) {
      const fit = refineModes(this.set, spec, rates);
      if (fit.status !== 'converged' || !Number.isFinite(fit.sse)) continue;
      if (!bestFit || fit.sse < bestFit.sse) bestFit = fit;
    }
    const model = bestFit ? solveModes(this.set, spec, bestFit.rates, this.workspace).model : new Float64Array(this.set.time.length);
    return { spec, fit: bestFit, model };
  }
}
