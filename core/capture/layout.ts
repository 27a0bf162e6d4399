// Decides how a capture text is laid out: delimiter, header, units, time columns, channels and stated timing.

import { CaptureError, type CaptureOptions } from './types';
import { isTimestamp, slowCellValue } from './cellValue';
import { checkColumnCount } from './captureLimits';
import { columnUnit, isTimeName, isUnitsRow, parseColumnHeading, readsAsTime, unitCellText, type ColumnHeading } from './columnHeader';
import { sameShape, dataShape, type DataShape } from './dataShape';
import { isBlankOrComment, readPreamble, type Preamble, type PreambleLine, type StatedTime } from './preamble';
import { WHITESPACE, splitLine, trimTrailingEmpty } from './splitLine';
import { readUnitText } from '../units/unitText';

/**
 * 'time': numbers on a time axis; 'timestamp': wall-clock stamps, axis rebuilt from the interval;
 * 'maybe-time': first column of a headerless file, time when strictly increasing (decided at the end); 'value'.
 */
export type ColumnKind = 'time' | 'timestamp' | 'maybe-time' | 'value';

export interface ColumnPlan {
  kind: ColumnKind;
  /** Header cell as written, or '' without a header. */
  heading: string;
  /** Channel (or time column) name without its unit. */
  name: string;
  unit: string;
  scale: number;
  /** For value columns: index of the time column they are sampled on, or null for an axis from the interval. */
  timeColumn: number | null;
}

export interface Layout {
  /** ',', ';', '\t', ' ' (runs of whitespace) or '' (one column, no delimiter). */
  delimiter: string;
  decimalComma: boolean;
  headerLine: number | null;
  firstDataLine: number;
  columns: ColumnPlan[];
  preamble: Preamble;
  /** The interval used to build axes (option before file), or null. */
  interval: (StatedTime & { source: string }) | null;
  warnings: string[];
}

const PREVIEW_LENGTH = 40;

function preview(text: string): string {
  const t = text.trim();
  return t.length > PREVIEW_LENGTH ? `${t.slice(0, PREVIEW_LENGTH)}...` : t;
}

