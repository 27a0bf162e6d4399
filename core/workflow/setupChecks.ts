// Can this capture support the answer? Checks of how the ring was captured, each a note, a warning or a refusal.
//
// A refusal means a number the fit gives cannot be stated for this capture: the command line exits 1 with its
// message (the fit's own status stays what the fit found). A warning says the stated error may not cover a
// bias the setup puts on the answer; a note adds what the setup changes, with values.

import type { Channel } from '../capture/types';
import { aliasWarning, BANDWIDTH_FRACTION, MIN_SAMPLES_PER_PERIOD, passedAlias, REFUSED_SAMPLES_PER_PERIOD, samplesPerRingPeriod } from '../circuit/measurementChecks';
import { frontEndBias } from '../circuit/setupFrontEnd';
import { fittedWindows, ringFrequencyAlong, ringWindowsAlong } from '../circuit/setupDrift';
import { growingRingIn } from '../circuit/setupGrowth';
import {
  DEFAULT_GROUND_LEAD,
  DEFAULT_PROBE_CAPACITANCE,
  GROUND_LEAD_MATCH,
  groundLeadResonance,
  matchesGroundLead,
  probeCorrection,
} from '../circuit/setupProbe';
import { averagingAcquisition, statedBandwidth } from '../circuit/setupPreamble';
import type { ResponseFit } from '../fit/responseFit';
import type { Quantity } from '../quantity';
import { median } from '../fit/noise';
import { fitSucceeded, type FitSummary } from '../report/fitSummary';
import { hertz } from '../report/resultRows';
import { toleranceToRelativeUncertainty } from '../circuit/tolerance';
import { slowestDecayRate } from '../response/secondOrder';
import { formatEngineering, formatWithUncertainty } from '../units/format';
import type { KnownPartRequest } from './measuredComponents';
import type { SetupCheck, SetupCheckLevel, SetupOptions } from '../circuit/setupTypes';

export { ringFrequencyAlong, type RingWindowFrequency } from '../circuit/setupDrift';
export type { SetupCheck, SetupCheckId, SetupCheckLevel, SetupOptions } from '../circuit/setupTypes';

export interface SetupCheckInput {
  fit: ResponseFit;
  summary: FitSummary;
  channel: Pick<Channel, 'time' | 'values' | 'unit'>;
  /** The capture preamble's key/value pairs. */
  metadata?: Readonly<Record<string, string>>;
  options?: SetupOptions;
  knownPart?: KnownPartRequest;
}

/** A drift beyond this many combined standard errors between the first and the last window is reported (about 0.3 % false alarms for honest errors). */
const DRIFT_SIGMAS = 3;
/**
 * Nor is a drift under this share of the ring frequency (10 ppm), however many standard errors it is: no component's
 * voltage dependence is told by it, and on a noise-free record (a simulator's output, whose varying step moves the
 * frequency by parts in 10^8) the windows' errors are near zero and would call any such trace a drift.
 */
const DRIFT_FLOOR = 1e-5;
/** The ring is followed until its envelope falls to this many times the fit's residual; beyond, the windows would fit noise. */
const RING_END_NOISE = 5;
/** A decay indistinguishable from none: alpha within this many standard errors of zero. */
const SUSTAINED_SIGMAS = 2;
/** Without a standard error for alpha, a ring decaying by less than this over the fitted span does not decay measurably. */
const SUSTAINED_DECAY = 0.05;
/** A ring is only judged sustained over at least this many periods (fewer cannot tell a slow decay from none). */
const SUSTAINED_PERIODS = 2;
/** Windows of the ring's amplitude compared to tell a growing ring from a steady one. */
const GROWTH_WINDOWS = 3;
/** The last window's amplitude above the first's by this factor: the ring grows. */
const GROWTH_RATIO = 1.1;
/** Every setup check that applies to this measurement, in a fixed order: refusals first, then warnings, then notes. */
export function runSetupChecks(input: SetupCheckInput): SetupCheck[] {
  const sustained = sustainedOscillation(input);
  const checks = [
    ...samplesPerPeriod(input),
    ...alias(input),
    ...sustained,
    ...bandwidth(input),
    ...acquisitionMode(input),
    ...groundLead(input),
    ...probeLoading(input),
    ...frequencyDrift(input),
    // A sustained ring refuses alpha outright; a note that alpha is loose would only repeat it.
    ...(sustained.length ? [] : recordLength(input)),
  ];
  const rank: Record<SetupCheckLevel, number> = { refusal: 0, warning: 1, note: 2 };
  return checks.sort((a, b) => rank[a.level] - rank[b.level]);
}

