// Export habits a layout recognises: sample-count columns, timing stated in the header, numbered time columns, one decimal-comma column.

import { slowCellValue } from './cellValue';
import type { DataShape } from './dataShape';
import { readPreamble, type Preamble } from './preamble';

/** A single cell holding a number among its words ('Sample interval,2e-6', 'Increment 2e-6'): metadata, no name. */
export function statesANumber(cell: string): boolean {
  return /[:=]\s*\S/.test(cell) || cell.split(/[\s,;]+/).some((word) => word !== '' && slowCellValue(word, false) !== null);
}

/** Names of a column that counts samples rather than measuring anything. */
export const INDEX_NAME = /^(?:index|idx|samples?|sample ?(?:no|nr|number|#)|no|nr|#|points?|pt|seq|sequence|counter)\.?$/i;
/** A column of free text by its name ('Comment', as a data logger heads its last column): never read as a channel. */
export const TEXT_NAME = /^(?:comments?|notes?|remarks?|annotations?)$/i;
/** Fewest digits after a decimal comma for '0,123' to be read as one number rather than two columns (fixed decimals). */
const FIXED_DECIMALS = 3;
/** A whole number as counters and converter codes are written. */
const WHOLE_NUMBER = /^[-+]?\d+$/;
/** Relative spread of steps allowed for the first rows of a column to read as a time axis (as timeAxis allows). */
const EVEN_STEP_TOLERANCE = 0.01;

/** True when the cells are whole numbers counting up by one (a sample index or sequence number). */
export function countsUp(cells: (string | undefined)[]): boolean {
  if (!cells.every((c) => c !== undefined && WHOLE_NUMBER.test(c.trim()))) return false;
  return cells.every((c, k) => k === 0 || Number(c) === Number(cells[k - 1]) + 1);
}

/** True when the cells are numbers increasing strictly. */
export function increases(cells: (string | undefined)[], decimalComma: boolean): boolean {
  const values = cells.map((c) => (c === undefined ? null : slowCellValue(c, decimalComma)));
  return values.every((v, k) => v !== null && !Number.isNaN(v) && (k === 0 || v > (values[k - 1] as number)));
}

/**
 * Rows such as '0,125' that split at the comma into a whole number and a run of fixed decimals, under a line with
 * no comma: one column written with decimal commas, when a name stands above it or the numbers show it (a whole
 * part of 0, or decimals opening with 0, which whole numbers never do). A whole number counting up stays two columns.
 */
export function oneColumnWithDecimalCommas(shapes: DataShape[], above: string | undefined): boolean {
  if (shapes[0].delimiter !== ',' || shapes.some((s) => s.cells.length !== 2) || above?.includes(',')) return false;
  const wholes = shapes.map((s) => s.cells[0].trim());
  const decimals = shapes.map((s) => s.cells[1].trim());
  if (!wholes.every((w) => WHOLE_NUMBER.test(w)) || !decimals.every((d) => /^\d+$/.test(d))) return false;
  if (!decimals.every((d) => d.length === decimals[0].length) || decimals[0].length < FIXED_DECIMALS || countsUp(wholes)) return false;
  const named = above !== undefined && !statesANumber(above);
  return named || wholes.some((w) => /^[-+]?0$/.test(w)) || decimals.some((d) => d.startsWith('0'));
}

/** A time column's name numbered for the channel beside it ('t1', 'X2', 'T_3'). */
const NUMBERED_TIME = /^[tx][\s_-]?\d{1,2}$/i;

/**
 * Columns named as numbered times ('t1,CH1,t2,CH2', 'x1,y1,x2,y2'), in a header that names no column time otherwise:
 * time columns, each paired with the channel after it, when followed by a column of another name and stepping evenly
 * in the first rows (a temperature logger's 'T1,T2' stays channels).
 */
export function numberedTimeColumns(names: string[], stepsEvenly: (c: number) => boolean): Set<number> {
  const found = new Set<number>();
  names.forEach((name, c) => {
    const next = names[c + 1]?.trim() ?? '';
    if (NUMBERED_TIME.test(name.trim()) && next !== '' && !NUMBERED_TIME.test(next) && stepsEvenly(c)) found.add(c);
  });
  return found;
}

/** True when the cells are numbers in equal steps (to 1 % of a step), as a time column's first rows are. */
export function evenSteps(cells: (string | undefined)[], decimalComma: boolean): boolean {
  const values = cells.map((c) => (c === undefined ? NaN : (slowCellValue(c, decimalComma) ?? NaN)));
  const step = values[1] - values[0];
  return step > 0 && values.every((v, k) => k === 0 || Math.abs(v - values[k - 1] - step) <= EVEN_STEP_TOLERANCE * step);
}

export interface HeaderTiming {
  timing: Preamble;
  /** Columns that only hold the stated timing. */
  cells: Set<number>;
}

/** Start time and increment stated in header cells ('Start = -1e-5') or under the header names in the row below. */
export function headerTiming(headings: string[], below: string[] | null, line: number, decimalComma: boolean): HeaderTiming {
  const cells = new Set<number>();
  const timing: Preamble = { metadata: {}, interval: null, offset: null, timeUnit: null, valueUnit: null, warnings: [] };
  headings.forEach((heading, c) => {
    const text = /[:=]/.test(heading) ? heading : below?.[c] ? `${heading}: ${below[c]}` : null;
    if (text === null) return;
    const stated = readPreamble([{ text, line }], '', decimalComma);
    if (stated.interval === null && stated.offset === null) return;
    cells.add(c);
    timing.interval ??= stated.interval;
    timing.offset ??= stated.offset;
  });
  return { timing, cells };
}
