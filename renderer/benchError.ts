// A failure the bench reported in words (from main, the server or a check in the window).

import { InputError } from '../core/inputError';

export class BenchError extends InputError {
  constructor(message: string) {
    super(message);
    this.name = 'BenchError';
  }
}

export function unwrap<T>(result: { ok: true; value: T } | { ok: false; error: string }): T {
  if (!result.ok) throw new BenchError(result.error);
  return result.value;
}
