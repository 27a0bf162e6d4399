// A file's last line without a line end, cut off mid-row (a copy or a write broken off): told by the cells it lacks.

import type { DataShape } from './dataShape';
import { splitLine, trimTrailingEmpty } from './splitLine';

/** The digits a number is written with: after its decimal separator, and in its exponent (-1 without one). */
export interface NumberFormat {
  decimals: number;
  exponent: number;
}

const NUMBER = /^[-+]?\d*(?:[.,](\d*))?(?:[eE][-+]?(\d*))?$/;

/** How a cell writes its number, or null when it is no plain number. */
function formatOf(cell: string): NumberFormat | null {
  const found = NUMBER.exec(cell.trim().replace(/^"(.*)"$/, '$1').trim());
  if (found === null || !/\d/.test(found[0])) return null;
  return { decimals: found[1]?.length ?? 0, exponent: found[2] === undefined ? -1 : found[2].length };
}

/** Per data cell, the format every one of the first data rows writes it in, or null where they differ. */
export function fixedFormats(shapes: DataShape[]): (NumberFormat | null)[] {
  const count = Math.max(...shapes.map((s) => trimTrailingEmpty(s.cells).length));
  return Array.from({ length: count }, (_, c) => {
    const formats = shapes.map((s) => formatOf(s.cells[c] ?? ''));
    const [first] = formats;
    const same = formats.every((f) => f !== null && first !== null && f.decimals === first.decimals && f.exponent === first.exponent);
    return same ? first : null;
  });
}

/**
 * Why the last line `text` (it has no line end) was cut off, or null when it reads as a whole row: it has fewer cells
 * than the table's rows, or a cell written with fewer digits than its column always has (the rest was never written).
 */
export function cutOffReason(text: string, delimiter: string, formats: (NumberFormat | null)[]): string | null {
  // NUL bytes padding a file to a fixed size (binaryContent.ts lets them through at its end) are no row at all.
  if (/^[\0\s]*$/.test(text)) return null;
  const cells = trimTrailingEmpty(splitLine(text, delimiter));
  if (cells.length < formats.length) return `holds ${cells.length} of the table's ${formats.length} cells`;
  for (let c = 0; c < formats.length; c++) {
    const fixed = formats[c];
    const format = formatOf(cells[c]);
    if (fixed === null || format === null) continue;
    if (format.decimals < fixed.decimals || format.exponent < fixed.exponent) {
      return `its cell '${cells[c].trim()}' has fewer digits than column ${c + 1} is written with`;
    }
  }
  return null;
}
