// The error thrown for invalid input to the circuit computations: it names the offending field.

export class CircuitInputError extends Error {
  /** Path of the offending input ('known.value', 'measurements[1].frequency', 'options.probeC'). */
  readonly field: string;
  constructor(field: string, problem: string) {
    super(`${field}: ${problem}`);
    this.name = 'CircuitInputError';
    this.field = field;
  }
}
