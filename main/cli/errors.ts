// The one place that turns a failure into a one-line message and an exit code for the command line.

import { describeFailure } from '../../core/inputError';

/** Exit codes of every command; `failure` is also a fit that did not converge (fitSucceeded, core/report/fitSummary.ts). */
export const EXIT = { ok: 0, failure: 1, badInput: 2, outOfTolerance: 3 } as const;

/** Bad input (any InputError) exits 2; anything else is a failure of ours. */
export function exitCodeFor(error: unknown): number {
  return describeFailure(error).input ? EXIT.badInput : EXIT.failure;
}

/** One line for the terminal: no stack, the message as the module wrote it. */
export function messageFor(error: unknown): string {
  const { input, text } = describeFailure(error);
  return input ? text : `internal error: ${text}`;
}
