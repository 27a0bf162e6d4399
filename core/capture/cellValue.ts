// Reading one cell: a fast exact path for plain decimal numbers, and the rules for missing or junk cells.

const POW10 = Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));
const MAX_EXACT_DIGITS = 15;
/**
 * The smallest mantissa of more than MAX_EXACT_DIGITS significant digits: a mantissa read digit by digit (leading
 * zeros adding nothing) has more exactly when it reaches this, even where the reading has stopped being exact.
 */
const MANTISSA_LIMIT = 1e15;
/** Most digits an exponent may have on the fast path. */
const MAX_EXPONENT_DIGITS = 5;
/** Magnitude at or above which a value is a scope's overrange marker (9.9E37 is the usual one; common practice). */
export const OVERRANGE = 9.9e37;

/**
 * The number in text[start, end) when it is a plain decimal (optional sign, digits, one decimal separator,
 * optional exponent, surrounding spaces) whose value is exact in a double; NaN when the slow path must decide.
 * Exactness: at most 15 significant digits and a power of ten up to 22 make one correctly rounded operation.
 */
export function fastNumber(text: string, start: number, end: number, decimalCode: number): number {
  let i = start;
  let c = 0;
  while (i < end && ((c = text.charCodeAt(i)) === 32 || c === 9)) i++;
  while (end > i && ((c = text.charCodeAt(end - 1)) === 32 || c === 9)) end--;
  if (i === end) return NaN;
  let negative = false;
  c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    negative = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let seen = false;
  let exponent = 0;
  for (; i < end; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) break;
    seen = true;
    if (mantissa !== 0 || d !== 0) {
      mantissa = mantissa * 10 + d;
      digits++;
    }
  }
  if (i < end && text.charCodeAt(i) === decimalCode) {
    for (i++; i < end; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d < 0 || d > 9) break;
      seen = true;
      exponent--;
      if (mantissa !== 0 || d !== 0) {
        mantissa = mantissa * 10 + d;
        digits++;
      }
    }
  }
  if (!seen || digits > MAX_EXACT_DIGITS) return NaN;
  if (i < end) {
    c = text.charCodeAt(i);
    if (c !== 101 && c !== 69) return NaN;
    i++;
    let expNegative = false;
    c = text.charCodeAt(i);
    if (c === 45 || c === 43) {
      expNegative = c === 45;
      i++;
    }
    let written = 0;
    let expDigits = 0;
    for (; i < end; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d < 0 || d > 9 || expDigits > 4) return NaN;
      written = written * 10 + d;
      expDigits++;
    }
    if (expDigits === 0) return NaN;
    exponent += expNegative ? -written : written;
  }
  return composeNumber(mantissa, exponent, negative ? -1 : 1, ONE_VALUE, 0) ? ONE_VALUE[0] : NaN;
}

/**
 * fastNumber over UTF-8 bytes, straight into column[row]: reads from a cell's first byte after its leading spaces up
 * to the first byte that cannot continue the number, and returns where it stopped. When only spaces and tabs follow
 * it in the cell, what it stores is fastNumber's value for that cell; where fastNumber gives NaN it stores nothing
 * and returns NOT_PLAIN. An LF must follow `start`; the decimal separator must not be the cell delimiter.
 * Kept small enough for the compiler to inline into the row loop (a larger function is called for every cell).
 */
export function storeLeadingNumber(bytes: Uint8Array, start: number, decimalCode: number, column: Float64Array, row: number): number {
  // Signs are read without a branch of their own: a file's first negative number then costs no recompilation.
  let c = bytes[start];
  const sign = c === 45 ? -1 : 1;
  const integerStart = start + (c === 45 || c === 43 ? 1 : 0);
  let i = integerStart;
  let mantissa = 0;
  let d = 0;
  while ((d = bytes[i] - 48) >= 0 && d <= 9) {
    mantissa = mantissa * 10 + d;
    i++;
  }
  let written = i - integerStart;
  let exponent = 0;
  if (bytes[i] === decimalCode) {
    const fractionStart = ++i;
    while ((d = bytes[i] - 48) >= 0 && d <= 9) {
      mantissa = mantissa * 10 + d;
      i++;
    }
    exponent = fractionStart - i;
    written -= exponent;
  }
  if (written === 0 || mantissa >= MANTISSA_LIMIT) return NOT_PLAIN;
  if ((c = bytes[i]) === 101 || c === 69) {
    c = bytes[++i];
    const exponentSign = c === 45 ? -1 : 1;
    i += c === 45 || c === 43 ? 1 : 0;
    const exponentStart = i;
    let power = 0;
    while ((d = bytes[i] - 48) >= 0 && d <= 9) {
      power = power * 10 + d;
      i++;
    }
    if (i === exponentStart || i - exponentStart > MAX_EXPONENT_DIGITS) return NOT_PLAIN;
    exponent += exponentSign * power;
  }
  return composeNumber(mantissa, exponent, sign, column, row) ? i : NOT_PLAIN;
}

/** storeLeadingNumber's answer when the slow path must decide. */
export const NOT_PLAIN = -1;

/** Cells that hold no sample: missing, or beyond the converter's range ('∞', as some scope software writes overrange). */
const MISSING = new Set(['', 'nan', '-nan', '+nan', 'inf', '-inf', '+inf', 'infinity', '-infinity', '+infinity', '\u221e', '-\u221e', '+\u221e', '\u2212\u221e', 'null', 'none', 'n/a', 'na', 'over', 'under', 'overrange', 'ovf', 'clip', '?']);
const STARS = /^\*+$/;
/** A run of dashes ('----'): how some exports fill a cell they have no sample for. */
const DASHES = /^-+$/;
const HEX = /^[+-]?0[xob]/i;
/** U+2212 MINUS SIGN: what typeset exports (spreadsheet locales, report tools) write for '-' in a number. */
const MINUS_SIGN = /\u2212/g;

