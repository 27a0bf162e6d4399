// A fit (and optional components) as the plain JSON summary every face of the program shows.

import type { ResponseFit } from '../fit/fitResponse';
import type { Quantity } from '../quantity';
import type { ResponseParams } from '../response/secondOrder';
import type { TransitionSummary } from '../circuit/transitionSummary';
import type { ImportSummary } from '../capture/importSummary';
import type { EventTrainSummary } from './eventTrainSummary';
import type { FitStatus } from '../fit/types';

export interface ComponentSet {
  R: Quantity;
  L: Quantity;
  C: Quantity;
}

/** Which ringing mode R, L and C were derived for, when the fit has several: 1-based, of how many, at what f0. */
export interface ComponentMode {
  index: number;
  of: number;
  f0: Quantity;
}

export interface FitSummary {
  file: string;
  channel: string;
  status: ResponseFit['status'];
  message: string;
  /** The damping regime and why; absent when the fit failed (see fitSucceeded). */
  regime?: ResponseFit['regime'];
  regimeEvidence?: string;
  alpha: Quantity;
  omega0: Quantity;
  omegaD?: Quantity;
  zeta: Quantity;
  Q: Quantity;
  /** Time constant of a first-order response, s; absent for a second-order one. */
  tau?: Quantity;
  finalValue: Quantity;
  t0: Quantity;
  /** The fitted level before the event; absent when the fit saw none (startsInResponse) or failed. Absent in older records. */
  preLevel?: Quantity;
  /** True when the fit window holds no samples before the event (ResponseFit.startsInResponse). */
  startsInResponse?: boolean;
  /** `mode` is given when the fit has several ringing modes (--mode, default the dominant one). */
  components?: ComponentSet & { topology: string; known: string; mode?: ComponentMode };
  /**
   * One entry per ringing mode, the dominant first (its rates are the top-level ones); [] without a ring.
   * Absent in records logged before modes were fitted.
   */
  modes?: ResponseFit['modes'];
  /** A ring on an exponential: the slow term's time constant and amplitude at t0. */
  slowTerm?: ResponseFit['slowTerm'];
  /** The orders tried, their criterion, and why the chosen one won; null without a ring. Absent in older records. */
  modelOrder?: ResponseFit['modelOrder'];
  rmsResidual: number;
  noiseRms: number;
  samplesUsed: number;
  window: { start: number; end: number };
  decimation: ResponseFit['decimation'];
  correlation: ResponseFit['correlation'];
  /** The fitted model itself, for drawing it again (with several modes or a slow term, its t0 and levels; see modeTerms). */
  params: ResponseParams;
  /** The terms of a model with several modes or a slow term, to draw it again whole (fittedModel.ts); absent when params is the model. */
  modeTerms?: ResponseFit['modeTerms'];
  warnings: string[];
  /** Rise time, overshoot, peak and settling times of a step, from the samples and from the fitted model. */
  transitions?: TransitionSummary;
  /** What the importer inferred from the capture file (absent where the capture did not come through the importer). */
  import?: ImportSummary;
  /** Present when the record holds several events (a square wave or a pulse train): each, the one fitted above, and their combination. */
  events?: EventTrainSummary;
}

/**
 * The one rule every face applies: only a converged fit is an answer. Any other status (the iteration
 * limit, a failure, no response found) is a failed fit: exit 1, no verdict, no regime.
 */
export function fitSucceeded(fit: { status: FitStatus }): boolean {
  return fit.status === 'converged';
}

/**
 * The fit's event time, s, or null when it saw no samples before its event: its t0 is then only where it starts, and
 * nothing that needs the event (the design's prediction) is placed there.
 */
export function eventTimeOf(fit: Pick<FitSummary, 't0' | 'startsInResponse'>): number | null {
  return fit.startsInResponse ? null : fit.t0.value;
}

/** Every warning the fit's text shows, the transition metrics' last. */
export function fitWarnings(s: Pick<FitSummary, 'warnings' | 'transitions'>): string[] {
  return [...s.warnings, ...(s.transitions?.warnings ?? []).map((w) => `transitions: ${w}`)];
}

export function summarizeFit(
  file: string,
  channel: string,
  fit: ResponseFit,
  components?: FitSummary['components'],
  extraWarnings: string[] = [],
): FitSummary {
  const summary: FitSummary = {
    file,
    channel,
    status: fit.status,
    message: fit.message,
    ...(fitSucceeded(fit) ? { regime: fit.regime, regimeEvidence: fit.regimeEvidence } : {}),
    alpha: fit.alpha,
    omega0: fit.omega0,
    zeta: fit.zeta,
    Q: fit.Q,
    finalValue: fit.finalValue,
    t0: fit.t0,
    ...(fit.startsInResponse ? { startsInResponse: true } : fitSucceeded(fit) ? { preLevel: fit.preLevel } : {}),
    rmsResidual: fit.rmsResidual,
    noiseRms: fit.noiseRms,
    samplesUsed: fit.samplesUsed,
    window: fit.window,
    decimation: fit.decimation,
    correlation: fit.correlation,
    params: fit.params,
    warnings: [...extraWarnings, ...fit.warnings],
  };
  if (fit.omegaD) summary.omegaD = fit.omegaD;
  if (fit.tau) summary.tau = fit.tau;
  summary.modes = fit.modes;
  if (fit.slowTerm) summary.slowTerm = fit.slowTerm;
  summary.modelOrder = fit.modelOrder;
  if (fit.modeTerms) summary.modeTerms = fit.modeTerms;
  if (components) summary.components = components;
  return summary;
}
