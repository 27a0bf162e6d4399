// Engineering-notation display of values and of measured values with their uncertainty.

import { relativeUncertainty, type Quantity } from '../quantity';
import { DISPLAY_PREFIX, displayUnit } from './prefixes';

const MIN_EXPONENT = -15;
const MAX_EXPONENT = 9;
/**
 * A standard error under this share of its value is rounding in the arithmetic, not a measurement's (a double
 * resolves 2.2e-16 of a value): a fit of a noise-free flat line gave 1.000000000000000666 mV ± 0.000021 fV.
 */
const ROUNDING_SHARE = 8 * Number.EPSILON;
/** Significant digits a double holds for certain. */
const DOUBLE_DIGITS = 15;
/** Units shown without SI prefixes. */
const UNPREFIXED = new Set(['', '%', 'dB', 'deg']);

function join(number: string, prefix: string, unit: string): string {
  const symbol = prefix + displayUnit(unit);
  return symbol === '' ? number : `${number} ${symbol}`;
}

function engineeringExponent(magnitude: number): number {
  const exponent = Math.floor(Math.log10(magnitude) / 3) * 3;
  return Math.min(MAX_EXPONENT, Math.max(MIN_EXPONENT, exponent));
}

/** A plain number with `digits` significant digits, trailing zeros dropped; exponent form outside [1e-3, 1e6). */
function formatPlain(value: number, digits: number): string {
  const magnitude = Math.abs(value);
  if (magnitude === 0 || (magnitude >= 1e-3 && magnitude < 1e6)) return String(Number(value.toPrecision(digits)));
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  return `${String(Number(mantissa))}e${Number(exponent)}`;
}

/** `value` (SI base units) with an SI prefix and `digits` significant digits: '470 nF', '2.2 µH', '10 kΩ'. */
export function formatEngineering(value: number, unit: string, digits = 4): string {
  if (!Number.isFinite(value)) return join(String(value), '', unit);
  if (UNPREFIXED.has(unit)) return join(formatPlain(value, digits), '', unit);
  if (value === 0) return join('0', '', unit);
  if (Math.abs(value) < 10 ** MIN_EXPONENT || Math.abs(value) >= 10 ** (MAX_EXPONENT + 3)) {
    return join(formatPlain(value, digits), '', unit);
  }
  let exponent = engineeringExponent(Math.abs(value));
  let mantissa = Number((value / 10 ** exponent).toPrecision(digits));
  if (Math.abs(mantissa) >= 1000 && exponent < MAX_EXPONENT) {
    exponent += 3;
    mantissa = Number((value / 10 ** exponent).toPrecision(digits));
  }
  return join(String(mantissa), DISPLAY_PREFIX[exponent], unit);
}

/**
 * 'start to end' in seconds, each to the digits that tell the two apart: '-1 µs to 7 µs', and on an axis far from
 * zero (a logger's seconds since its start) '1234.499999 s to 1234.500007 s', not '1.234 ks to 1.235 ks'.
 */
export function formatTimeRange(start: number, end: number): string {
  const digits = rangeDigits(start, end);
  const at = (t: number) => (digits > 4 ? join(formatPlain(t, digits), '', 's') : formatEngineering(t, 's'));
  return `${at(start)} to ${at(end)}`;
}

/**
 * Significant digits that tell the ends of a range apart to `digits` digits of its span: `digits` for a range near
 * zero, more for one far from it (at most the 15 a double holds).
 */
export function rangeDigits(start: number, end: number, digits = 4): number {
  const span = Math.abs(end - start);
  const far = Math.max(Math.abs(start), Math.abs(end));
  return span > 0 && far > span ? Math.min(DOUBLE_DIGITS, digits + Math.ceil(Math.log10(far / span))) : digits;
}

/** Exactly two significant digits (trailing zeros kept), with its own prefix: '13 s^-1', '1.0 µs'. */
function formatUncertainty(stderr: number, unit: string): string {
  const twoDigits = (x: number): string => {
    const text = x.toPrecision(2);
    return text.includes('e') ? formatPlain(x, 2) : text;
  };
  if (UNPREFIXED.has(unit)) return join(twoDigits(stderr), '', unit);
  let exponent = engineeringExponent(stderr);
  if (Number((stderr / 10 ** exponent).toPrecision(2)) >= 1000 && exponent < MAX_EXPONENT) exponent += 3;
  return join(twoDigits(stderr / 10 ** exponent), DISPLAY_PREFIX[exponent], unit);
}

/** The value rounded to the last digit of its two-digit uncertainty, in engineering notation. */
function formatRoundedValue(value: number, place: number, unit: string): string {
  const rounded = Math.round(value / 10 ** place) * 10 ** place;
  if (UNPREFIXED.has(unit)) {
    const decimals = Math.min(20, Math.max(0, -place));
    return join(rounded.toFixed(decimals), '', unit);
  }
  const exponent = rounded === 0 ? engineeringExponent(10 ** (place + 1)) : engineeringExponent(Math.abs(rounded));
  const decimals = Math.min(20, Math.max(0, exponent - place));
  return join((rounded / 10 ** exponent).toFixed(decimals), DISPLAY_PREFIX[exponent], unit);
}

/**
 * 'value ± stderr (relative %)', e.g. '12.183 ks^-1 ± 13 s^-1 (0.11 %)': the uncertainty to two significant
 * digits and the value to the same decimal place; 'value (uncertainty not estimable)' when stderr is null; no
 * relative part where relativeUncertainty gives none (a value within two standard uncertainties of zero).
 */
export function formatMeasured(q: Quantity): string {
  const text = formatWithUncertainty(q);
  const share = q.stderr === 0 || atRounding(q) ? null : relativeUncertainty(q);
  return share === null ? text : `${text} (${formatPlain(100 * share, 2)} %)`;
}

/** 'value ± stderr' without the relative uncertainty (for a difference, where it says little). */
export function formatWithUncertainty(q: Quantity): string {
  if (q.stderr === null || !Number.isFinite(q.stderr)) {
    return `${formatEngineering(q.value, q.unit)} (uncertainty not estimable)`;
  }
  if (!Number.isFinite(q.value)) return `${formatEngineering(q.value, q.unit)} ± ${formatEngineering(q.stderr, q.unit)}`;
  if (q.stderr === 0) return `${formatEngineering(q.value, q.unit)} ± 0 (exact)`;
  if (atRounding(q)) return `${formatEngineering(q.value, q.unit, DOUBLE_DIGITS)} ± 0 (to rounding)`;
  const place = Math.floor(Math.log10(q.stderr)) - 1;
  return `${formatRoundedValue(q.value, place, q.unit)} ± ${formatUncertainty(q.stderr, q.unit)}`;
}

/** Whether the standard error is within the rounding of the value (ROUNDING_SHARE). */
function atRounding(q: Quantity): boolean {
  return q.stderr !== null && q.stderr < Math.abs(q.value) * ROUNDING_SHARE;
}
