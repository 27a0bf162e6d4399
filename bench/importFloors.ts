// The references for import time: the fastest loop that turns a two-column CSV's bytes into numbers, and a plain split loop.

import { closeSync, openSync, readFileSync, readSync } from 'node:fs';

const CHUNK = 1 << 20;
const POW10 = Float64Array.from({ length: 617 }, (_, i) => 10 ** (i - 308));

/** Position after the number parse() last read. */
let cursor = 0;

/** One number at bytes[at...] (sign, digits, point, exponent; nothing is checked). Sets `cursor` past it. */
function parse(bytes: Uint8Array, at: number): number {
  let i = at;
  let c = bytes[i];
  const negative = c === 45;
  if (negative || c === 43) c = bytes[++i];
  let mantissa = 0;
  let scale = 0;
  while (c >= 48 && c <= 57) {
    mantissa = mantissa * 10 + (c - 48);
    c = bytes[++i];
  }
  if (c === 46) {
    c = bytes[++i];
    while (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      scale--;
      c = bytes[++i];
    }
  }
  if (c === 101 || c === 69) {
    c = bytes[++i];
    const down = c === 45;
    if (down || c === 43) c = bytes[++i];
    let e = 0;
    while (c >= 48 && c <= 57) {
      e = e * 10 + (c - 48);
      c = bytes[++i];
    }
    scale += down ? -e : e;
  }
  cursor = i;
  const magnitude = scale >= -308 && scale <= 308 ? mantissa * POW10[scale + 308] : mantissa * 10 ** scale;
  return negative ? -magnitude : magnitude;
}

/**
 * Reads every line after the first as `number,number` into two arrays of `rows` entries, 1 MB at a
 * time (a partial last line is carried to the next read). No validation: this is the speed limit of
 * turning bytes into numbers in this process, not an importer.
 */
export function parseFloor(path: string, rows: number): { time: Float64Array; values: Float64Array; rows: number } {
  const time = new Float64Array(rows);
  const values = new Float64Array(rows);
  const buffer = Buffer.allocUnsafe(CHUNK);
  const fd = openSync(path, 'r');
  let row = -1;
  let carried = 0;
  try {
    for (;;) {
      const read = readSync(fd, buffer, carried, CHUNK - carried, null);
      const end = carried + read;
      if (end === 0) break;
      if (read === 0 && end < CHUNK) buffer[end] = 10;
      // Complete lines only; at the end of the file the last line is complete without its LF.
      let last = end - 1;
      if (read > 0) while (last >= 0 && buffer[last] !== 10) last--;
      let i = 0;
      while (i <= last) {
        if (row >= 0 && row < rows) {
          time[row] = parse(buffer, i);
          values[row] = parse(buffer, cursor + 1);
          i = cursor;
        }
        while (i <= last && buffer[i] !== 10) i++;
        row++;
        i++;
      }
      carried = end - (last + 1);
      buffer.copy(buffer, 0, last + 1, end);
      if (read === 0) break;
    }
  } finally {
    closeSync(fd);
  }
  return { time, values, rows: Math.min(Math.max(row, 0), rows) };
}

/**
 * What a quick script does: read the whole text, split it into lines and cells, call Number and parseFloat
 * (the reference the importer's old unit test timed against). Returns a checksum so nothing is optimised away.
 */
export function splitLoop(path: string): number {
  const lines = readFileSync(path, 'utf8').split('\n');
  let sum = 0;
  for (let i = 1; i < lines.length; i++) {
    const cells = lines[i].split(',');
    if (cells.length < 2) continue;
    sum += Number(cells[0]) + parseFloat(cells[1]);
  }
  return sum;
}
