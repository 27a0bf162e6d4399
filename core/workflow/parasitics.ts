// Loop parasitics by the added-capacitor method from several captures, an RC snubber starting point, the
// cautions from the largest peak the captures show, and L_p cross-checked on a turn-on edge. The command line and the window call this.

import type { Channel } from '../capture/types';
import { extractParasitics, type CapacitorDerating, type ParasiticExtraction } from '../circuit/addedCapacitor';
import { outOfReach } from '../circuit/plausibility';
import { crossCheckInductance, inductanceFromEdge } from '../circuit/edgeInductance';
import { CircuitInputError } from '../circuit/errors';
import type { Quantity } from '../quantity';
import { suggestSnubber } from '../circuit/snubber';
import { UsageError } from '../inputError';
import { fitStateText, hertz, regimeTag } from '../report/resultRows';
import type { EdgeCrossCheck, ParasiticsResult } from '../report/parasiticsText';
import { cautionInputsFromCapture } from '../safety/cautionInputs';
import { evaluateCautions, type CautionInputs } from '../safety/evaluateCautions';
import { fitChannel } from './measure';
import { runSetupChecks, setupRefusal, type SetupCheck } from './setupChecks';
import type { FitSummary } from '../report/fitSummary';
import { isThinSamplingWarning } from '../fit/fitWarnings';

export interface ParasiticsCapture {
  /** Name as people see it. */
  file: string;
  channel: Channel;
  captureWarnings?: readonly string[];
  /** Capacitance added in parallel with the node for this capture, F (0 for the bare loop, which comes first). */
  addedC: number;
  /** The added part's value at the operating voltage over its nominal value; replaces dcBias for this capture. */
  derating?: CapacitorDerating;
}

/** A turn-on edge for the L_p cross-check: the loop current, and the switch voltage or the plateau read by the user. */
export interface EdgeRequest {
  /** Name as people see it. */
  file: string;
  current: Channel;
  voltage?: Channel;
  /** The voltage across the loop inductance while the current rises, V, with its standard uncertainty. */
  plateau?: Quantity;
}

export interface ParasiticsRequest {
  captures: readonly ParasiticsCapture[];
  /** Relative tolerance of the added capacitors (rectangular half-width), always stated (see addedPartsTolerance). */
  addedTolerance: number;
  /** Probe capacitance in parallel with the node, F, and its relative tolerance. Default none. */
  probeC?: number;
  probeCTolerance?: number;
  /** Scope or probe bandwidth, Hz, for the bandwidth check. */
  bandwidth?: number;
  /** One DC-bias factor for every added capacitor without its own derating (class-II ceramics). Default none. */
  dcBias?: CapacitorDerating;
  /** The switch's output capacitance at the operating voltage, F, and its relative tolerance. Default none. */
  switchC?: { value: number; tolerance?: number };
  /** A turn-on edge to cross-check L_p on. Default none. */
  edge?: EdgeRequest;
  /** Voltage the snubber capacitor swings and the switching frequency: they size the snubber's dissipation only. */
  voltage?: number;
  switchingFrequency?: number;
}

/**
 * The extraction, or the failed measurement that stops it: a capture whose fit gives no ring to measure
 * (failed, no response, a single decay, overdamped), or whose ring a setup check refuses (a frequency that may be
 * an alias, a damping not measured), in one line naming the file and why. A failed measurement is not bad input:
 * the command line exits 1 for it, 2 for bad input.
 */
export type ParasiticsOutcome = { result: ParasiticsResult; failure: null } | { result: null; failure: string };

/**
 * measureParasiticsOutcome for the faces that show a failed fit as they show bad input, one message (the
 * window): the failure is thrown as a UsageError.
 */
export function measureParasitics(request: ParasiticsRequest, progress: (stage: string) => void = () => {}): ParasiticsResult {
  const outcome = measureParasiticsOutcome(request, progress);
  if (outcome.failure !== null) throw new UsageError(outcome.failure);
  return outcome.result;
}

