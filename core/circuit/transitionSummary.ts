// One step's transition metrics from the samples (with the fitted levels) and from the fitted model.
import type { ResponseFit } from '../fit/fitResponse';
import { quantity, type Quantity } from '../quantity';
import { modelTransitions, type ModelTransitions } from './modelTransitions';
import { parabolaPeak } from './peakFit';
import type { StateLevelMethod } from './stateLevels';
import { transitionMetrics } from './transitions';

/** Metrics of the samples (IEEE Std 181-2011 definitions), SI base units or %; null where not defined. */
export interface MeasuredTransitions {
  /** 10 % to 90 % reference-level instants, s. */
  riseTime: number | null;
  /** Largest sample past the final level, % of |step|: lifted by noise (see peakOvershoot). */
  overshoot: number | null;
  undershoot: number | null;
  /** From the fit's t0 to the largest sample, s. */
  peakTime: number | null;
  /** From the fit's t0 (IEEE 181 counts from the 50 % instant; t0 matches the model's), s. */
  settlingTime2: number | null;
  settlingTime5: number | null;
  /** From the final-level crossings, Hz. */
  ringFrequency: number | null;
  /**
   * Overshoot from a least-squares parabola over the samples within a twelfth of a ring period of
   * the largest one: the noise averaged instead of picked, with its standard error; null without a ring.
   */
  peakOvershoot: Quantity | null;
}

export interface TransitionSummary {
  /** Why nothing was measured (a ringdown, a failed fit); null when the step was measured. */
  reason: string | null;
  /** Where the state levels came from: the fit's pre-event level and final value. */
  levelMethod: StateLevelMethod;
  levels: { initial: number; final: number };
  /** The fit's t0, s: the origin of peak and settling times. */
  eventTime: number;
  measured: MeasuredTransitions | null;
  /** Metrics of the fitted model's step with standard errors from alpha and omega0. */
  model: Omit<ModelTransitions, 'warnings'> | null;
  warnings: string[];
}

/** Half-width of the peak parabola in ring phase: it matches a cosine there to 0.03 % of its height (derived). */
const PEAK_HALF_PHASE = Math.PI / 6;
/** The largest sample exceeding the parabola's peak by more than this many standard errors is flagged. */
const LIFT_SIGMAS = 3;

/**
 * Why a fit without samples before its event has no step metrics: the level it starts from and the instant are
 * the model's at the first fitted sample, not the step's (a record caught 9 samples late read 43 % overshoot for 37 %).
 */
const NO_STEP_START = 'the fit window starts inside the response, with no samples before the event: the level and the instant the step started from are unknown';

/** The samples measured, time ascending; `clipped` flags samples at an ADC rail (1, else 0), whose values are not the waveform's. */
export interface TransitionTrace {
  time: ArrayLike<number>;
  values: ArrayLike<number>;
  clipped?: Uint8Array;
}

/**
 * Always returns a summary: with `reason` set (and `measured`, `model` null) when the fit holds no
 * step to measure, or no samples before its step (NO_STEP_START). The state levels are the fitted model's,
 * the event time the fit's t0. When samples after the event sit at a rail, the sample peak is not the
 * waveform's: overshoot, undershoot and peak time are not measured from the samples (the model's still are).
 */
export function summarizeTransitions(trace: TransitionTrace, fit: ResponseFit): TransitionSummary {
  const levels = { initial: fit.preLevel.value, final: fit.finalValue.value };
  const eventTime = fit.t0.value;
  const summary: TransitionSummary = { reason: null, levelMethod: 'fitted model', levels, eventTime, measured: null, model: null, warnings: [] };
  const model = modelTransitions(fit);
  if (model.metrics === null) return { ...summary, reason: model.reason };
  if (fit.startsInResponse || !(trace.time[0] < eventTime)) return { ...summary, reason: NO_STEP_START };
  const { warnings: modelWarnings, ...modelMetrics } = model.metrics;

  const modelSettled = eventTime + modelMetrics.settlingTime2.value;
  const m = transitionMetrics(trace.time, trace.values, { ...levels, eventTime, method: 'fitted model', modelSettled });
  const fromEvent = (settling: number | null) => (settling === null || m.instants.t50 === null ? null : settling + m.instants.t50 - eventTime);
  const peakOvershoot = parabolaOvershoot(trace, fit, m.peakInstant);
  const warnings = [...m.warnings, ...modelWarnings];
  if (peakOvershoot?.stderr && m.overshoot !== null && m.overshoot - peakOvershoot.value > LIFT_SIGMAS * peakOvershoot.stderr) {
    warnings.push(
      `noise lifts the largest sample: the sample overshoot reads ${(m.overshoot - peakOvershoot.value).toFixed(2)} percentage points above the parabola through the peak's samples.`,
    );
  }
  const clipped = clippedAfter(trace, eventTime);
  if (clipped > 0) {
    warnings.push(`${clipped} sample(s) after the event sit at a rail: the sample overshoot, undershoot and peak time are not measured; the model's stand.`);
  }
  const peakShown = <T>(value: T): T | null => (clipped > 0 ? null : value);
  return {
    ...summary,
    measured: {
      riseTime: m.riseTime,
      overshoot: peakShown(m.overshoot),
      undershoot: peakShown(m.undershoot),
      peakTime: peakShown(m.peakTime),
      settlingTime2: fromEvent(m.settlingTime2),
      settlingTime5: fromEvent(m.settlingTime5),
      ringFrequency: m.ringFrequency,
      peakOvershoot: peakShown(peakOvershoot),
    },
    model: modelMetrics,
    warnings: [...new Set(warnings)],
  };
}

/** How many samples at or after the event are flagged as clipped (indexOf() scans natively: most records hold none). */
function clippedAfter(trace: TransitionTrace, eventTime: number): number {
  const { clipped, time } = trace;
  if (!clipped) return 0;
  let count = 0;
  for (let i = clipped.indexOf(1); i >= 0; i = clipped.indexOf(1, i + 1)) if (time[i] >= eventTime) count++;
  return count;
}

/** The overshoot of the parabola through the samples about the largest one, % of |step|. */
function parabolaOvershoot(trace: { time: ArrayLike<number>; values: ArrayLike<number> }, fit: ResponseFit, peakInstant: number | null): Quantity | null {
  const { alpha, omega0, yPre, yFinal } = fit.params;
  const q = omega0 * omega0 - alpha * alpha;
  if (peakInstant === null || !(q > 0)) return null;
  const step = yFinal - yPre;
  const peak = parabolaPeak(trace.time, trace.values, peakInstant, PEAK_HALF_PHASE / Math.sqrt(q), step > 0 ? 1 : -1);
  if (!peak) return null;
  return quantity((100 * (peak.value - yFinal)) / step, (100 * peak.stderr) / Math.abs(step), '%');
}
