// The options and the result of a response fit (fitResponse), shared by the steps that build it.

import type { Quantity } from '../quantity';
import type { ResponseParams } from '../response/secondOrder';
import type { FitStatus } from './types';

export interface ResponseFitOptions {
  /** Fit window in s (default: from the detected event, or the record start, to the record end). */
  window?: { start?: number; end?: number };
  /**
   * Whether the measured quantity is continuous at the event: 'free' when it may jump there (a
   * capacitor's current, an inductor's voltage). Default 'auto': continuous unless the samples after the
   * event jump by far more than the noise and the free start explains them better.
   */
  continuity?: Continuity | 'auto';
}

export type Continuity = 'continuous' | 'free';

/** 'first-order' for a single decay (tau, no ring); 'none' where no response was fitted. */
export type Regime = 'underdamped' | 'critically damped' | 'overdamped' | 'first-order' | 'none';

export interface ResponseFit {
  status: FitStatus;
  message: string;
  regime: Regime;
  regimeEvidence: string;
  alpha: Quantity;
  omega0: Quantity;
  omegaD: Quantity | null;
  zeta: Quantity;
  Q: Quantity;
  /**
   * Time constant of a first-order response (regime 'first-order'), s; absent otherwise. A first-order
   * fit has no ring: its alpha, omega0, zeta and Q are NaN with no standard error (not applicable).
   */
  tau?: Quantity;
  /** True when the fit let the response jump at the event (stated, or found in the data). */
  jumpStart?: boolean;
  finalValue: Quantity;
  t0: Quantity;
  preLevel: Quantity;
  params: ResponseParams;
  correlation: { names: string[]; matrix: number[][] } | null;
  rmsResidual: number;
  noiseRms: number;
  samplesUsed: number;
  window: { start: number; end: number };
  iterations: number;
  decimation: { factor: number; note: string } | null;
  warnings: string[];
}
