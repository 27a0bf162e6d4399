// How far the fit on screen can be trusted: green only for a converged fit with nothing to doubt, never beside a failure.

import { fitSucceeded, type FitSummary } from '../core/report/fitSummary';
import type { SetupCheck } from '../core/circuit/setupTypes';
import { inWindowTerms } from './windowTerms';

/** ok: converged, no warning of its own; warn: converged with doubts; bad: the fit did not give a measurement. */
export type FitTone = 'ok' | 'warn' | 'bad';

export interface FitStanding {
  tone: FitTone;
  /** The badge's words. */
  label: string;
  /** The warnings about the fit itself (a misread unit, a residual above the noise...), most important first. */
  doubts: string[];
  /** The damping regime means something only for a converged fit. */
  showRegime: boolean;
}

/** The badge's words for each status other than converged; a status not listed here reads as itself, in red. */
const FAILED_WORDS: Readonly<Record<string, string>> = {
  'max-iterations': 'stopped at the iteration limit',
  failed: 'fit failed',
  'no-response': 'no second-order response found',
};

/** The badge when a setup check refuses the answer (the command line exits 1 for it). */
const REFUSED_WORDS = 'refused: the capture cannot support the answer';

/**
 * The standing of a fit. The summary's warnings hold the import's too (dropped rows, notes on units), which the
 * capture panel shows; those alone do not turn the badge amber. A setup check's refusal is a failure (red), its
 * warning a doubt (amber), as on the command line.
 */
export function fitStanding(summary: Pick<FitSummary, 'status' | 'warnings'>, importWarnings: readonly string[], setupChecks: readonly SetupCheck[] = []): FitStanding {
  const fromImport = new Set(importWarnings);
  const setupDoubts = setupChecks.filter((check) => check.level !== 'note').map((check) => check.message);
  const doubts = [...new Set([...setupDoubts, ...summary.warnings.filter((warning) => !fromImport.has(warning))])].map(inWindowTerms);
  if (!fitSucceeded(summary)) {
    return { tone: 'bad', label: FAILED_WORDS[summary.status] ?? summary.status, doubts, showRegime: false };
  }
  if (setupChecks.some((check) => check.level === 'refusal')) {
    return { tone: 'bad', label: REFUSED_WORDS, doubts, showRegime: false };
  }
  if (doubts.length > 0) {
    return { tone: 'warn', label: `converged, ${doubts.length} warning${doubts.length === 1 ? '' : 's'}`, doubts, showRegime: true };
  }
  return { tone: 'ok', label: 'converged', doubts, showRegime: true };
}
