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
  /** Forced number of ringing modes, 1 to 3 (default: chosen from the data, modeOrder.ts). */
  modes?: number;
  /** Forced: the ring rides on a first-order (exponential) term; only together with `modes`. Default false when forced. */
  slowTerm?: boolean;
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
  /**
   * True when the fit window holds no samples before the event (the record or the window starts inside the
   * response): t0 is then the first fitted sample and preLevel the model's value there, not a level before an
   * event, so nothing that needs the step's start (its level, its instant, the step metrics) is measured.
   */
  startsInResponse?: boolean;
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
  /**
   * One entry per ringing mode, the dominant one (largest energyShare) first; with several, the top-level
   * alpha, omega0, omegaD, zeta and Q are those of modes[0]. Empty for a single decay, no response or a failure.
   */
  modes: ResponseMode[];
  /** A ring on an exponential: the first-order term's time constant and its amplitude at t0. */
  slowTerm?: { tau: Quantity; amplitude: Quantity };
  /** How the number of modes was chosen: every model tried with its criterion; null where no ring was fitted. */
  modelOrder: ModelOrder | null;
  /**
   * The terms of a model with several modes or a slow term, for drawing each one (modeContributions.ts);
   * absent when `params` is the whole model.
   */
  modeTerms?: ModeTerms;
}

/** One ringing mode of the response. */
export interface ResponseMode {
  alpha: Quantity;
  omega0: Quantity;
  omegaD: Quantity | null;
  zeta: Quantity;
  Q: Quantity;
  /** The mode's envelope at t0, in the trace's unit. */
  amplitude: Quantity;
  /** The mode's share (0..1) of the response's energy over the fit window after t0. */
  energyShare: number;
}

/** The comparison of the models tried for the number of modes. */
export interface ModelOrder {
  /** The information criterion that ranked the rows ('BIC'). */
  criterion: string;
  /** True when the order was given (options.modes), not chosen. */
  forced: boolean;
  /** One line: why the chosen order won. */
  reason: string;
  table: ModelOrderRow[];
}

export interface ModelOrderRow {
  /** In words: 'one ringing mode', 'two ringing modes', 'one ringing mode on an exponential'... */
  model: string;
  ringingModes: number;
  slowTerm: boolean;
  /** Fitted parameters, the levels and t0 (where fitted) included. */
  parameters: number;
  /** Residual sum of squares, trace unit squared. */
  sse: number;
  /** The criterion's value (lower is better). */
  criterion: number;
  chosen: boolean;
}

/**
 * The fitted terms after t0, each e^(-alpha tau) (a C(tau) + b S(tau)) as in ResponseParams (tau = t - t0),
 * and the slow term amplitude e^(-rate tau).
 */
export interface ModeTerms {
  rings: { alpha: number; omega0: number; a: number; b: number }[];
  slow: { rate: number; amplitude: number } | null;
}