/** True when any check refuses an answer (the command line exits 1). */
export function setupRefused(checks: readonly SetupCheck[]): boolean {
  return setupRefusal(checks) !== null;
}

/** The first check that refuses an answer (refusals come first), or null. */
export function setupRefusal(checks: readonly SetupCheck[]): SetupCheck | null {
  return checks.find((c) => c.level === 'refusal') ?? null;
}

/** The ring's frequency in rad/s (damped, else natural) when the fit found a ring; null otherwise. */
function ringOmega(input: SetupCheckInput): number | null {
  const { fit } = input;
  if (!fitSucceeded(fit) || fit.regime === 'first-order' || fit.regime === 'none') return null;
  if (fit.omegaD && fit.omegaD.value > 0) return fit.omegaD.value;
  return fit.zeta.value < 1 && fit.omega0.value > 0 ? fit.omega0.value : null;
}

/** The median sample interval of the channel, s: the median of its steps, found exactly in one pass without copying them all. */
function sampleInterval(time: ArrayLike<number>): number | null {
  const n = time.length;
  if (n < 2) return null;
  const count = n - 1;
  const upper = count >> 1;
  const middle = count >= MIN_BRACKETED_STEPS ? bracketedSteps(time, count % 2 ? upper : upper - 1, upper) : null;
  if (middle === null) return median(steps(time));
  return count % 2 ? middle.upper : 0.5 * (middle.lower + middle.upper);
}

function steps(time: ArrayLike<number>): Float64Array {
  const out = new Float64Array(time.length - 1);
  for (let i = 0; i < out.length; i++) out[i] = time[i + 1] - time[i];
  return out;
}

/** Steps sampled to bracket the median: the sample median's rank among all the steps is known to 1/sqrt(STEP_SAMPLE) of their count. */
const STEP_SAMPLE = 4096;
/** The bracket reaches this many sampled ranks either side of the sample median: 4 standard deviations (sqrt(STEP_SAMPLE) / 2 each). */
const BRACKET_REACH = 128;
/** Fewer steps than this are copied and selected: a bracket would save nothing. */
const MIN_BRACKETED_STEPS = 4 * STEP_SAMPLE;
/** A bracket holding more than this share of the steps brackets nothing: they are copied and selected instead. */
const MAX_BRACKETED_SHARE = 0.25;
/** Sampled positions step by the golden ratio's fraction of the record: no period of the axis lines up with them. */
const GOLDEN_FRACTION = (Math.sqrt(5) - 1) / 2;

/**
 * The steps time[i+1] - time[i] of ranks lowerRank <= upperRank (0-based, ascending), exactly, or null when a step is
 * NaN or either rank falls outside the bracket (then the caller selects from a copy). A sample of the steps gives a
 * bracket [a, b] holding the median with near certainty; one pass counts the steps below a, equal to a or b, and
 * keeps only those strictly between, so the ranks are read from the counts or from the few kept.
 */
function bracketedSteps(time: ArrayLike<number>, lowerRank: number, upperRank: number): { lower: number; upper: number } | null {
  const count = time.length - 1;
  const sample = new Float64Array(STEP_SAMPLE);
  for (let j = 0; j < STEP_SAMPLE; j++) {
    const i = Math.floor(((j * GOLDEN_FRACTION) % 1) * count);
    sample[j] = time[i + 1] - time[i];
  }
  sample.sort();
  const a = sample[STEP_SAMPLE / 2 - BRACKET_REACH];
  const b = sample[STEP_SAMPLE / 2 + BRACKET_REACH];
  if (!(a <= b)) return null;
  const between = new Float64Array(Math.ceil(count * MAX_BRACKETED_SHARE));
  let below = 0;
  let atA = 0;
  let atB = 0;
  let kept = 0;
  for (let i = 0; i < count; i++) {
    const step = time[i + 1] - time[i];
    if (step < a) below++;
    else if (step > b) continue;
    else if (step === a) atA++;
    else if (step === b) atB++;
    else if (step !== step || kept === between.length) return null;
    else between[kept++] = step;
  }
  const inside = between.subarray(0, kept).sort();
  const rankOf = (rank: number): number | null => {
    let r = rank - below;
    if (r < 0) return null;
    if (r < atA) return a;
    r -= atA;
    if (r < kept) return inside[r];
    return r - kept < atB ? b : null;
  };
  const lower = rankOf(lowerRank);
  const upper = rankOf(upperRank);
  return lower === null || upper === null ? null : { lower, upper };
}

