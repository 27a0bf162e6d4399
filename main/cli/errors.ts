// The one place that turns a failure into a one-line message and an exit code for the command line.

import { basename } from 'node:path';
import { InputError, describeFailure } from '../../core/inputError';
import { escapeControls } from '../../core/report/escape';

/** Exit codes of every command; `failure` is also a fit that did not converge (fitSucceeded, core/report/fitSummary.ts). */
export const EXIT = { ok: 0, failure: 1, badInput: 2, outOfTolerance: 3 } as const;

/** Bad input (any InputError) exits 2; anything else is a failure of ours. */
export function exitCodeFor(error: unknown): number {
  return describeFailure(error).input ? EXIT.badInput : EXIT.failure;
}

/**
 * Options as the reading and fitting modules name them (the same for every face) and the command-line flags
 * that set them: a message on the command line names the flag.
 */
const FLAG_OF: Record<string, string> = {
  sampleInterval: '--sample-interval',
  sortTime: '--sort-time',
  timeUnit: '--time-unit',
  valueUnit: '--value-unit',
  jumpStart: '--jump-start',
  probeC: '--probe-c',
};
/**
 * 'option sampleInterval', 'the sampleInterval option', 'options.probeC' or the bare name; never a quoted name,
 * which is the file's own (a column called 'sortTime').
 */
const INTERNAL_OPTION = new RegExp(`(?:the )?(?:option |options\\.)?(?<!['"])\\b(${Object.keys(FLAG_OF).join('|')})\\b(?!['"])(?: option)?`, 'g');
/** The fit window as the fit names it, heading its message (after a file's name): set by --from and --to. */
const WINDOW_FIELD = /(^|: )window: /;

/** A message with internal option names replaced by their flags. */
function inFlags(message: string): string {
  return message.replace(WINDOW_FIELD, '$1--from/--to: ').replace(INTERNAL_OPTION, (_, name: string) => FLAG_OF[name]);
}

/** One line for the terminal: no stack, the message in the command line's words, a line break in a name shown escaped. */
export function messageFor(error: unknown): string {
  const { input, text } = describeFailure(error);
  if (input) return escapeControls(inFlags((error as Error).message));
  return `internal error: ${escapeControls(text)}`;
}

/**
 * Runs what reads one input file (a capture, a design). Bad input read from it that does not name the file
 * already (a header, a line, a field, an option the file cannot satisfy) is given the file's name in front,
 * as it was typed, so that of several files the message says which one.
 */
export function namingFile<T>(file: string, read: () => T): T {
  try {
    return read();
  } catch (error) {
    if (!(error instanceof InputError) || error.message.includes(basename(file))) throw error;
    throw new InputError(`${file}: ${error.message}`, error.about);
  }
}
