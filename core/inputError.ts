// The one base of every error that means "the input was wrong": every face shows its message as it is
// (one line on the command line with exit 2, { ok: false, error } over the bench API, a banner in the window).

export class InputError extends Error {
  /** What the error is about, as the module spells it: a field, option, file line or path; null when only the message says it. */
  readonly about: string | null;
  constructor(message: string, about: string | null = null) {
    super(message);
    this.name = 'InputError';
    this.about = about;
  }
}

/** A failure in words: bad input keeps its own first line; anything else is marked as not the user's doing. */
export interface FailureText {
  input: boolean;
  text: string;
}

export function describeFailure(error: unknown): FailureText {
  if (error instanceof Error) return { input: error instanceof InputError, text: error.message.split('\n')[0] };
  return { input: false, text: String(error) };
}

/** A value or a combination of options the user gave that cannot be used (an option, a form field). */
export class UsageError extends InputError {
  constructor(message: string, about: string | null = null) {
    super(message, about);
    this.name = 'UsageError';
  }
}