/** Slack on the bound of the median step for the rounding of the steps and of the bound itself (a few parts in 10^16 each). */
const STEP_BOUND_ROUNDING = 1 + 1e-9;

/**
 * An upper bound on the median step of an axis that increases strictly (a channel's), NaN under two samples: at least
 * half of the steps reach the median and none is negative, so it is at most twice the mean step.
 */
function medianStepBound(time: ArrayLike<number>): number {
  const n = time.length;
  if (n < 2) return NaN;
  return ((2 * (time[n - 1] - time[0])) / (n - 1)) * STEP_BOUND_ROUNDING;
}

function samplesPerPeriod(input: SetupCheckInput): SetupCheck[] {
  const omega = ringOmega(input);
  if (omega === null) return [];
  const frequency = omega / (2 * Math.PI);
  // Enough samples per period even at the largest median step the axis allows: the check is silent, and the pass over every step is saved.
  if (samplesPerRingPeriod(frequency, medianStepBound(input.channel.time)) >= MIN_SAMPLES_PER_PERIOD) return [];
  const dt = sampleInterval(input.channel.time);
  if (dt === null || !(dt > 0)) return [];
  const perPeriod = samplesPerRingPeriod(frequency, dt);
  const values = { samplesPerPeriod: perPeriod, frequency, sampleInterval: dt };
  const at = `${perPeriod.toFixed(1)} samples per ring period (${formatEngineering(frequency, 'Hz')} sampled every ${formatEngineering(dt, 's')})`;
  if (perPeriod < REFUSED_SAMPLES_PER_PERIOD) {
    return [{ id: 'samples-per-period', level: 'refusal', message: `${at}: under ${REFUSED_SAMPLES_PER_PERIOD} the frequency may be an alias of a faster ring; sample faster to measure it`, values }];
  }
  if (perPeriod < MIN_SAMPLES_PER_PERIOD) {
    return [{ id: 'samples-per-period', level: 'warning', message: `${at}: under ${MIN_SAMPLES_PER_PERIOD} the fit has little of each period to go on (common practice)`, values }];
  }
  return [];
}

/**
 * A ring whose amplitude does not decay is not a very high Q: it is a sustained (or growing) oscillation, and
 * alpha, zeta and Q cannot be given. It is a refusal, not a status of the fit, because the fit did converge and its
 * frequency and levels stand; what the record cannot support is the damping, so the command line exits 1 saying so.
 */
function sustainedOscillation(input: SetupCheckInput): SetupCheck[] {
  const omega = ringOmega(input);
  const { fit, channel } = input;
  if (omega === null) return fitSucceeded(fit) ? [] : growingRing(channel);
  const span = fit.window.end - fit.t0.value;
  const periods = (omega * span) / (2 * Math.PI);
  if (!(periods >= SUSTAINED_PERIODS)) return [];
  const alpha = fit.alpha;
  const undecided = alpha.stderr === null ? alpha.value * span < SUSTAINED_DECAY : alpha.value - SUSTAINED_SIGMAS * alpha.stderr <= 0;
  if (!undecided) return [];
  const windows = ringFrequencyAlong(channel.time, channel.values, { start: fit.t0.value, end: fit.window.end, alpha: 0, omegaD: omega, windows: GROWTH_WINDOWS });
  const growth = windows.length >= 2 ? windows[windows.length - 1].amplitude / windows[0].amplitude : null;
  const grows = growth !== null && growth > GROWTH_RATIO;
  const how = grows ? `grows (×${growth.toFixed(2)} from the first to the last third)` : 'does not decay';
  const decay = alpha.stderr === null ? `alpha = ${formatEngineering(alpha.value, 's^-1')}, no standard error` : `alpha = ${formatWithUncertainty(alpha)}`;
  return [
    {
      id: 'sustained-oscillation',
      level: 'refusal',
      message: `the ${formatEngineering(omega / (2 * Math.PI), 'Hz')} ring ${how} over ${periods.toFixed(0)} periods (${decay}): a sustained oscillation, so alpha, zeta and Q cannot be given`,
      values: { frequency: omega / (2 * Math.PI), periods, alpha, ...(growth === null ? {} : { growth }) },
    },
  ];
}