/**
 * Fit every capture, extract L_p, C_p, R_p, suggest a snubber and weigh the cautions; `progress` hears each
 * stage. Bad input (fewer than two captures, frequencies that cannot separate L_p and C_p) throws.
 */
export function measureParasiticsOutcome(request: ParasiticsRequest, progress: (stage: string) => void = () => {}): ParasiticsOutcome {
  const { captures } = request;
  if (captures.length < 2) throw new UsageError('the added-capacitor method needs at least two captures: the bare loop and one with a capacitor added');
  refuseUnheldCapacitance(captures);
  const measured = captures.map((capture, i) => {
    progress(`fitting capture ${i + 1} of ${captures.length}`);
    const { fit, summary } = fitChannel(capture.file, capture.channel, {}, capture.captureWarnings);
    return { summary, refused: setupRefusal(runSetupChecks({ fit, summary, channel: capture.channel })) };
  });
  const failure = measurementFailure(measured);
  if (failure) return { result: null, failure };
  const fits = measured.map((m) => m.summary);
  // The method needs the undamped natural frequency f0 = omega0 / 2 pi, not the ring frequency.
  const rates = fits.map((fit, i) => ({ file: fit.file, addedC: captures[i].addedC, frequency: hertz(fit.omega0), alpha: fit.alpha }));
  const extraction = extractParasitics(
    rates.map((row, i) => ({
      addedC: row.addedC,
      addedCTolerance: i === 0 ? 0 : request.addedTolerance,
      derating: captures[i].derating,
      frequency: row.frequency,
      alpha: row.alpha,
      sampleInterval: meanInterval(captures[i].channel.time),
      label: row.file,
    })),
    { probeC: request.probeC ?? 0, probeCTolerance: request.probeCTolerance ?? 0, bandwidth: request.bandwidth, dcBias: request.dcBias, switchC: request.switchC },
  );
  const rows = rates.map((row, i) => ({ ...row, ...extraction.points[i] }));
  const loop = { L: extraction.L, C: extraction.C, R: extraction.R, characteristicImpedance: extraction.characteristicImpedance };
  const snubber = suggestSnubber(loop, { voltage: request.voltage, switchingFrequency: request.switchingFrequency });
  const peaks = largestPeaks(captures.map((c) => cautionInputsFromCapture(c.channel.values, c.channel.unit)));
  const cautions = evaluateCautions({ ...peaks, capacitance: extraction.C.value + snubber.C.value, inductance: extraction.L.value });
  const result: ParasiticsResult = {
    L: extraction.L,
    C: extraction.C,
    R: extraction.R,
    characteristicImpedance: extraction.characteristicImpedance,
    residual: extraction.residual,
    captures: rows,
    switchSplit: extraction.switchSplit,
    edgeCheck: request.edge ? edgeCrossCheck(request.edge, extraction.L) : null,
    snubber,
    cautions,
    warnings: [...implausibleLoop(extraction), ...extraction.warnings, ...fits.flatMap(fitWarningsBeyondExtraction)],
    notes: extraction.notes,
  };
  if (result.edgeCheck) result.notes.push(...result.edgeCheck.notes);
  return { result, failure: null };
}

/**
 * An added capacitance beyond what a bench circuit holds is bad input: most often a value typed without its
 * prefix, read in farads ('470' for 470 pF), which would scale C_p up and L_p down by 1e12 with a tight error bar.
 */
function refuseUnheldCapacitance(captures: readonly ParasiticsCapture[]): void {
  for (const capture of captures) {
    const beyond = capture.addedC === 0 ? null : outOfReach('C', capture.addedC);
    if (beyond) throw new UsageError(`${capture.file}: the added capacitance ${beyond}; a value without a prefix is in farads (470 pF is 470p)`);
  }
}

