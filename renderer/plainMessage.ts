// Turns any failure into words for the window: the message of our own input errors, never a stack.

import { describeFailure } from '../core/inputError';
import { inWindowTerms } from './windowTerms';

export function plainMessage(error: unknown): string {
  const { input, text } = describeFailure(error);
  return input ? inWindowTerms(text) : `something went wrong: ${text}`;
}
