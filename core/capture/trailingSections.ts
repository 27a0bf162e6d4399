// The lines after a table's last row that are not its data, grouped into sections (split at blank lines) for the import summary.

import type { DataShape } from './dataShape';
import type { IgnoredSection } from './importSummary';

const PREVIEW_LENGTH = 40;

interface Section {
  firstLine: number;
  lastLine: number;
  /** The first line as written (shortened), when it is not a row of numbers. */
  heading: string | null;
  /** Rows of numbers in the section, and the cells of the last one. */
  rows: number;
  cells: number;
}

export class TrailingSections {
  private sections: Section[] = [];
  private open = false;

  /** A blank or comment line: the next line starts a new section. */
  gap(): void {
    this.open = false;
  }

  /** A line left out, with its shape when it is a row of numbers (of another table). */
  add(line: number, text: string, shape: DataShape | null): void {
    let section = this.sections[this.sections.length - 1];
    if (!this.open || section === undefined) {
      const t = text.trim();
      section = { firstLine: line, lastLine: line, heading: shape ? null : t.length > PREVIEW_LENGTH ? `${t.slice(0, PREVIEW_LENGTH)}...` : t, rows: 0, cells: 0 };
      this.sections.push(section);
      this.open = true;
    }
    section.lastLine = line;
    if (shape) {
      section.rows++;
      section.cells = shape.cells.length;
    }
  }

  /** The lines were a separator between segments after all: nothing is left out. */
  clear(): void {
    this.sections = [];
    this.open = false;
  }

  list(): IgnoredSection[] {
    return this.sections.map(({ firstLine, lastLine, heading, rows, cells }) => {
      const headed = heading === null ? '' : `, headed '${heading}'`;
      const reason = rows > 0 ? `another table: ${rows} row(s) of ${cells} column(s)${headed}` : `not data: '${heading ?? ''}'`;
      return { firstLine, lastLine, reason };
    });
  }
}
