// One corpus capture through the whole pipeline with no hints (import, first channel, fit), judged against its truth.

import { parseCapture } from '../core/capture/parseCapture';
import { selectChannel } from '../core/capture/selectChannel';
import { fitResponse, type ResponseFit } from '../core/fit/fitResponse';
import type { CorpusCapture, CorpusSpec, CorpusTruth } from './corpusCapture';

export interface CorpusOutcome {
  spec: CorpusSpec;
  success: boolean;
  /** The pipeline said something was off: a thrown input error, a status other than converged, or a warning. */
  flagged: boolean;
  /** Flagged only by routine notes (clipped samples left out, t0 not fitted), which say nothing about trust. */
  routineOnly: boolean;
  /** What failed the success test; empty on success. */
  reasons: string[];
  status: string;
  message: string;
  warnings: string[];
  /** Errors of the fit in its own standard errors, and of omega0 in percent (null without an estimate). */
  alphaSigmas: number | null;
  omega0Sigmas: number | null;
  omega0Percent: number | null;
  ms: number;
}

const ROUTINE = [/clipp/i, /^t0 was not fitted/];
/** Errors that are the pipeline's own refusals of bad input (anything else thrown is a crash). */
const REFUSALS = new Set(['CaptureError', 'FitInputError']);

function sigmas(estimate: number, stderr: number | null, truth: number): number | null {
  return stderr === null || !(stderr > 0) ? null : (estimate - truth) / stderr;
}

/**
 * Success: alpha and omega0 within 3 standard errors of the truth, and omega0 within 2 % when zeta < 1; a
 * single decay (an overdamped record whose fast root the data cannot show) must have tau within 3 standard
 * errors of the slowest time constant, 1 / (alpha - sqrt(alpha^2 - omega0^2)).
 */
export function judgeFit(fit: ResponseFit, truth: CorpusTruth): { reasons: string[]; alphaSigmas: number | null; omega0Sigmas: number | null; omega0Percent: number } {
  const reasons: string[] = [];
  if (fit.regime === 'first-order' && fit.tau) {
    const slowest = 1 / (truth.alpha - Math.sqrt(Math.max(0, truth.alpha ** 2 - truth.omega0 ** 2)));
    const tauSigmas = sigmas(fit.tau.value, fit.tau.stderr, slowest);
    if (truth.alpha < truth.omega0) reasons.push('a ring read as a single decay');
    if (tauSigmas === null) reasons.push('no uncertainty');
    else if (Math.abs(tauSigmas) > 3) reasons.push('tau beyond 3 se');
    return { reasons, alphaSigmas: null, omega0Sigmas: null, omega0Percent: NaN };
  }
  const alphaSigmas = sigmas(fit.alpha.value, fit.alpha.stderr, truth.alpha);
  const omega0Sigmas = sigmas(fit.omega0.value, fit.omega0.stderr, truth.omega0);
  const omega0Percent = (100 * (fit.omega0.value - truth.omega0)) / truth.omega0;
  if (fit.status === 'failed') reasons.push('failed status');
  if (alphaSigmas === null || omega0Sigmas === null) reasons.push('no uncertainty');
  if (alphaSigmas !== null && Math.abs(alphaSigmas) > 3) reasons.push('alpha beyond 3 se');
  if (omega0Sigmas !== null && Math.abs(omega0Sigmas) > 3) reasons.push('omega0 beyond 3 se');
  if (truth.alpha < truth.omega0 && !(Math.abs(omega0Percent) <= 2)) reasons.push('omega0 off by more than 2 %');
  return { reasons, alphaSigmas, omega0Sigmas, omega0Percent };
}

export function runCorpusCapture(capture: CorpusCapture): CorpusOutcome {
  const start = performance.now();
  const { spec, truth } = capture;
  let fit: ResponseFit;
  let importWarnings: string[];
  try {
    const parsed = parseCapture(capture.text);
    importWarnings = parsed.warnings;
    const channel = selectChannel(parsed);
    fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name });
  } catch (error) {
    const message = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    return {
      spec,
      success: false,
      flagged: error instanceof Error && REFUSALS.has(error.name),
      routineOnly: false,
      reasons: [`threw ${message}`],
      status: 'threw',
      message,
      warnings: [],
      alphaSigmas: null,
      omega0Sigmas: null,
      omega0Percent: null,
      ms: performance.now() - start,
    };
  }
  const judged = judgeFit(fit, truth);
  const warnings = [...importWarnings, ...fit.warnings];
  const flagged = fit.status !== 'converged' || warnings.length > 0;
  return {
    spec,
    success: judged.reasons.length === 0,
    flagged,
    routineOnly: fit.status === 'converged' && warnings.length > 0 && warnings.every((w) => ROUTINE.some((r) => r.test(w))),
    reasons: judged.reasons,
    status: fit.status,
    message: fit.message,
    warnings,
    alphaSigmas: judged.alphaSigmas,
    omega0Sigmas: judged.omega0Sigmas,
    omega0Percent: Number.isFinite(judged.omega0Percent) ? judged.omega0Percent : null,
    ms: performance.now() - start,
  };
}
