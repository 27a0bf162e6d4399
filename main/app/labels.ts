// The labels a person types for a bench log record: unit under test and operator.

import { UsageError } from '../../core/inputError';

/** A unit id, operator name: 1 to 100 characters, no line breaks or control characters. */
export function checkLabel(text: string, option: string): string {
  const value = text.trim();
  if (value === '') throw new UsageError(`${option} must not be empty`);
  if (value.length > 100) throw new UsageError(`${option} must be at most 100 characters, got ${value.length}`);
  if (/[\u0000-\u001f\u007f]/.test(value)) throw new UsageError(`${option} must not contain line breaks or control characters`);
  return value;
}
