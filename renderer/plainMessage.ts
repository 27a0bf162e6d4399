// Turns any failure into words for the window: the message of our own input errors, never a stack.

/** Error types whose message already says, in plain words, what was wrong and where. */
const INPUT_ERRORS = new Set(['CaptureError', 'FitInputError', 'UnitError', 'CircuitInputError', 'DesignError', 'LogError', 'CautionInputError', 'BenchError']);

export function plainMessage(error: unknown): string {
  if (error instanceof Error) {
    const first = error.message.split('\n')[0];
    return INPUT_ERRORS.has(error.name) ? first : `something went wrong: ${first}`;
  }
  return `something went wrong: ${String(error)}`;
}
