// The one reader of unit text written beside numbers in a capture ('us', 'nS', 'mSec', 'microseconds', 'min', 'mV', 'kΩ').

import { UsageError } from '../inputError';
import { PREFIX_EXPONENT, canonicalUnit } from './prefixes';

/** What a unit text says: a known unit with its scale to SI, a spelling with two readings, or nothing known. */
export type UnitReading =
  | { kind: 'known'; scale: number; unit: string }
  | { kind: 'ambiguous'; meanings: string }
  | { kind: 'unknown' };

/** A unit a person states for a time column, a stated interval or a channel: as written, with its SI scale and unit. */
export interface StatedUnit {
  text: string;
  scale: number;
  unit: string;
}

/** The internal unit of time. */
export const TIME_UNIT = 's';

/**
 * Seconds, volts and amperes as people type them, in any case ('S', 'Sec', 'VOLTS'); other units keep their exact
 * spelling (prefixes.ts), since case tells 'mHz' from 'MHz' there.
 */
const LOOSE_UNITS: Readonly<Record<string, string>> = {
  s: 's',
  sec: 's',
  secs: 's',
  second: 's',
  seconds: 's',
  v: 'V',
  volt: 'V',
  volts: 'V',
  a: 'A',
  amp: 'A',
  amps: 'A',
  ampere: 'A',
  amperes: 'A',
};

/**
 * Minutes, hours and days, the units of time outside the SI accepted for use with it (SI Brochure, 9th edition, 2019,
 * table 8), as a slow logger heads its time column: any case, except that one letter must be lower case ('H' is the henry).
 */
const LONG_TIME_SECONDS: Readonly<Record<string, number>> = {
  min: 60,
  mins: 60,
  minute: 60,
  minutes: 60,
  h: 3600,
  hr: 3600,
  hrs: 3600,
  hour: 3600,
  hours: 3600,
  d: 86400,
  day: 86400,
  days: 86400,
};

/** The symbol of each of those units by its seconds, to write a column read in one ('min', not '60 s'). */
export const LONG_TIME_SYMBOL: Readonly<Record<number, string>> = { 60: 'min', 3600: 'h', 86400: 'd' };

/** Prefixes spelt out, any case. */
const PREFIX_WORDS: Readonly<Record<string, number>> = {
  femto: -15,
  pico: -12,
  nano: -9,
  micro: -6,
  milli: -3,
  kilo: 3,
  mega: 6,
  giga: 9,
};

/** Why an 'M' before a unit of time is refused: a scope means milliseconds, SI says megaseconds. */
const AMBIGUOUS_TIME = 'ms (milliseconds) or Ms (megaseconds)';

/** Bracketed text holding a digit or a space is a label ('CH1', 'Channel 2', '10x probe'), not a unit. */
const LABEL_TEXT = /[\d\s]/;

/** True for bracketed text meant as a unit, which must then read as one: anything but a label. */
export function isUnitAttempt(text: string): boolean {
  const token = text.trim();
  return token !== '' && !LABEL_TEXT.test(token);
}

/** SI scale of a power of ten, exact for the prefixes ('1e-6' rather than 10 ** -6). */
function scaleOf(exponent: number): number {
  return Number(`1e${exponent}`);
}

/** A table's own entry for a key, never one inherited from Object ('constructor' is a header's text, not a unit). */
function ownEntry<T>(table: Readonly<Record<string, T>>, key: string): T | undefined {
  return Object.hasOwn(table, key) ? table[key] : undefined;
}

/** The unit of a loose spelling after its prefix, or null. */
function looseUnit(rest: string): string | null {
  return ownEntry(LOOSE_UNITS, rest.toLowerCase()) ?? null;
}

/** Reads the unit text of a column header, a units row or a stated interval; '' is not passed (no unit). */
export function readUnitText(text: string): UnitReading {
  const token = text.trim();
  const lower = token.toLowerCase();
  if (token.length > 1 && token[0] === 'M' && looseUnit(token.slice(1)) === TIME_UNIT) return { kind: 'ambiguous', meanings: AMBIGUOUS_TIME };
  const whole = canonicalUnit(token) ?? looseUnit(token);
  if (whole !== null) return { kind: 'known', scale: 1, unit: whole };
  const long = ownEntry(LONG_TIME_SECONDS, token.length === 1 ? token : lower);
  if (long !== undefined) return { kind: 'known', scale: long, unit: TIME_UNIT };
  for (const [word, exponent] of Object.entries(PREFIX_WORDS)) {
    const unit = lower.startsWith(word) ? looseUnit(lower.slice(word.length)) : null;
    if (unit !== null) return { kind: 'known', scale: scaleOf(exponent), unit };
  }
  const rest = token.slice(1);
  const exact = ownEntry(PREFIX_EXPONENT, token[0] ?? '');
  const exactUnit = canonicalUnit(rest);
  if (exact !== undefined && exactUnit !== null) return { kind: 'known', scale: scaleOf(exact), unit: exactUnit };
  // 'M' stays mega and 'm' milli; the other prefix letters in either case ('NS', 'KV', 'uS').
  const letter = token[0] === 'M' || token[0] === 'm' ? token[0] : token[0]?.toLowerCase();
  const exponent = letter === undefined ? undefined : ownEntry(PREFIX_EXPONENT, letter);
  const unit = looseUnit(rest);
  if (exponent !== undefined && unit !== null) return { kind: 'known', scale: scaleOf(exponent), unit };
  return { kind: 'unknown' };
}

/** Unit text fit to quote in a message: control characters written as \xHH (or \uHHHH). */
export function printable(text: string): string {
  return text.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, (c) => {
    const code = c.charCodeAt(0);
    return code < 0x100 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
  });
}

/** Why a unit text cannot be used, for a message: '' when it reads as a unit of the wanted kind. */
export function unitProblem(text: string, reading: UnitReading, wantTime: boolean): string {
  const quoted = `'${printable(text.trim())}'`;
  if (reading.kind === 'ambiguous') return `unit ${quoted} is ambiguous (${reading.meanings})`;
  if (reading.kind === 'unknown') return `unit ${quoted} is not recognised`;
  if (wantTime && reading.unit !== TIME_UNIT) return `unit ${quoted} is not a unit of time`;
  if (!wantTime && reading.unit === TIME_UNIT) return `unit ${quoted} is a unit of time, not of a channel`;
  return '';
}

/** A unit a person states (--time-unit us, --value-unit mV): read, or a UsageError naming the option. */
export function parseStatedUnit(text: string, wantTime: boolean, option: string): StatedUnit {
  const reading = readUnitText(text);
  const problem = text.trim() === '' ? 'no unit given' : unitProblem(text, reading, wantTime);
  if (problem !== '' || reading.kind !== 'known') {
    const expected = wantTime ? 's, ms, us, µs, ns, ps, min or h' : 'V, mV, µV, kV, A, mA or µA';
    throw new UsageError(`${option} '${printable(text)}': ${problem}; expected a unit such as ${expected}`, option);
  }
  return { text: text.trim(), scale: reading.scale, unit: reading.unit };
}
