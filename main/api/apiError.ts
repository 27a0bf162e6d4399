// A bench API call that could not be carried out: the message says what, in plain words.

import { InputError } from '../../core/inputError';

export class BenchApiError extends InputError {
  constructor(message: string) {
    super(message);
    this.name = 'BenchApiError';
  }
}
