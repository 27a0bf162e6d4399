// Several events in one record (a square wave or a pulse train driving the circuit): each ring fitted on
// its own window, one chosen as the measurement, and the complete ones combined with a test of their spread.

import type { Channel } from '../capture/types';
import { summarizeTransitions } from '../circuit/transitionSummary';
import { combineEstimates, type CombinedValue } from '../fit/eventCombination';
import { findEventTrain, MIN_TURNS, type EventSpan, type EventTrain } from '../fit/eventTrain';
import { fitResponse, type ResponseFit, type ResponseFitOptions } from '../fit/fitResponse';
import { FitInputError } from '../fit/fitInputError';
import { windowSpan } from '../fit/trace';
import { UsageError } from '../inputError';
import { quantity, type Quantity } from '../quantity';
import type { CombinedEstimate, EventEntry, EventTrainSummary } from '../report/eventTrainSummary';
import { summarizeFit, type FitSummary } from '../report/fitSummary';
import { residualBursts } from './residualBursts';
import { WHOLE_FIT_AGREEMENT, wholeFitExcess } from './wholeRecordFit';

export interface EventsRequest {
  file: string;
  channel: Channel;
  window?: { start?: number; end?: number };
  captureWarnings?: readonly string[];
  /** The event to report as the measurement, 1-based. Default: the first complete one that converged. */
  event?: number;
  /** Whether the quantity may jump at the event (a record of one event; an event's own fit starts inside its ring). */
  continuity?: ResponseFitOptions['continuity'];
  /** How many ringing modes to fit (see ResponseFitOptions). Default: chosen from the data. */
  modes?: number;
}

/** A ring seen for this many time constants before the next event is complete even if not yet in the noise (e^-3 = 5 %). */
const COMPLETE_TIME_CONSTANTS = 3;
/**
 * The combination is inconsistent when either spread (alpha's or omega0's) is this unlikely with the
 * stated errors: 1 % shared over the two tests, so honest errors are flagged once in a hundred records.
 */
const SPREAD_P_LIMIT = 0.005;
/** Events fitted at most (besides one asked for): a long record of a fast square wave holds hundreds, and each fit takes a while. */
const MAX_FITTED_EVENTS = 16;
const UNFITTED = `only the first ${MAX_FITTED_EVENTS} events are fitted (--event N fits another)`;
/** An event's fit leaving a residual this many times the noise is a misfit (white noise alone gives about 1). */
const MISFIT_RESIDUAL = 3;

/**
 * The fit of a channel, event by event when the record holds several. The default measurement is the
 * first complete event, not the combination: its fit is one model of one ring, so the plot, the fit window
 * and the residual describe what was fitted, and a changing circuit shows as events that disagree rather
 * than as one average; the combination (a tighter alpha and omega0, and the test that the events agree) is
 * reported beside it. An event's fit starts inside its response, so it has no step metrics. A record with
 * one event is fitted whole, as before; --event N beyond the events found is bad input.
 */
export function fitEvents(request: EventsRequest): { fit: ResponseFit; summary: FitSummary } {
  const { channel, file } = request;
  const trace = { time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name };
  const { first, spans, noise, ringPeriodRead } = eventsOf(channel, request.window ?? {});
  const count = Math.max(1, spans.length);
  if (request.event !== undefined && request.event > count) {
    throw new UsageError(`--event ${request.event}: the record holds ${count} event${count === 1 ? '' : 's'}`);
  }
  const fitWhole = () => fitResponse(trace, { window: request.window ?? {}, continuity: request.continuity, modes: request.modes });
  const measuredWhole = (whole: ResponseFit) => {
    const summary = summarizeFit(file, channel.name, whole, undefined, [...(request.captureWarnings ?? [])]);
    summary.transitions = summarizeTransitions(channel, whole);
    return { fit: whole, summary };
  };
  if (spans.length < 2) return measuredWhole(fitWhole());
  const fits = spans.map((span, i) => (i < MAX_FITTED_EVENTS || i + 1 === request.event ? fitSpan(trace, channel.time, first, span, noise, request.modes) : UNFITTED));
  // The search reads swings, and a ring's own swings can pass for events: a ring slower than its blocks where the record
  // turns too seldom to give a period, or a quantised one whose noise reads low. One response that fits the whole record
  // as an event's fit must, and each event's window as well as the event's own fit, is the answer; a real train leaves
  // it the rings it cannot follow.
  if (request.event === undefined) {
    const whole = fitWhole();
    const excess = whole.rmsResidual / noise;
    const worst = whole.status === 'converged' && excess <= MISFIT_RESIDUAL ? wholeFitExcess(whole, fits, trace) : null;
    if (worst !== null && worst <= WHOLE_FIT_AGREEMENT) {
      const note = `the ${spans.length} events the record's swings suggested are taken for one response${ringPeriodRead ? '' : ` (it turns fewer than ${MIN_TURNS} times)`}: one fits the whole record (its residual ${excess.toFixed(1)} times the noise, and at most ${worst.toFixed(2)} times each event's own fit in its window) (--event N fits one of the events)`;
      return measuredWhole({ ...whole, warnings: [...whole.warnings, note] });
    }
  }
  const list = spans.map((span, i) => entryOf(i + 1, span, fits[i], channel.time, first));
  const chosen = request.event ?? defaultEvent(list);
  const fit = fits[chosen - 1];
  if (typeof fit === 'string') throw new FitInputError('window', `event ${chosen} cannot be fitted: ${list[chosen - 1].message}`);
  const summary = summarizeFit(file, channel.name, fit, undefined, [...(request.captureWarnings ?? [])]);
  const events: EventTrainSummary = { chosen, chosenBy: request.event === undefined ? 'default' : 'request', list, ...combine(list) };
  summary.events = events;
  // No step metrics: the event's fit starts inside its response, so no level before it is known.
  return { fit, summary };
}

