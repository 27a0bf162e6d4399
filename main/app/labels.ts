// The labels a person types for a bench log record: unit under test, operator, station, and the free note.

import { UsageError } from '../../core/inputError';

/**
 * Bidirectional controls (embeddings, overrides, isolates, marks): a unit id written with one shows
 * reversed in a window or a report ("SN042" read as "240NS"), so a label that holds one is refused.
 */
const BIDI_CONTROLS = /[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/;
/** Control characters a note may not hold: all but the line feed and the tab a typed paragraph has. */
const NOTE_CONTROLS = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;
/** Longest note kept: a paragraph, not a file pasted by mistake. */
const MAX_NOTE = 2000;

/** A unit id, operator name or station: 1 to 100 characters, no line breaks, control or bidirectional characters. */
export function checkLabel(text: string, option: string): string {
  const value = text.trim();
  if (value === '') throw new UsageError(`${option} must not be empty`);
  if (value.length > 100) throw new UsageError(`${option} must be at most 100 characters, got ${value.length}`);
  if (/[\u0000-\u001f\u007f-\u009f]/.test(value)) throw new UsageError(`${option} must not contain line breaks or control characters`);
  if (BIDI_CONTROLS.test(value)) throw new UsageError(`${option} must not contain bidirectional control characters (they show the text reversed)`);
  return value;
}

/** A free note: null when blank; up to MAX_NOTE characters, line breaks and tabs allowed, no other control or bidirectional characters. */
export function checkNote(text: string, option: string): string | null {
  const value = text.trim();
  if (value === '') return null;
  if (value.length > MAX_NOTE) throw new UsageError(`${option} must be at most ${MAX_NOTE} characters, got ${value.length}`);
  if (NOTE_CONTROLS.test(value)) throw new UsageError(`${option} must not contain control characters other than line breaks and tabs`);
  if (BIDI_CONTROLS.test(value)) throw new UsageError(`${option} must not contain bidirectional control characters (they show the text reversed)`);
  return value;
}

/** The test conditions typed for every record (`log add`, `batch --log`), each checked as above and named by its flag. */
export function checkConditions(typed: { operator?: string; station?: string; note?: string }): { operator: string | null; station: string | null; note: string | null } {
  return {
    operator: typed.operator === undefined ? null : checkLabel(typed.operator, '--operator'),
    station: typed.station === undefined ? null : checkLabel(typed.station, '--station'),
    note: typed.note === undefined ? null : checkNote(typed.note, '--note'),
  };
}
