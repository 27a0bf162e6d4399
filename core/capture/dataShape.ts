// Recognises a row of numbers and the delimiter it uses, before the layout of the file is known.

import { cellText, GROUPED_IN_THREES, groupingCause, isTimestamp, slowCellValue } from './cellValue';
import { isBlankOrComment } from './preamble';
import { readUnitText } from '../units/unitText';
import { WHITESPACE, splitLine } from './splitLine';

export interface DataShape {
  /** ',', ';', '\t', ' ' (runs of whitespace), or '' when the line holds one cell and no delimiter. */
  delimiter: string;
  /** Cells as split, trailing empty ones included. */
  cells: string[];
  /** A cell used ',' as the decimal separator. */
  decimalComma: boolean;
}

/** Tried in this order; the one giving the most cells wins, ties going to the earlier. */
const CANDIDATES = ['\t', ';', ',', WHITESPACE];

function judge(cells: string[], delimiter: string): DataShape | null {
  let numbers = 0;
  /** A comma no grouping explains ('0,5', '0,000', '1,000000'), one that could group thousands ('1,234', '1,000'), a point no grouping explains ('1.5', '1.0E-08'). */
  let commaMarksDecimals = false;
  let commaMayGroup = false;
  let pointMarksDecimals = false;
  for (const cell of cells) {
    // A ',' inside a cell of a comma-separated line can only come from a quoted field.
    const value = slowCellValue(cell, delimiter !== ',' || cell.includes(','));
    if (value === null) {
      if (!isTimestamp(cell)) return null;
    } else if (!Number.isNaN(value)) {
      numbers++;
      const text = cellText(cell);
      if (text.includes(',')) {
        if (GROUPED_IN_THREES[','].test(text)) commaMayGroup = true;
        else commaMarksDecimals = true;
      }
      if (text.includes('.') && !GROUPED_IN_THREES['.'].test(text)) pointMarksDecimals = true;
    }
  }
  // '0,000;1,000' is a row of decimal commas; in '1.5e-08,"1,234"' the point marks decimals and the comma may group.
  const decimalComma = commaMarksDecimals || (commaMayGroup && !pointMarksDecimals);
  return numbers > 0 ? { delimiter, cells, decimalComma } : null;
}

/** The shape of `text` when it is a row of numbers (missing-value markers and time stamps allowed), else null. */
export function dataShape(text: string): DataShape | null {
  if (isBlankOrComment(text)) return emptyFirstField(text);
  let best: DataShape | null = null;
  for (const delimiter of CANDIDATES) {
    const present = delimiter === WHITESPACE ? /\S\s+\S/.test(text.trim()) : text.includes(delimiter);
    if (!present) continue;
    const shape = judge(splitLine(text, delimiter), delimiter);
    if (shape && (!best || shape.cells.length > best.cells.length)) best = shape;
  }
  return best ?? judge([text], '');
}

/** Numbers needed on a ';'-led line for it to be a row opening with an empty field rather than a comment. */
const NUMBERS_AFTER_EMPTY_FIELD = 2;

/** A ';'-separated row opening with an empty field (';-1e-5;0.8'), which would otherwise read as a comment; else null. */
function emptyFirstField(text: string): DataShape | null {
  if (!text.trimStart().startsWith(';')) return null;
  const shape = judge(splitLine(text, ';'), ';');
  const numbers = shape ? shape.cells.filter((c) => !Number.isNaN(slowCellValue(c, true) ?? NaN)).length : 0;
  return numbers >= NUMBERS_AFTER_EMPTY_FIELD ? shape : null;
}

/** Two rows belong to the same table when they split the same way into the same number of cells. */
export function sameShape(a: DataShape, b: DataShape): boolean {
  return a.delimiter === b.delimiter && a.cells.length === b.cells.length;
}

/**
 * The first cell written with digit groups ('1,234.5', see groupingCause) of a line split at `delimiter` whose other
 * cells are numbers, missing-value markers or time stamps: a row of data the reader cannot take; else null.
 */
export function groupedCell(text: string, delimiter: string): string | null {
  let grouped: string | null = null;
  for (const cell of splitLine(text, delimiter)) {
    if (slowCellValue(cell, delimiter !== ',' || cell.includes(',')) !== null || isTimestamp(cell)) continue;
    if (groupingCause(cell) === null) return null;
    grouped ??= cell;
  }
  return grouped;
}

/** groupedCell for a line whose delimiter is not known: the first of the candidates that finds one. */
export function groupedCellAnyDelimiter(text: string): string | null {
  for (const delimiter of CANDIDATES) {
    const cell = groupedCell(text, delimiter);
    if (cell !== null) return cell;
  }
  return null;
}

/**
 * A number at the start of a cell, then what may follow it as a unit ('-1.0000us', '0.35 mV'). Two patterns matched in
 * turn, neither able to backtrack over the other's part: as one, a long cell of digits took time quadratic in its length.
 */
const LEADING_NUMBER = /^\s*"?[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?/;
const UNIT_AFTER = /^\s*([^\s\d.,;"+-][^\s\d;"]*)"?\s*$/;

/** The unit written after a number in a cell, or undefined when the cell is not a number followed by a unit-shaped word. */
function unitAfterNumber(cell: string): string | undefined {
  const number = LEADING_NUMBER.exec(cell);
  return number ? UNIT_AFTER.exec(cell.slice(number[0].length))?.[1] : undefined;
}

/**
 * The first cell of a line, split at any of the candidate delimiters, that is a number with a unit read as known written
 * after it, when every cell of that split is one or a number: a row of data whose cells carry their units, which the
 * reader does not take; else null.
 */
export function unitSuffixedCell(text: string): string | null {
  for (const delimiter of CANDIDATES) {
    const cells = splitLine(text, delimiter).filter((c) => c.trim() !== '');
    if (cells.length < 2 && delimiter !== WHITESPACE) continue;
    let found: string | null = null;
    const allRead = cells.every((cell) => {
      const unit = unitAfterNumber(cell);
      if (unit === undefined) return slowCellValue(cell, true) !== null;
      if (readUnitText(unit).kind !== 'known') return false;
      found ??= cell;
      return true;
    });
    if (allRead && found !== null) return found;
  }
  return null;
}

/** A cell that opens as a number does: a sign (the Unicode minus too) or not, then a digit or a point and a digit. */
const NUMBER_OPENING = /^\s*[-+\u2212]?(\d|[.,]\d)/;

/**
 * The first cell of a line of cells (two or more, over half of them opening as numbers) that opens as a number but
 * does not read as one (a Fortran 'D' exponent, a stray letter), for a message on a file with no rows of numbers;
 * null when there is none.
 */
export function unreadableNumberCell(text: string): string | null {
  for (const delimiter of CANDIDATES) {
    const cells = splitLine(text, delimiter).filter((c) => c.trim() !== '');
    if (cells.length < 2) continue;
    const opening = cells.filter((cell) => NUMBER_OPENING.test(cell));
    if (2 * opening.length <= cells.length) continue;
    const unread = opening.find((cell) => slowCellValue(cell, true) === null && !isTimestamp(cell));
    if (unread !== undefined) return unread;
  }
  return null;
}
