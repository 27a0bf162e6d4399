// Parses a typed value such as '470n', '470 nF', '2.2uH', '4k7', '2R2' or '1e-6' into SI base units.

import { InputError } from '../inputError';

import { PREFIX_EXPONENT, canonicalUnit } from './prefixes';
import { printable } from './unitText';

/** Characters of a value a message quotes: a value is a few characters, and a file may hold a line of megabytes. */
const QUOTED_LENGTH = 60;

/** A value as a message quotes it: its first QUOTED_LENGTH characters (then '...'), control characters escaped. */
export function quotedValue(text: string): string {
  return `'${printable(text.length > QUOTED_LENGTH ? `${text.slice(0, QUOTED_LENGTH)}...` : text)}'`;
}

/** Text that is not a valid value: the message quotes the text and says what was expected. */
export class UnitError extends InputError {
  readonly text: string;
  constructor(text: string, expected: string) {
    super(`${quotedValue(text)} is not a valid value: expected ${expected}`, text);
    this.name = 'UnitError';
    this.text = text;
  }
}

const PLAIN = /^([+-]?(?:\d+\.?\d*|\.\d+))(?:[eE]([+-]?\d+))?\s*(.*)$/;
// '4k7' = 4.7e3, '4n7' = 4.7e-9, '2R2' = 2.2 and 'R47' = 0.47 (R as the decimal point, for resistances).
const INFIX = /^([+-]?)(\d*)([fpnu\u00b5\u03bcmkMGR])(\d+)\s*(.*)$/;

function describe(unit: string | undefined): string {
  const suffix = unit === undefined ? 'an optional unit' : `optionally the unit ${unit}`;
  return `a number (e.g. 470n, 4k7, 1.5e-3) with an optional SI prefix (f p n u µ m k M G) and ${suffix}`;
}

function matchesUnit(text: string, unit: string | undefined): boolean {
  if ((unit === undefined || unit === 'ohm') && text === 'R') return true;
  const canonical = canonicalUnit(text);
  return canonical !== null && (unit === undefined || canonical === unit);
}

/** Power of ten of the text after the number ('' | prefix | unit | prefix + unit); null when it does not fit. */
function suffixExponent(suffix: string, unit: string | undefined, prefixAllowed: boolean): number | null {
  if (suffix === '' || matchesUnit(suffix, unit)) return 0;
  const exponent = prefixAllowed ? PREFIX_EXPONENT[suffix[0]] : undefined;
  if (exponent === undefined) return null;
  const rest = suffix.slice(1);
  return rest === '' || matchesUnit(rest, unit) ? exponent : null;
}

/**
 * A value in SI base units. `unit` is the internal unit the text may carry ('F', 'H', 'ohm', 'V', 'A', 's', 'Hz');
 * without it any known unit suffix is accepted. Throws UnitError for empty text, NaN, infinities and trailing junk.
 */
export function parseQuantityText(text: string, unit?: string): number {
  const fail = (): never => {
    throw new UnitError(text, describe(unit));
  };
  const trimmed = text.trim();
  const infix = INFIX.exec(trimmed);
  let mantissa: string;
  let exponent: number;
  let suffix: string;
  let prefixAllowed = true;
  if (infix && (infix[3] === 'R' ? unit === undefined || unit === 'ohm' : infix[2] !== '')) {
    const [, sign, whole, letter, fraction, rest] = infix;
    mantissa = `${sign}${whole || '0'}.${fraction}`;
    exponent = letter === 'R' ? 0 : PREFIX_EXPONENT[letter];
    suffix = rest;
    prefixAllowed = false;
  } else {
    const plain = PLAIN.exec(trimmed);
    if (!plain) return fail();
    mantissa = plain[1];
    exponent = plain[2] === undefined ? 0 : Number(plain[2]);
    suffix = plain[3];
  }
  const scale = suffixExponent(suffix, unit, prefixAllowed);
  if (scale === null) return fail();
  const value = Number(`${mantissa}e${exponent + scale}`);
  if (!Number.isFinite(value)) fail();
  return value;
}
