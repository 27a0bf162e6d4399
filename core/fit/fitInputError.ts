// The error thrown for invalid input to a fit: names the argument or option and, where it applies, the index.

import { InputError } from '../inputError';

export class FitInputError extends InputError {
  /** What was wrong, as the caller spells it: 'data.y', 'initial', 'options.max'. */
  readonly field: string;
  /** The offending element, when one element is to blame. */
  readonly index: number | null;
  constructor(field: string, message: string, index: number | null = null) {
    super(`${index === null ? field : `${field}[${index}]`}: ${message}`, field);
    this.name = 'FitInputError';
    this.field = field;
    this.index = index;
  }
}