/**
 * A cell the fast path did not take: its value, NaN for a missing or overrange cell (empty, NaN, inf, '****', '----',
 * |x| >= 9.9e37), or null for junk that is not a number. `decimalComma` lets '1,5' mean 1.5; a Unicode minus sign
 * (U+2212) reads as '-'.
 */
export function slowCellValue(cell: string, decimalComma: boolean): number | null {
  const text = cellText(cell);
  const lower = text.toLowerCase();
  if (MISSING.has(lower) || STARS.test(text) || DASHES.test(text)) return NaN;
  if (HEX.test(text)) return null;
  const normal = decimalComma && text.includes(',') && !text.includes('.') ? text.replace(',', '.') : text;
  const value = Number(normal);
  if (Number.isNaN(value)) return null;
  return Number.isFinite(value) && Math.abs(value) < OVERRANGE ? value : NaN;
}

/**
 * Whole numbers a comma or a point may group in threes ('1,234', '12.345.678'): they read two ways, as a grouped
 * whole number or with the mark as a decimal one, a factor of 1000 or more apart. A leading group never starts with
 * a zero, so '0.905' and '0,000' read one way only, with the mark as a decimal one.
 */
export const GROUPED_IN_THREES: Record<',' | '.', RegExp> = { ',': /^[+-]?[1-9]\d{0,2}(?:,\d{3})+$/, '.': /^[+-]?[1-9]\d{0,2}(?:\.\d{3})+$/ };

/** A cell's text as a number would be read from it: trimmed, unquoted, a Unicode minus sign (U+2212) as '-'. */
export function cellText(cell: string): string {
  let text = cell.trim();
  if (text.length >= 2 && text.startsWith('"') && text.endsWith('"')) text = text.slice(1, -1).trim();
  return text.replace(MINUS_SIGN, '-');
}

/**
 * A number written with digit groups: 1 to 3 digits, then groups of 3 after one separator (a comma, a point, an
 * apostrophe, or a space: plain, no-break, narrow no-break or thin), then decimals after the other mark
 * ('1,234.5', '1.234,5', '1 234,5', "1'234'567.8"). How spreadsheets and localised exports write thousands.
 */
const GROUPED = /^[+-]?\d{1,3}([,.'\u2019 \u00a0\u202f\u2009])\d{3}(?:\1\d{3})*(?:(?!\1)[.,]\d*)?$/;
/** Each separator GROUPED allows, in words. */
const SEPARATOR_NAMES: Record<string, string> = {
  ',': 'a comma',
  '.': 'a point',
  "'": 'an apostrophe',
  '\u2019': 'an apostrophe',
  ' ': 'a space',
  '\u00a0': 'a no-break space',
  '\u202f': 'a narrow no-break space',
  '\u2009': 'a thin space',
};

/**
 * Why a cell that is no number is not read, when it is a number written with digit groups (see GROUPED), in words
 * for an error message naming it; null for any other cell.
 */
export function groupingCause(cell: string): string | null {
  const match = GROUPED.exec(cellText(cell));
  if (match === null) return null;
  return `a number written with a thousands separator (${SEPARATOR_NAMES[match[1]]}); export the numbers without digit grouping`;
}

// Minutes and seconds of one digit too ('10:0:0.5'): some loggers write their stamps without padding.
const DATE_TIME =
  /^\d{1,4}[/.-]\d{1,2}[/.-]\d{1,4}(?:[ T]+|\s*,\s*)\d{1,2}:\d{1,2}(?::\d{1,2}(?:[.,]\d+)?)?(?:\s*[AP]M)?(?:Z|[+-]\d{2}:?\d{2})?$/i;
const TIME_OF_DAY = /^\d{1,2}:\d{1,2}:\d{1,2}(?:[.,]\d+)?(?:\s*[AP]M)?$/i;
/** A date alone, its year written in full: a logger's date column beside its time-of-day column. */
const DATE_ONLY = /^(?:\d{4}[/.-]\d{1,2}[/.-]\d{1,2}|\d{1,2}[/.-]\d{1,2}[/.-]\d{4})$/;

/** True for a wall-clock time stamp such as '5/26/2021  11:44:55.465797', '11:44:55.4' or a date alone, '2026-12-05'. */
export function isTimestamp(cell: string): boolean {
  const text = cell.trim();
  return DATE_TIME.test(text) || TIME_OF_DAY.test(text) || DATE_ONLY.test(text);
}

/** Where fastNumber has composeNumber put its value. */
const ONE_VALUE = new Float64Array(1);

/**
 * Stores sign x mantissa x 10^exponent in column[row] (sign 1 or -1), exact when both are exactly representable
 * (|exponent| <= 22, a mantissa of at most 15 digits): one correctly rounded multiplication or division. False,
 * storing nothing, outside that range or at overrange. (Storing, not returning, the double spares the hot loop a
 * boxed number per cell.)
 */
function composeNumber(mantissa: number, exponent: number, sign: number, column: Float64Array, row: number): boolean {
  let value = 0;
  if (mantissa !== 0) {
    if (exponent === 0) value = mantissa;
    else if (exponent < 0 && exponent >= -22) value = mantissa / POW10[-exponent];
    else if (exponent > 0 && exponent <= 22) value = mantissa * POW10[exponent];
    else return false;
    if (value >= OVERRANGE) return false;
  }
  column[row] = sign * value;
  return true;
}