/**
 * A capture's fit warnings, named by its file, less the thin-sampling one: the extraction states it for every capture, with the
 * sample interval and against f0, which is at or above the ring frequency the fit's warning counts with.
 */
function fitWarningsBeyondExtraction(fit: FitSummary): string[] {
  return fit.warnings.filter((w) => !isThinSamplingWarning(w)).map((w) => `${fit.file}: ${w}`);
}

/** The first of L_p, C_p and R_p beyond what a bench circuit holds, as the first warning (as a fit's implausible part is). */
function implausibleLoop(extraction: Pick<ParasiticExtraction, 'L' | 'C' | 'R'>): string[] {
  const parts = [['L_p', 'L'], ['C_p', 'C'], ['R_p', 'R']] as const;
  for (const [label, name] of parts) {
    const beyond = outOfReach(name, extraction[name].value);
    if (beyond) return [`implausible: ${label} = ${beyond}; check the units of the added capacitances (a value without a prefix is in farads) and the captures' time axes`];
  }
  return [];
}

/** The first capture that gives no ring to measure, or whose ring a setup check refuses, in one line; null when every capture measures. */
function measurementFailure(measured: readonly { summary: FitSummary; refused: SetupCheck | null }[]): string | null {
  const noRing = measured.find((m) => regimeTag(m.summary) !== 'underdamped');
  if (noRing) return `${noRing.summary.file}: no ring to measure (${fitStateText(noRing.summary)}); the added-capacitor method needs an underdamped ring in every capture`;
  const refused = measured.find((m) => m.refused !== null);
  return refused ? `${refused.summary.file}: a setup check refused the capture: ${refused.refused!.message}` : null;
}

/** L_p from the turn-on edge against the ring's; an edge that cannot give di/dt or V_L is bad input naming its file. */
function edgeCrossCheck(edge: EdgeRequest, ringL: Quantity): EdgeCrossCheck {
  const expectUnit = (channel: Channel, unit: string, what: string) => {
    if (channel.unit !== '' && channel.unit !== unit) {
      throw new UsageError(`turn-on edge ${edge.file}: the ${what} channel '${channel.name}' is in ${channel.unit}, not ${unit}`);
    }
  };
  expectUnit(edge.current, 'A', 'current');
  if (edge.voltage) expectUnit(edge.voltage, 'V', 'voltage');
  try {
    const measured = inductanceFromEdge({ current: edge.current, voltage: edge.voltage, plateau: edge.plateau });
    const { difference, verdict, coverageFactor } = crossCheckInductance(measured, ringL);
    return { file: edge.file, ...measured, difference, verdict, coverageFactor };
  } catch (error) {
    if (error instanceof CircuitInputError) throw new UsageError(`turn-on edge ${edge.file}: ${error.message}`);
    throw error;
  }
}

/** The largest peak voltage and current over all captures: the node sees the worst of them. */
function largestPeaks(inputs: readonly CautionInputs[]): Pick<CautionInputs, 'peakVoltage' | 'peakCurrent' | 'peakNotWeighed'> {
  const largest = (key: 'peakVoltage' | 'peakCurrent') => {
    const values = inputs.map((i) => i[key]).filter((v): v is number => v !== undefined);
    return values.length ? Math.max(...values) : undefined;
  };
  const peakVoltage = largest('peakVoltage');
  const peakCurrent = largest('peakCurrent');
  const peakNotWeighed = inputs.find((i) => i.peakNotWeighed)?.peakNotWeighed;
  return { ...(peakVoltage === undefined ? {} : { peakVoltage }), ...(peakCurrent === undefined ? {} : { peakCurrent }), ...(peakNotWeighed ? { peakNotWeighed } : {}) };
}

/** Mean sample interval, s, for the samples-per-period check; undefined with fewer than two samples. */
function meanInterval(time: Float64Array): number | undefined {
  const n = time.length;
  return n > 1 ? (time[n - 1] - time[0]) / (n - 1) : undefined;
}
