// The one place that turns a failure into a one-line message and an exit code.

import { CaptureError } from '../../core/capture/types';

/** Exit codes of every command. */
export const EXIT = { ok: 0, failure: 1, badInput: 2, outOfTolerance: 3 } as const;

/** A wrong option, argument or value given on the command line. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** A file that could not be read or written, with its path. */
export class FileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FileError';
  }
}

/** Error names (set by each module's error class) that mean the input was bad: exit 2. */
const BAD_INPUT_NAMES = new Set(['UsageError', 'FileError', 'CaptureError', 'UnitError', 'DesignError', 'LogError', 'FitInputError', 'CircuitInputError']);

export function exitCodeFor(error: unknown): number {
  if (error instanceof CaptureError) return EXIT.badInput;
  if (error instanceof Error && BAD_INPUT_NAMES.has(error.name)) return EXIT.badInput;
  return EXIT.failure;
}

/** One line for the terminal: no stack, the message as the module wrote it. */
export function messageFor(error: unknown): string {
  if (error instanceof Error) {
    const known = BAD_INPUT_NAMES.has(error.name) || error instanceof CaptureError;
    const text = error.message.split('\n')[0];
    return known ? text : `internal error: ${text}`;
  }
  return `internal error: ${String(error)}`;
}
