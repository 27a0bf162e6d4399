// The options and the result of a response fit (fitResponse), shared by the steps that build it.

import type { Quantity } from '../quantity';
import type { ResponseParams } from '../response/secondOrder';
import type { FitStatus } from './types';

export interface ResponseFitOptions {
  /** Fit window in s (default: from the detected event, or the record start, to the record end). */
  window?: { start?: number; end?: number };
  /** Whether the measured quantity is continuous at the event (default 'continuous'). */
  continuity?: Continuity;
}

export type Continuity = 'continuous' | 'free';

export type Regime = 'underdamped' | 'critically damped' | 'overdamped';

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