/** A ring the fit could not take (a growing one finds no decaying model and reads as no response), found growing. */
function growingRing(channel: SetupCheckInput['channel']): SetupCheck[] {
  const grows = growingRingIn(channel.time, channel.values, GROWTH_WINDOWS, GROWTH_RATIO);
  if (!grows) return [];
  const { frequency, growth, periods } = grows;
  return [
    {
      id: 'sustained-oscillation',
      level: 'refusal',
      message: `a ${formatEngineering(frequency, 'Hz')} ring grows (×${growth.toFixed(2)} from the first to the last third) over ${periods.toFixed(0)} periods: no decaying response fits it, so alpha, zeta and Q cannot be given`,
      values: { frequency, periods, growth },
    },
  ];
}

/** The front end's bandwidth, Hz: the stated one, else the preamble's; with its source in words and as a value. */
function frontEnd(input: SetupCheckInput): { hertz: number; source: string; from: string } | null {
  const stated = input.options?.scopeBandwidth;
  if (stated !== undefined) return { hertz: stated, source: 'the stated bandwidth', from: 'option' };
  const preamble = input.metadata ? statedBandwidth(input.metadata) : null;
  return preamble ? { hertz: preamble.hertz, source: `the preamble's '${preamble.key}: ${preamble.value}'`, from: preamble.key } : null;
}

/**
 * A front end passing rings above half the sample rate: the ring seen may be the alias of a faster one, which no fit
 * can tell from the samples. Left to the samples-per-period refusal where that already says so.
 */
function alias(input: SetupCheckInput): SetupCheck[] {
  const omega = ringOmega(input);
  const front = frontEnd(input);
  if (omega === null || front === null) return [];
  const frequency = omega / (2 * Math.PI);
  // Even the slowest sample rate the axis allows leaves the alias above the bandwidth: silent, and the pass over every step is saved.
  if (!(1 / medianStepBound(input.channel.time) - frequency <= front.hertz)) return [];
  const dt = sampleInterval(input.channel.time);
  if (dt === null || !(dt > 0) || samplesPerRingPeriod(frequency, dt) < REFUSED_SAMPLES_PER_PERIOD) return [];
  const faster = passedAlias(frequency, dt, front.hertz);
  if (faster === null) return [];
  return [
    {
      id: 'alias',
      level: 'warning',
      message: `the ring may be an alias: ${aliasWarning(frequency, faster, dt, front.hertz, front.source)}`,
      values: { frequency, alias: faster, sampleRate: 1 / dt, bandwidth: front.hertz, source: front.from },
    },
  ];
}

function bandwidth(input: SetupCheckInput): SetupCheck[] {
  const omega = ringOmega(input);
  const front = frontEnd(input);
  const { fit, channel } = input;
  if (omega === null || front === null || fit.alpha.stderr === null) return [];
  const { hertz, source } = front;
  const frequency = omega / (2 * Math.PI);
  const bias = frontEndBias(fit.params, channel, fit.window, fit.noiseRms, hertz, fit.jumpStart ? 'free' : 'continuous');
  const values = { bandwidth: hertz, frequency, ratio: frequency / hertz, source: front.from };
  if (!bias) {
    if (frequency <= hertz * BANDWIDTH_FRACTION) return [];
    return [{ id: 'bandwidth', level: 'warning', message: `the ${formatEngineering(frequency, 'Hz')} ring is above a third of ${source} (${formatEngineering(hertz, 'Hz')}), and its bias on alpha could not be estimated (common practice: keep the ring below bandwidth / 3)`, values }];
  }
  const sigmas = Math.abs(bias.alphaBias) / fit.alpha.stderr;
  if (sigmas <= 1) return [];
  return [
    {
      id: 'bandwidth',
      level: 'warning',
      message:
        `a first-order front end at ${formatEngineering(hertz, 'Hz')} (${source}) moves the fitted alpha by about ${formatEngineering(bias.alphaBias, 's^-1')} ` +
        `(${sigmas.toFixed(1)}x its standard error) for this ${formatEngineering(frequency, 'Hz')} ring: the stated error does not cover it`,
      values: { ...values, alphaBias: bias.alphaBias, omega0Bias: bias.omega0Bias, biasSigmas: sigmas, ringGain: bias.ringGain },
    },
  ];
}