/** Header cells; with whitespace delimiters a unit token ('(s)', '[mV]') joins the name before it. */
function headerCells(text: string, delimiter: string): string[] {
  const cells = trimTrailingEmpty(splitLine(text, delimiter)).map((c) => c.trim());
  if (delimiter !== WHITESPACE) return cells;
  const merged: string[] = [];
  for (const cell of cells) {
    if (merged.length > 0 && /^[([]/.test(cell)) merged[merged.length - 1] += ` ${cell}`;
    else merged.push(cell);
  }
  return merged;
}

function looksLikeHeader(cells: string[], dataCount: number): boolean {
  if (cells.length < dataCount || cells.length === 0) return false;
  if (cells.length === 1 && /[:=]\s*\S/.test(cells[0])) return false;
  return cells.every((c) => c === '' || (slowCellValue(c, false) === null && !isTimestamp(c)));
}

/** A header cell and the unit under it in a units row, if the cell gives none and the one below reads as a unit. */
function plan(heading: string, unitCell: string | undefined): ColumnHeading & { heading: string } {
  const parsed = parseColumnHeading(heading);
  const unitText = unitCell === undefined ? '' : unitCellText(unitCell);
  const reading = readUnitText(unitText);
  if (unitText !== '' && parsed.unitText === null && reading.kind !== 'unknown') return { heading, name: parsed.name, unitText, reading };
  return { heading, ...parsed };
}

/** 'TimeV_S' + 'AmplitudeV_S' -> 'V_S'; otherwise the value column's own name. */
function pairedName(valueName: string, timeName: string | null): string {
  if (timeName === null || !/^time/i.test(timeName)) return valueName;
  const rest = timeName.replace(/^time/i, '').replace(/^[\s\-_:]+/, '');
  return rest !== '' && rest.length < valueName.length && valueName.toLowerCase().endsWith(rest.toLowerCase()) ? rest : valueName;
}

function isTimeKind(kind: ColumnKind): boolean {
  return kind !== 'value';
}

/** Each value column takes the nearest time column on its left, else the first one, else none. */
function assignTimeColumns(columns: ColumnPlan[]): void {
  const first = columns.findIndex((c) => isTimeKind(c.kind));
  let current: number | null = first >= 0 ? first : null;
  columns.forEach((column, index) => {
    if (isTimeKind(column.kind)) current = index;
    else column.timeColumn = current;
  });
}

/** Names of value columns: from the header (paired with their time column), 'channel N' without one; unique. */
export function nameChannels(columns: ColumnPlan[], hasHeader: boolean): void {
  let count = 0;
  const seen = new Map<string, number>();
  columns.forEach((column, index) => {
    if (isTimeKind(column.kind)) {
      if (column.name === '') column.name = 'time';
      return;
    }
    count++;
    const timeName = column.timeColumn === null ? null : columns[column.timeColumn].name;
    let name = hasHeader && column.name !== '' ? pairedName(column.name, timeName) : `channel ${count}`;
    const key = name.toLowerCase();
    if (seen.has(key)) name = `${name} (column ${index + 1})`;
    seen.set(key, index);
    column.name = name;
  });
}

/** Throws when a row of the same shape as the data sits above a non-data line: junk inside the table. */
function rejectBrokenTable(head: PreambleLine[], runStart: number, shape: DataShape, dataCount: number): void {
  for (let i = 0; i < runStart; i++) {
    const earlier = dataShape(head[i].text);
    if (!earlier || !sameShape(earlier, shape)) continue;
    for (let j = i + 1; j < runStart; j++) {
      if (isBlankOrComment(head[j].text)) continue;
      const next = dataShape(head[j].text);
      if (next && sameShape(next, shape)) continue;
      throw new CaptureError(`expected ${dataCount} numeric columns, found '${preview(head[j].text)}'`, head[j].line);
    }
  }
}

function chooseInterval(preamble: Preamble, options: CaptureOptions, warnings: string[]): Layout['interval'] {
  const option = options.sampleInterval;
  if (option !== undefined) {
    if (!(typeof option === 'number' && Number.isFinite(option) && option > 0)) {
      throw new CaptureError(`option sampleInterval must be a positive number of seconds, got ${String(option)}`);
    }
    const stated = preamble.interval;
    if (stated && Math.abs(stated.value - option) > 1e-6 * option) {
      warnings.push(`the sampleInterval option (${option} s) replaces the file's '${stated.key}' (${stated.value} s, line ${stated.line})`);
    }
    return { value: option, key: 'sampleInterval', line: 0, source: 'the sampleInterval option' };
  }
  const stated = preamble.interval;
  return stated ? { ...stated, source: `'${stated.key}' on line ${stated.line}` } : null;
}

/**
 * The layout from the lines read so far: `head` holds every line up to and including the confirming data rows,
 * `run` the indexes into `head` of those rows. Throws CaptureError for a table broken by junk, or time that
 * cannot be known (time stamps or no time column, and no stated interval).
 */
export function decideLayout(head: PreambleLine[], run: number[], options: CaptureOptions): Layout {
  const shapes = run.map((i) => dataShape(head[i].text) as DataShape);
  const first = shapes[0];
  const delimiter = first.delimiter;
  const decimalComma = shapes.some((s) => s.decimalComma);
  const dataCount = Math.max(...shapes.map((s) => trimTrailingEmpty(s.cells).length));
  const runStart = run[0];
  rejectBrokenTable(head, runStart, first, dataCount);

  const meaningful = head.slice(0, runStart).map((l, i) => ({ ...l, i })).filter((l) => !isBlankOrComment(l.text));
  let header: (typeof meaningful)[number] | null = null;
  let units: string[] | undefined;
  const last = meaningful[meaningful.length - 1];
  if (last) {
    const lastCells = headerCells(last.text, delimiter);
    const before = meaningful[meaningful.length - 2];
    if (isUnitsRow(lastCells) && before && looksLikeHeader(headerCells(before.text, delimiter), dataCount)) {
      header = before;
      units = lastCells;
    } else if (looksLikeHeader(lastCells, dataCount)) header = last;
  }
  const headings = header ? headerCells(header.text, delimiter) : [];
  const count = Math.max(headings.length, dataCount);
  checkColumnCount(count, header && headings.length > dataCount ? header.line : head[runStart].line);
  const firstCells = first.cells;
  const warnings: string[] = [];
  const columns: ColumnPlan[] = [];
  for (let c = 0; c < count; c++) {
    const p = plan(headings[c] ?? '', units?.[c]);
    let kind: ColumnKind = 'value';
    if (firstCells[c] !== undefined && isTimestamp(firstCells[c])) kind = 'timestamp';
    else if (header && (isTimeName(p.name) || readsAsTime(p.reading))) kind = 'time';
    else if (!header && c === 0 && count >= 2) kind = 'maybe-time';
    // A headerless first column gets its unit once it is known to be time or a channel (assembleCapture).
    const { unit, scale } = kind === 'maybe-time' ? { unit: '', scale: 1 } : columnUnit(p, p.heading || p.name, kind !== 'value', options, header?.line ?? null, warnings);
    columns.push({ kind, heading: p.heading, name: p.name, unit, scale, timeColumn: null });
  }
  assignTimeColumns(columns);
  nameChannels(columns, header !== null);

  const preamble = readPreamble(head.slice(0, header ? header.i : runStart), delimiter, decimalComma, options.timeUnit);
  warnings.unshift(...preamble.warnings);
  const interval = chooseInterval(preamble, options, warnings);
  const firstDataLine = head[runStart].line;
  if (interval === null) {
    const stamped = columns.find((c) => c.kind === 'timestamp');
    if (stamped) {
      throw new CaptureError(
        `column '${stamped.heading || stamped.name}' holds wall-clock time stamps ('${preview(firstCells[columns.indexOf(stamped)])}') ` +
          'and the file states no sample interval; give the sample interval (option sampleInterval)',
        firstDataLine,
      );
    }
    if (!columns.some((c) => isTimeKind(c.kind))) {
      throw new CaptureError(
        'no time column and no sample interval stated in the file; give the sample interval (option sampleInterval)',
        header ? header.line : firstDataLine,
      );
    }
  }
  if (!columns.some((c) => c.kind === 'value')) {
    throw new CaptureError('the table has no value columns, only time', header ? header.line : firstDataLine);
  }
  return { delimiter, decimalComma, headerLine: header ? header.line : null, firstDataLine, columns, preamble, interval, warnings };
}
