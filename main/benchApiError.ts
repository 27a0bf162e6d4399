// A bench API call that could not be carried out: the message says what, in plain words.

export class BenchApiError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BenchApiError';
  }
}
