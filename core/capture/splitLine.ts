// Splits one line (outside the fast path) into cells: quoted fields, any delimiter, or runs of whitespace.

/** The delimiter written as ' ' means runs of spaces and tabs. */
export const WHITESPACE = ' ';

/** Cells of `line` ('' as delimiter: one cell); quotes group a field (with "" as a literal quote) and are removed. */
export function splitLine(line: string, delimiter: string): string[] {
  if (delimiter === WHITESPACE) return splitWhitespace(line);
  if (delimiter === '') return [line.trim().replace(/^"(.*)"$/, '$1')];
  if (!line.includes('"')) return line.split(delimiter);
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"' && cell.trim() === '') {
      quoted = true;
      cell = '';
    } else if (ch === delimiter) {
      cells.push(cell);
      cell = '';
    } else cell += ch;
  }
  cells.push(cell);
  return cells;
}

function splitWhitespace(line: string): string[] {
  const cells: string[] = [];
  const pattern = /"((?:[^"]|"")*)"|[^\s"]+/g;
  for (let match = pattern.exec(line); match !== null; match = pattern.exec(line)) {
    cells.push(match[1] !== undefined ? match[1].replace(/""/g, '"') : match[0]);
  }
  return cells;
}

/** Cells without the empty ones at the end (trailing delimiters). */
export function trimTrailingEmpty(cells: string[]): string[] {
  let end = cells.length;
  while (end > 0 && cells[end - 1].trim() === '') end--;
  return end === cells.length ? cells : cells.slice(0, end);
}