/** The events inside the window, in sample indices counted from `first`, the window's first sample. */
function eventsOf(channel: Channel, window: { start?: number; end?: number }): { first: number } & EventTrain {
  // A channel's time axis increases strictly, so the window's samples are found by bisection.
  const { from: first, to: last } = windowSpan(channel.time, window);
  return { first, ...findEventTrain(channel.values.subarray(first, last)) };
}

/**
 * The fit of one event's natural response, or why there is none (its window holds too few samples). A fit
 * leaving a residual of several times the record's noise (as the event search read it: a fit's own noise
 * estimate takes part of a ring for noise) has not found one ring, an event the search missed sharing its
 * window: it is no answer.
 */
function fitSpan(trace: Parameters<typeof fitResponse>[0], time: Float64Array, first: number, span: EventSpan, noise: number, modes?: number): ResponseFit | string {
  try {
    const fit = fitResponse(trace, { window: { start: time[first + span.start], end: time[first + span.end - 1] }, modes });
    const excess = fit.rmsResidual / noise;
    if (fit.status !== 'converged' || !(excess > MISFIT_RESIDUAL)) return fit;
    const bursts = residualBursts(fit, trace.time, trace.values);
    const where = bursts
      ? `${Math.round(100 * bursts.share)} % of it in ${bursts.samples} sample${bursts.samples === 1 ? '' : 's'} standing apart (glitches or pickup, wider than the single samples left out as spikes)`
      : "the window holds more than this event's ring";
    return { ...fit, status: 'failed', message: `the residual is ${excess.toFixed(1)} times the noise: ${where}` };
  } catch (error) {
    if (error instanceof FitInputError) return 'too few samples between this event and the next';
    throw error;
  }
}

function entryOf(index: number, span: EventSpan, fit: ResponseFit | string, time: Float64Array, first: number): EventEntry {
  const onset = time[first + span.onset];
  const end = time[first + span.end - 1];
  const converged = typeof fit !== 'string' && fit.status === 'converged';
  const longEnough = converged && fit.alpha.value * (end - onset) >= COMPLETE_TIME_CONSTANTS;
  return {
    index,
    onset,
    start: time[first + span.start],
    end,
    hasOnset: span.hasOnset,
    complete: span.hasOnset && (span.settledAtEnd || longEnough),
    status: typeof fit === 'string' ? 'not fitted' : fit.status,
    message: typeof fit === 'string' ? fit : fit.message,
    alpha: converged ? fit.alpha : null,
    omega0: converged ? fit.omega0 : null,
    zeta: converged ? fit.zeta : null,
    Q: converged ? fit.Q : null,
  };
}

/** The first complete event that converged; else the first that converged; else the first that was fitted. */
function defaultEvent(list: EventEntry[]): number {
  const pick =
    list.find((e) => e.complete && e.status === 'converged') ?? list.find((e) => e.status === 'converged') ?? list.find((e) => e.status !== 'not fitted') ?? list[0];
  return pick.index;
}

/** The weighted mean of the complete events that converged, with the chi-square of their spread. */
function combine(list: EventEntry[]): { combined: CombinedEstimate | null; combinedNote: string } {
  const used = list.filter((e) => e.complete && e.alpha && e.omega0);
  const alpha = combineEstimates(used.map((e) => e.alpha as Quantity));
  const omega0 = combineEstimates(used.map((e) => e.omega0 as Quantity));
  if (!alpha || !omega0) {
    return { combined: null, combinedNote: `not combined: ${used.length} complete event${used.length === 1 ? '' : 's'} with a converged fit and standard errors, two are needed` };
  }
  const worst = Math.min(alpha.pValue, omega0.pValue);
  const consistent = worst >= SPREAD_P_LIMIT;
  const zeta = ratio(alpha.value, omega0.value);
  const Q = quantity(1 / (2 * zeta.value), zeta.stderr === null ? null : zeta.stderr / (2 * zeta.value ** 2), '');
  return {
    combined: {
      status: consistent ? 'converged' : 'inconsistent',
      message: consistent
        ? 'the events agree within their stated errors'
        : `the events disagree by more than their stated errors allow (p ${worst.toPrecision(2)} < ${SPREAD_P_LIMIT}): the circuit changed between them or an event is misfitted; errors scaled by the spread`,
      events: used.map((e) => e.index),
      alpha: alpha.value,
      omega0: omega0.value,
      zeta,
      Q,
      consistency: { alpha: spreadOf(alpha), omega0: spreadOf(omega0), pLimit: SPREAD_P_LIMIT },
    },
    combinedNote: '',
  };
}

function spreadOf(c: CombinedValue) {
  return { chiSquare: c.chiSquare, dof: c.dof, pValue: c.pValue, scale: c.scale };
}

/** a / b with first-order error propagation (the events' alpha and omega0 are nearly uncorrelated in a ringdown fit). */
function ratio(a: Quantity, b: Quantity): Quantity {
  const value = a.value / b.value;
  const stderr = a.stderr === null || b.stderr === null ? null : Math.abs(value) * Math.hypot(a.stderr / a.value, b.stderr / b.value);
  return quantity(value, stderr, '');
}
