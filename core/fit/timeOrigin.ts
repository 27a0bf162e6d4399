// A trace whose time axis sits far from zero is fitted on times counted from its first sample, and its fit given back
// on the axis as it was: beside 1234.5 s a double holds a time to 2.3e-13 s, coarser than the steps the fit takes in t0
// (1e-6 / omega0: 3e-14 s for a 5 MHz ring), which then vanished: no uncertainty for t0, and alpha 1 % off.

import type { ResponseFit, ResponseFitOptions } from './responseFit';
import type { Trace } from './trace';

/**
 * The origin the fit counts time from: 0 for an axis that holds 0 or starts within one record span of it (an export
 * relative to its trigger, or to its first sample: answers as they always were), else the first finite time.
 */
export function fitOrigin(time: ArrayLike<number>): number {
  let i = 0;
  while (i < time.length && !Number.isFinite(time[i])) i++;
  let k = time.length - 1;
  while (k > i && !Number.isFinite(time[k])) k--;
  const first = time[i];
  const last = time[k];
  if (!(last > first) || (first <= 0 && last >= 0)) return 0;
  return Math.min(Math.abs(first), Math.abs(last)) <= last - first ? 0 : first;
}

/** The trace with `origin` taken from every time (exact: the times lie within a factor 2 of it). */
export function rebasedTrace(trace: Trace, origin: number): Trace {
  const time = new Float64Array(trace.time.length);
  for (let i = 0; i < time.length; i++) time[i] = trace.time[i] - origin;
  return { ...trace, time };
}

/** The options' window with `origin` taken from its ends. */
export function rebasedOptions(options: ResponseFitOptions, origin: number): ResponseFitOptions {
  const window = options.window ?? {};
  const shift = (t: number | undefined) => (t === undefined ? undefined : t - origin);
  return { ...options, window: { start: shift(window.start), end: shift(window.end) } };
}

/** The fit's times (the event time, the window) back on the axis that starts at `origin`. */
export function restoredFit(fit: ResponseFit, origin: number): ResponseFit {
  return {
    ...fit,
    t0: { ...fit.t0, value: fit.t0.value + origin },
    params: { ...fit.params, t0: fit.params.t0 + origin },
    window: { start: fit.window.start + origin, end: fit.window.end + origin },
  };
}
