// Moves a converged ring's event time by whole half periods when that fits better (a sign-flipped twin minimum).

import { solveAmplitudes, Workspace } from './amplitudes';
import type { FitSet } from './fitSet';
import { attemptValue, type Attempt } from './attempt';
import { refine } from './refine';

/** How many half ring periods either way the event time is tried at once a layout has converged. */
const HALF_PERIOD_SHIFTS = 4;

/**
 * A lightly damped ring fits almost as well with its start moved by half a period and its sign turned
 * over; in noise the solver keeps whichever of these minima lies nearest its start. The residual is
 * compared at t0 moved by 1 to 4 half periods each way, and the fit refined from a shift that does better.
 */
export function shiftByHalfPeriods(set: FitSet, attempt: Attempt): Attempt {
  const alpha = attemptValue(attempt, 'alpha');
  const omega0 = attemptValue(attempt, 'omega0');
  const t0 = attemptValue(attempt, 't0');
  if (!(omega0 > alpha)) return attempt;
  const halfPeriod = Math.PI / Math.sqrt(omega0 * omega0 - alpha * alpha);
  const workspace = new Workspace(set.time.length);
  let bestShift = 0;
  let bestSse = attempt.sse;
  for (let k = -HALF_PERIOD_SHIFTS; k <= HALF_PERIOD_SHIFTS; k++) {
    const shifted = t0 + k * halfPeriod;
    if (k === 0 || shifted <= set.time[0] || shifted >= set.time[set.time.length - 1]) continue;
    const { sse } = solveAmplitudes(attempt.layout, set.time, set.values, alpha, omega0, shifted, workspace, set.block);
    if (sse < bestSse) {
      bestSse = sse;
      bestShift = k;
    }
  }
  if (bestShift === 0) return attempt;
  const refined = refine(set, attempt.layout, { alpha, omega0, source: 'shifted by half periods' }, t0 + bestShift * halfPeriod);
  return refined.sse < attempt.sse ? refined : attempt;
}