function acquisitionMode(input: SetupCheckInput): SetupCheck[] {
  const entry = input.metadata ? averagingAcquisition(input.metadata) : null;
  if (!entry) return [];
  return [
    {
      id: 'acquisition-mode',
      level: 'warning',
      message: `the preamble's '${entry.key}: ${entry.value}' averages samples or acquisitions, which low-pass filters the ring: alpha may read high beyond its stated error (capture in plain sample mode to measure damping)`,
      values: { key: entry.key, mode: entry.value },
    },
  ];
}

function groundLead(input: SetupCheckInput): SetupCheck[] {
  const omega = ringOmega(input);
  if (omega === null || input.channel.unit !== 'V') return [];
  const length = input.options?.groundLead ?? DEFAULT_GROUND_LEAD;
  const capacitance = input.options?.probeCapacitance ?? DEFAULT_PROBE_CAPACITANCE;
  const resonance = groundLeadResonance(length, capacitance);
  const frequency = omega / (2 * Math.PI);
  if (!matchesGroundLead(frequency, resonance)) return [];
  const assumed = [
    input.options?.groundLead === undefined ? `a ${formatEngineering(length, 'm', 3)} lead assumed` : `a ${formatEngineering(length, 'm', 3)} lead`,
    input.options?.probeCapacitance === undefined ? `${formatEngineering(capacitance, 'F', 3)} assumed` : formatEngineering(capacitance, 'F', 3),
  ].join(', ');
  return [
    {
      id: 'ground-lead',
      level: 'warning',
      message:
        `the ${formatEngineering(frequency, 'Hz')} ring is within ${(GROUND_LEAD_MATCH * 100).toFixed(0)} % of a passive probe's ground-lead resonance ` +
        `(${formatEngineering(resonance, 'Hz')}: about 25 nH per inch, common practice, against the probe's capacitance; ${assumed}): it may be the probe, not the circuit; measure again with a short ground spring`,
      values: { frequency, resonance, groundLead: length, probeCapacitance: capacitance },
    },
  ];
}

/** How the probe's capacitance entered the corrected values: with its tolerance, or taken as exact (and how to give one). */
function probeToleranceText(probeC: number, tolerance: number | undefined): string {
  if (tolerance !== undefined) return `the probe's ${Number((tolerance * 100).toPrecision(3))} % tolerance included`;
  return `the probe's capacitance taken as exact (give its tolerance as ${formatEngineering(probeC, 'F', 3).replace(/\s+|F$/g, '')},TOL in %)`;
}

function probeLoading(input: SetupCheckInput): SetupCheck[] {
  const probeC = input.options?.probeCapacitance;
  if (probeC === undefined || input.channel.unit !== 'V' || !fitSucceeded(input.fit) || input.fit.regime === 'first-order' || input.fit.regime === 'none') return [];
  const components = input.summary.components;
  const tolerance = input.options?.probeCapacitanceTolerance;
  const probeRel = toleranceToRelativeUncertainty(tolerance ?? 0);
  const probe = formatEngineering(probeC, 'F', 3);
  if (!components || !input.knownPart) {
    return [{ id: 'probe-loading', level: 'note', message: `the probe's ${probe} loads the node; give the topology and a known part to see C and f0 without it`, values: { probeCapacitance: probeC } }];
  }
  const corrected = probeCorrection(hertz(input.fit.omega0), components.C, input.knownPart.known.name, probeC, probeRel);
  if (!corrected) {
    return [
      {
        id: 'probe-loading',
        level: 'refusal',
        message: `the probe's ${probe} is not below the ${formatEngineering(components.C.value, 'F')} the loop measures with it on: it cannot sit across that capacitance; check the probe capacitance and the known part`,
        values: { probeCapacitance: probeC, C: components.C },
      },
    ];
  }
  const f0 = `f0 = ${formatWithUncertainty(corrected.unloadedF0)} (measured ${formatWithUncertainty(corrected.loadedF0)})`;
  if (input.knownPart.known.name === 'C') {
    // The known C is the board's; the loop rang with C + Cp, so the L derived from C alone reads high by (C + Cp) / C
    // (d ln L / d ln Cp = -Cp / (C + Cp)).
    const share = components.C.value / corrected.loadedC.value;
    const value = components.L.value * share;
    const stderr = components.L.stderr === null ? null : Math.hypot(components.L.stderr * share, value * (1 - share) * probeRel);
    const L = { ...components.L, value, stderr };
    return [
      {
        id: 'probe-loading',
        level: 'note',
        message: `without the probe's ${probe} across C (the loop rang with C + Cp = ${formatEngineering(corrected.loadedC.value, 'F')}): ${f0}, L = ${formatWithUncertainty(L)} (from C alone ${formatWithUncertainty(components.L)}); ${probeToleranceText(probeC, tolerance)}`,
        values: { probeCapacitance: probeC, ...corrected, unloadedL: L },
      },
    ];
  }
  return [
    {
      id: 'probe-loading',
      level: 'note',
      message: `without the probe's ${probe} across the ring's capacitance: C = ${formatWithUncertainty(corrected.unloadedC)} (measured ${formatWithUncertainty(corrected.loadedC)}), ${f0}; ${probeToleranceText(probeC, tolerance)}`,
      values: { probeCapacitance: probeC, ...corrected },
    },
  ];
}

