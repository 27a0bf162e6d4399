// One refined fit of one layout: the state the response fit's steps pass to each other.

import type { FitStatus } from './types';
import { LAYOUTS, type ParameterLayout } from './responseModel';

export interface Attempt {
  layout: ParameterLayout;
  /** Full parameter vector of the layout (its descriptor's `names` order). */
  values: number[];
  sse: number;
  status: FitStatus;
  message: string;
  iterations: number;
  warnings: string[];
}

/** One parameter of the attempt, by name. */
export function attemptValue(attempt: Attempt, name: string): number {
  return attempt.values[LAYOUTS[attempt.layout].index[name]];
}

/** The attempt's event time: fitted, or the start it was held at. */
export function attemptT0(attempt: Attempt, heldT0: number): number {
  return LAYOUTS[attempt.layout].fitsT0 ? attemptValue(attempt, 't0') : heldT0;
}
