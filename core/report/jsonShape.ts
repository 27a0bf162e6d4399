// The small checks of JSON values that the record and import-summary checks share.

export type Json = Record<string, unknown>;

/** Longest unit id, operator, label, heading or reason accepted: a bench label, never a document. */
export const MAX_TEXT = 2000;
/** Longest warning or message accepted: a warning quotes lines of the capture file, so it may run longer than a label. */
export const MAX_WARNING = 10 * MAX_TEXT;

export function isObject(value: unknown): value is Json {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Text without NUL of at most `max` characters. */
export function isText(value: unknown, max = MAX_TEXT): value is string {
  return typeof value === 'string' && value.length <= max && !value.includes('\0');
}

export function isCount(value: unknown): boolean {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0;
}