/**
 * Where the ring has fallen to RING_END_NOISE times the fit's rms residual (or the fit window's end, if sooner), s.
 * The residual, not the record's noise estimate: first differences read a fast ring's own slope as noise.
 */
function ringEnd(fit: ResponseFit): number {
  const amplitude = Math.hypot(fit.params.a, fit.params.b / Math.max(fit.omegaD?.value ?? fit.omega0.value, Number.MIN_VALUE));
  const floor = RING_END_NOISE * fit.rmsResidual;
  const visible = fit.alpha.value > 0 && amplitude > floor ? Math.log(amplitude / floor) / fit.alpha.value : Infinity;
  return Math.min(fit.window.end, fit.t0.value + visible);
}

function frequencyDrift(input: SetupCheckInput): SetupCheck[] {
  const { fit, channel } = input;
  const omega = fit.omegaD?.value;
  if (!fitSucceeded(fit) || fit.regime !== 'underdamped' || !omega) return [];
  const along = ringWindowsAlong(channel.time, channel.values, { start: fit.t0.value, end: ringEnd(fit), alpha: fit.alpha.value, omegaD: omega });
  // The first and last windows decide when both are fitted: those between are only counted, and only for a drift.
  if (along.count >= 2) {
    const first = along.fit(0);
    const last = along.fit(along.count - 1);
    if (first && last && !shift(first.frequency, last.frequency).drifts) return [];
  }
  const windows = fittedWindows(along);
  if (windows.length < 2) return [];
  const early = windows[0].frequency;
  const late = windows[windows.length - 1].frequency;
  const { drift, combined, drifts } = shift(early, late);
  if (!drifts) return [];
  return [
    {
      id: 'frequency-drift',
      level: 'warning',
      message:
        `the ring frequency drifts from ${formatWithUncertainty(early)} early to ${formatWithUncertainty(late)} late (${(Math.abs(drift) / combined).toFixed(1)} standard errors): ` +
        `one omega0 fits neither end (a voltage-dependent capacitance${fit.modes.length > 1 ? ', or the close modes fitted' : ''}?); compare captures at the same point of the ring`,
      values: { early, late, drift, windows: windows.length },
    },
  ];
}

/**
 * The late window's frequency less the early one's, their combined standard error, and whether the difference exceeds
 * DRIFT_SIGMAS of it and DRIFT_FLOOR of the frequency.
 */
function shift(early: Quantity, late: Quantity): { drift: number; combined: number; drifts: boolean } {
  const drift = late.value - early.value;
  const combined = Math.hypot(early.stderr ?? Infinity, late.stderr ?? Infinity);
  return { drift, combined, drifts: Math.abs(drift) > DRIFT_SIGMAS * combined && Math.abs(drift) > DRIFT_FLOOR * Math.abs(early.value) };
}

/** Kept from the fit's warnings as a setup note: a ring shorter than one time constant leaves alpha's error wide (already in it). */
function recordLength(input: SetupCheckInput): SetupCheck[] {
  const { fit } = input;
  if (!fitSucceeded(fit) || fit.regime === 'none' || !(fit.alpha.value > 0)) return [];
  const p = fit.params;
  const constants = (fit.window.end - p.t0) * slowestDecayRate(p.alpha, p.omega0);
  if (!(constants < 1) || constants <= 0) return [];
  return [
    {
      id: 'record-length',
      level: 'note',
      message: `the record holds ${constants.toFixed(2)} of the slowest time constant after the event: alpha is loosely determined, and its stated error is wide for it`,
      values: { timeConstants: constants },
    },
  ];
}
