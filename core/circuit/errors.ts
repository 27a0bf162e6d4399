// The error thrown for invalid input to the circuit computations: it names the offending field.

import { InputError } from '../inputError';

export class CircuitInputError extends InputError {
  /** Path of the offending input ('known.value', 'measurements[1].frequency', 'options.probeC'). */
  readonly field: string;
  constructor(field: string, problem: string) {
    super(`${field}: ${problem}`, field);
    this.name = 'CircuitInputError';
    this.field = field;
  }
}
