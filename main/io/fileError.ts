// A file that could not be read or written: the message names its path.

import { InputError } from '../../core/inputError';

export class FileError extends InputError {
  constructor(message: string, path: string | null = null) {
    super(message, path);
    this.name = 'FileError';
  }
}
