// What a capture may hold (line length, columns, fewest samples), and the checks that refuse more before it is decoded, split or stored.

import { CaptureError } from './types';

/**
 * Longest line read, in characters (bytes on the byte path): a row of 1,000 columns of 20-character numbers is
 * 21 kB, so 1 MiB is far beyond any scope's row, and a longer line is refused before it is split into cells.
 */
export const MAX_LINE_LENGTH = 1 << 20;
/**
 * Most columns a table may have: a capture is a few channels with their time columns, and 1,000 still leaves room for
 * every segment of a segmented record exported side by side; a wider file is some other table.
 */
export const MAX_COLUMNS = 1000;
/** Fewest usable samples a channel (and a segment) needs to be kept. */
export const MIN_SAMPLES = 20;
const LF = 10;
const CR = 13;

/** The error for line `line`, longer than MAX_LINE_LENGTH. */
export function lineTooLong(line: number): CaptureError {
  return new CaptureError(`the line is longer than ${MAX_LINE_LENGTH} characters, far longer than any row of a capture`, line);
}

/** Throws when a table of `count` columns (found on line `line`) is wider than MAX_COLUMNS. */
export function checkColumnCount(count: number, line: number): void {
  if (count > MAX_COLUMNS) throw new CaptureError(`the table has ${count} columns, more than the ${MAX_COLUMNS} a capture can hold`, line);
}

/**
 * Throws when the last line of bytes[from, to) is too long (`to` is just after an LF); in a piece of the head only
 * the last line can be (the others lie within its first HEAD_BYTES), and every line is checked again as text.
 * `firstLine` is the number of the line starting at `from`.
 */
export function checkLastLine(bytes: Uint8Array, from: number, to: number, firstLine: number): void {
  if (to - from <= MAX_LINE_LENGTH) return;
  const start = Math.max(from, bytes.lastIndexOf(LF, to - 2) + 1);
  if (to - 1 - start > MAX_LINE_LENGTH) throw lineTooLong(firstLine + countOf(bytes, LF, from, start));
}

/**
 * Throws when the unfinished line after `complete` (just after the last LF) is already too long; lines there may
 * end in a lone CR. `nextLine` is the number of the line starting at `complete`.
 */
export function checkUnfinishedLine(bytes: Uint8Array, complete: number, nextLine: number): void {
  if (bytes.length - complete <= MAX_LINE_LENGTH) return;
  const start = complete + bytes.subarray(complete).lastIndexOf(CR) + 1;
  if (bytes.length - start > MAX_LINE_LENGTH) throw lineTooLong(nextLine + countOf(bytes, CR, complete, start));
}

function countOf(bytes: Uint8Array, byte: number, from: number, to: number): number {
  let count = 0;
  for (let at = bytes.indexOf(byte, from); at >= 0 && at < to; at = bytes.indexOf(byte, at + 1)) count++;
  return count;
}
