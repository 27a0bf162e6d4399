// Decides how a capture text is laid out: delimiter, header, units, time columns, channels and stated timing.

import { CaptureError, type CaptureOptions, type UnreadUnit } from './types';
import { groupingCause, isTimestamp, slowCellValue } from './cellValue';
import { checkColumnCount } from './captureLimits';
import { columnUnit, isTimeName, type ColumnUnit, isUnitsRow, parseColumnHeading, readsAsTime, unitCellText, type ColumnHeading } from './columnHeader';
import { sameShape, dataShape, groupedCell, type DataShape } from './dataShape';
import {
  INDEX_NAME,
  TEXT_NAME,
  countsUp,
  evenSteps,
  headerTiming,
  increases,
  numberedTimeColumns,
  oneColumnWithDecimalCommas,
  statesANumber,
  type HeaderTiming,
} from './layoutHabits';
import { readConverterCodes } from './converterCodes';
import { fixedFormats, type NumberFormat } from './cutLastLine';
import { sideLine } from './sideMetadata';
import { isBlankOrComment, isStatingLine, readPreamble, uncommented, usableTimeUnit, type Preamble, type PreambleLine, type StatedTime, type StatedValueUnit } from './preamble';
import { WHITESPACE, splitLine, trimTrailingEmpty } from './splitLine';
import { isUnitAttempt, printable, readUnitText } from '../units/unitText';

/**
 * 'time': numbers on a time axis; 'timestamp': wall-clock stamps, axis rebuilt from the interval;
 * 'maybe-time': first column of a headerless file, time when strictly increasing (decided at the end); 'value';
 * 'ignored': read but not a channel (an empty leading field, a sample index, cells of stated timing); 'text': free
 * text by its name ('Comment'), not read at all.
 */
export type ColumnKind = 'time' | 'timestamp' | 'maybe-time' | 'value' | 'ignored' | 'text';

export interface ColumnPlan {
  kind: ColumnKind;
  /** Header cell as written, or '' without a header. */
  heading: string;
  /** Channel (or time column) name without its unit. */
  name: string;
  unit: string;
  scale: number;
  /** Added after scaling (SI): non-zero only for converter codes converted with a stated offset. */
  offset: number;
  /** For value columns: index of the time column they are sampled on, or null for an axis from the interval. */
  timeColumn: number | null;
  /** For a value column whose header's unit cannot be read: why, and the line of that header (a fit of it is refused). */
  unreadUnit: UnreadUnit | null;
}

export interface Layout {
  /** ',', ';', '\t', ' ' (runs of whitespace) or '' (one column, no delimiter). */
  delimiter: string;
  decimalComma: boolean;
  headerLine: number | null;
  /** The header line as written, to know it again when it is repeated inside the table; null without one. */
  headerText: string | null;
  firstDataLine: number;
  columns: ColumnPlan[];
  preamble: Preamble;
  /** The interval used to build axes (option before file), or null. */
  interval: (StatedTime & { source: string }) | null;
  /** Per data cell, the digits the first data rows all write it with (null where they differ): tells a cut-off last line. */
  cellFormats: (NumberFormat | null)[];
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

/**
 * A header names every data column, or all but the first when at least 3 remain (an unnamed time column) and the
 * rows open with an empty field or every name carries a unit: a key/value line above the data is no header.
 */
function looksLikeHeader(cells: string[], dataCount: number, shifted: boolean, decimalComma: boolean): boolean {
  const names = cells.filter((c) => c.trim() !== '');
  const unnamedFirst =
    dataCount >= 3 && names.length === dataCount - 1 && (shifted || names.every((n) => parseColumnHeading(n).unitText !== null));
  if (cells.length === 0 || (cells.length < dataCount && !unnamedFirst)) return false;
  if (cells.length === 1 && statesANumber(cells[0])) return false;
  return cells.every((c) => c === '' || (slowCellValue(c, decimalComma) === null && !isTimestamp(c)));
}

/** Channel numbers a names row may give its channels ('x-axis,1,2'): a scope has a few inputs, never a hundred. */
const CHANNEL_NUMBER = /^[1-9]\d?$/;

/**
 * A names row labelling its channels by number ('Time,1,2', or 'x-axis,1,2' over a units row): a first cell that is
 * no number, then distinct channel numbers, one per data column. looksLikeHeader refuses numbers as names; these are
 * the file's own labels, kept so that '--column 1' finds the channel the file calls 1.
 */
function numbersChannels(cells: string[], dataCount: number): boolean {
  const [first, ...rest] = cells;
  if (cells.length !== dataCount || rest.length === 0 || first === '' || statesANumber(first)) return false;
  return rest.every((c) => CHANNEL_NUMBER.test(c)) && new Set(rest).size === rest.length;
}

/** A names row numbering the channels directly above the data: its first cell must name time, as no key/value line does. */
function numberedHeader(cells: string[], dataCount: number): boolean {
  return numbersChannels(cells, dataCount) && isTimeName(parseColumnHeading(cells[0]).name);
}

/**
 * A header written as a comment ('# t[us]  CH1[V]') on the line just above the data (blank lines aside), taken when
 * no other line is the header: it names every data column, the first of them time (so that its unit is read).
 */
function commentedHeader<L extends PreambleLine>(above: L[], width: number, shifted: boolean, delimiter: string, decimalComma: boolean): L | null {
  const line = [...above].reverse().find((l) => l.text.trim() !== '');
  if (line === undefined || !isBlankOrComment(line.text)) return null;
  const text = uncommented(line.text);
  const cells = headerCells(text, delimiter);
  const names = cells.filter((c) => c !== '');
  if (names.length !== width || !looksLikeHeader(cells, width, shifted, decimalComma)) return null;
  const first = parseColumnHeading(names[0]);
  return isTimeName(first.name) || readsAsTime(first.reading) ? { ...line, text } : null;
}

/** A header cell and the unit under it in a units row, if the cell gives none and the one below is meant as a unit (columnUnit refuses one that does not read). */
function plan(heading: string, unitCell: string | undefined): PlannedHeading {
  const parsed = parseColumnHeading(heading);
  const unitText = unitCell === undefined ? '' : unitCellText(unitCell);
  const reading = readUnitText(unitText);
  if (unitText !== '' && parsed.unitText === null && (reading.kind !== 'unknown' || isUnitAttempt(unitText))) {
    return { heading, name: parsed.name, unitText, reading, fromUnitsRow: true };
  }
  return { heading, ...parsed, fromUnitsRow: false };
}

/** A column's heading as planned: whether its unit came from the units row tells which line a refusal of it names. */
type PlannedHeading = ColumnHeading & { heading: string; fromUnitsRow: boolean };

/** 'TimeV_S' + 'AmplitudeV_S' -> 'V_S'; otherwise the value column's own name. */
function pairedName(valueName: string, timeName: string | null): string {
  if (timeName === null || !/^time/i.test(timeName)) return valueName;
  const rest = timeName.replace(/^time/i, '').replace(/^[\s\-_:]+/, '');
  return rest !== '' && rest.length < valueName.length && valueName.toLowerCase().endsWith(rest.toLowerCase()) ? rest : valueName;
}

/** True for a column whose cells are read as numbers: all but wall-clock stamps and free text. */
export function isReadColumn(column: ColumnPlan): boolean {
  return column.kind !== 'timestamp' && column.kind !== 'text';
}

function isTimeKind(kind: ColumnKind): boolean {
  return kind === 'time' || kind === 'timestamp' || kind === 'maybe-time';
}

/** The delimiter the row readers split on: a one-column table with decimal commas must not be split at them. */
export function rowDelimiter(layout: Layout): string {
  return layout.delimiter || (layout.decimalComma ? '\t' : ',');
}

/**
 * Wall-clock stamps beside a time column of numbers (a data logger's 'Date/Time' before its 'Elapsed (s)') give no axis:
 * the numbers do, with no interval to state. The stamps are left unread, with a note.
 */
function stampsBesideTime(columns: ColumnPlan[], warnings: string[]): void {
  const time = columns.find((c) => c.kind === 'time');
  if (!time) return;
  const stamps = columns.filter((c) => c.kind === 'timestamp');
  for (const stamp of stamps) stamp.kind = 'text';
  if (stamps.length === 0) return;
  const names = stamps.map((c) => `'${printable(c.heading || c.name)}'`).join(' and ');
  warnings.push(`wall-clock time stamps in ${names} were left unread: the time column '${printable(time.heading || time.name)}' gives the time axis`);
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
    if (column.kind === 'ignored' || column.kind === 'text') return;
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

/** The metadata key that states which input a record holds ('Source,CH1'), as written in any case. */
const SOURCE_KEY = /^\s*source\s*$/i;
/** A source that can name a channel: one cell of a few characters (a label, not a list or a sentence). */
const SOURCE_LABEL = /^[^,;\t]{1,40}$/;

/**
 * The one value column takes the source the metadata states as its name when the file gives it none of its own
 * (no header cell: it would be 'channel 1'); with several columns one source names none of them for sure.
 */
function nameFromSource(columns: ColumnPlan[], metadata: Record<string, string>): void {
  const values = columns.filter((c) => c.kind === 'value');
  if (values.length !== 1 || values[0].heading !== '') return;
  const key = Object.keys(metadata).find((k) => SOURCE_KEY.test(k));
  const label = key === undefined ? '' : metadata[key].trim();
  if (SOURCE_LABEL.test(label)) values[0].name = label;
}

/** The leading columns empty in every row (a column with data, at least, is left): the data rows' empty fields. */
function leadingEmptyColumns(dataCount: number, column: (c: number) => (string | undefined)[]): number {
  let count = 0;
  while (count < dataCount - 1 && column(count).every((c) => c?.trim() === '')) count++;
  return count;
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
      const grouped = groupedCell(head[j].text, shape.delimiter);
      const cause = grouped === null ? '' : `: '${grouped.trim()}' is ${groupingCause(grouped)}`;
      throw new CaptureError(`expected ${dataCount} numeric columns, found '${preview(head[j].text)}'${cause}`, head[j].line);
    }
  }
}

/** The key of the interval the sampleInterval option gives (Layout['interval']): it also replaces a time column's stamps. */
export const INTERVAL_OPTION = 'sampleInterval';

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
    return { value: option, key: INTERVAL_OPTION, line: 0, unitStated: true, source: 'the sampleInterval option' };
  }
  const stated = preamble.interval;
  return stated ? { ...stated, source: `'${stated.key}' on line ${stated.line}` } : null;
}

/**
 * The unit column `index` is read in. A time column whose header gives no unit is in the preamble's time unit when it
 * states one ('Horizontal units,us'), with a note when that is not seconds; so is a headerless first column, which may
 * still turn out a channel and then gets a channel's unit (assembleCapture).
 */
function planUnit(
  kind: ColumnKind,
  heading: ColumnHeading & { heading: string },
  index: number,
  options: CaptureOptions,
  preamble: Preamble,
  line: number | null,
  warnings: string[],
): ColumnUnit {
  if (kind === 'ignored' || kind === 'text') return { unit: '', scale: 1 };
  const label = heading.heading || heading.name || `column ${index + 1}`;
  if (kind === 'value' && heading.unitText === null && !options.valueUnit && preamble.valueUnit) return preambleValueUnit(label, preamble.valueUnit, warnings);
  // The preamble states no unit when the option does (readPreamble): the option is over it.
  const stated = preamble.timeUnit;
  const unitless = kind === 'maybe-time' || (kind === 'time' && heading.unitText === null);
  if (!unitless || stated === null) {
    if (kind !== 'maybe-time') return columnUnit(heading, label, kind !== 'value', options, line, warnings);
    return options.timeUnit ? { unit: options.timeUnit.unit, scale: options.timeUnit.scale } : { unit: '', scale: 1 };
  }
  const unit = usableTimeUnit(stated);
  if (unit.scale !== 1) {
    warnings.push(`column '${printable(label)}' gives no unit: read in ${unit.text}, as '${printable(unit.key)}' on line ${unit.line} states`);
  }
  return { unit: unit.unit, scale: unit.scale };
}

/**
 * The unit a channel whose header gives none is read in when the preamble states the channels' unit ('Vertical
 * Units,V'), with a note: without it a channel has no unit, and its peak cannot be weighed for the cautions.
 */
export function preambleValueUnit(label: string, stated: StatedValueUnit, warnings: string[]): { unit: string; scale: number } {
  warnings.push(`channel '${printable(label)}' gives no unit: read in ${stated.text}, as '${printable(stated.key)}' on line ${stated.line} states`);
  return { unit: stated.unit, scale: stated.scale };
}

/**
 * The layout from the lines read so far: `head` holds every line up to and including the confirming data rows,
 * `run` the indexes into `head` of those rows, `side` those of the table's rows with metadata beside the data (their
 * metadata cells are read as preamble lines). Throws CaptureError for a table broken by junk, or time that cannot be
 * known (time stamps or no time column, and no stated interval).
 */
export function decideLayout(head: PreambleLine[], run: number[], options: CaptureOptions, side: number[] = []): Layout {
  // The table starts at its first row: a data row, or one with metadata beside the data.
  const runStart = Math.min(run[0], side[0] ?? run[0]);
  const above = head.slice(0, runStart).map((l, i) => ({ ...l, i }));
  let meaningful = above.filter((l) => !isBlankOrComment(l.text));
  let shapes = run.map((i) => dataShape(head[i].text) as DataShape);
  if (oneColumnWithDecimalCommas(shapes, meaningful[meaningful.length - 1]?.text)) {
    shapes = run.map((i) => ({ delimiter: '', cells: [head[i].text.trim()], decimalComma: true }));
  }
  const first = shapes[0];
  const delimiter = first.delimiter;
  const decimalComma = shapes.some((s) => s.decimalComma);
  const dataCount = Math.max(...shapes.map((s) => trimTrailingEmpty(s.cells).length));
  const runShape = dataShape(head[run[0]].text) as DataShape;
  rejectBrokenTable(head, runStart, runShape, dataCount);
  const column = (c: number): (string | undefined)[] => shapes.map((s) => s.cells[c]);
  // Every row opening with empty fields: the fields are no columns (metadata may sit there beside the first rows),
  // and a header may or may not have them.
  const skip = delimiter === WHITESPACE ? 0 : leadingEmptyColumns(dataCount, column);
  const width = dataCount - skip;
  // Rows opening with an empty ';'-separated field: a header written the same way opens with ';' too, and is no comment.
  if (skip > 0 && delimiter === ';') meaningful = above.filter((l) => !isBlankOrComment(l.text) || /^\s*;.*[^;\s]/.test(l.text));

  let header: (typeof meaningful)[number] | null = null;
  let units: string[] | undefined;
  let timing: HeaderTiming | null = null;
  const last = meaningful[meaningful.length - 1];
  // A line stating the timing or a unit ('YUNIT,V' right above the data) is preamble, not the names of the columns.
  if (last && !isStatingLine(last.text, delimiter)) {
    const lastCells = headerCells(last.text, delimiter);
    const before = meaningful[meaningful.length - 2];
    const beforeCells = before ? headerCells(before.text, delimiter) : [];
    const namesAbove =
      before !== undefined &&
      !isStatingLine(before.text, delimiter) &&
      (looksLikeHeader(beforeCells, width, skip > 0, decimalComma) || numbersChannels(beforeCells, width));
    if (isUnitsRow(lastCells) && namesAbove) {
      header = before;
      units = lastCells;
    } else if (numberedHeader(lastCells, width)) {
      header = last;
    } else if (looksLikeHeader(lastCells, width, skip > 0, decimalComma)) {
      // A line of units only is no header: it gives the units of header-less columns.
      if (isUnitsRow(lastCells)) units = lastCells;
      else header = last;
    } else if (before && looksLikeHeader(beforeCells, width, skip > 0, decimalComma)) {
      const below = headerTiming(trimTrailingEmpty(beforeCells), lastCells, last.line, decimalComma);
      if (below.timing.interval !== null) {
        header = before;
        units = lastCells;
        timing = below;
      }
    }
  }
  if (header === null && units === undefined) header = commentedHeader(above, width, skip > 0, delimiter, decimalComma);
  let headings = header ? trimTrailingEmpty(headerCells(header.text, delimiter)) : [];
  // A header (and units row) naming only the data columns is shifted over the empty fields.
  const shift = header ? Math.min(skip, dataCount - headings.length) : 0;
  if (shift > 0) {
    headings = [...Array<string>(shift).fill(''), ...headings];
    if (units && units.length < dataCount) units = [...Array<string>(shift).fill(''), ...units];
  }
  if (header && timing === null) timing = headerTiming(headings, null, header.line, decimalComma);
  // One name fewer than data columns, none of them time: the first data column is an unnamed time axis.
  const names = headings.filter((h) => h !== '');
  const unnamedTime =
    header !== null &&
    names.length === width - 1 &&
    (timing === null || timing.cells.size === 0) &&
    !names.some((h) => isTimeName(parseColumnHeading(h).name)) &&
    increases(column(skip), decimalComma);
  if (unnamedTime) headings = [...Array<string>(skip + 1).fill(''), ...names];
  const statesTiming = timing !== null && timing.timing.interval !== null;

  const besideData = side.map((i) => sideLine(head[i], runShape));
  const preamble = readPreamble([...head.slice(0, header ? header.i : runStart), ...besideData], delimiter, decimalComma, options.timeUnit);
  const count = Math.max(headings.length, dataCount);
  checkColumnCount(count, header && headings.length > dataCount ? header.line : head[runStart].line);
  const firstCells = first.cells;
  const warnings: string[] = [];
  const columns: ColumnPlan[] = [];
  const plans = Array.from({ length: count }, (_, c) => plan(headings[c] ?? '', units?.[c]));
  const named = header !== null || units !== undefined;
  const timeLike = plans.map((p) => named && (isTimeName(p.name) || readsAsTime(p.reading)));
  // A time name heading a unit that is not one of time ('T (degC)') is a channel when another column is plainly time.
  const statesOtherUnit = (p: ColumnHeading): boolean => p.unitText !== null && !readsAsTime(p.reading);
  const plainTime = timeLike.some((like, c) => like && !statesOtherUnit(plans[c]));
  const timeNames = timeLike.map((like, c) => like && !(plainTime && statesOtherUnit(plans[c])));
  const stepsEvenly = (c: number): boolean => evenSteps(column(c), decimalComma);
  const numbered = timeNames.includes(true) ? new Set<number>() : numberedTimeColumns(plans.map((p) => p.name), stepsEvenly);
  for (let c = 0; c < count; c++) {
    const p = plans[c];
    const counting = countsUp(column(c));
    // 'Sample', a units row's 'Sequence', or a heading's own unit: 'Time (samples)' counts samples, not seconds.
    const indexNamed = INDEX_NAME.test(p.name) || INDEX_NAME.test(units?.[c]?.trim() ?? '') || INDEX_NAME.test(p.unitText?.trim() ?? '');
    const timeNamed = timeNames[c] || numbered.has(c);
    // A headerless column counting up beside an evenly stepped one is a sample index, unless a units row makes it time.
    const beforeTime = !header && !timeNamed && c === skip && evenSteps(column(c + 1), decimalComma) && !countsUp(column(c + 1));
    let kind: ColumnKind = 'value';
    if (named && TEXT_NAME.test(p.name)) kind = 'text';
    else if (c < skip || timing?.cells.has(c)) kind = 'ignored';
    else if (counting && (indexNamed || beforeTime || (statesTiming && (timeNamed || c === skip)))) kind = 'ignored';
    else if (firstCells[c] !== undefined && isTimestamp(firstCells[c])) kind = 'timestamp';
    else if (timeNamed || (unnamedTime && c === skip)) kind = 'time';
    else if (!header && columns.every((k) => k.kind === 'ignored') && count - c >= 2) kind = 'maybe-time';
    const unitLine = (p.fromUnitsRow ? last?.line : header?.line) ?? (units && last ? last.line : null);
    const { unit, scale, unread } = planUnit(kind, p, c, options, preamble, unitLine, warnings);
    const unreadUnit = unread === undefined ? null : { message: unread, line: unitLine };
    columns.push({ kind, heading: p.heading, name: p.name, unit, scale, offset: 0, timeColumn: null, unreadUnit });
  }
  stampsBesideTime(columns, warnings);
  assignTimeColumns(columns);
  nameChannels(columns, header !== null);
  nameFromSource(columns, preamble.metadata);

  preamble.interval ??= timing?.timing.interval ?? null;
  preamble.offset ??= timing?.timing.offset ?? null;
  warnings.unshift(...preamble.warnings);
  const codes = readConverterCodes(columns, shapes, preamble, decimalComma);
  if (codes !== null) warnings.push(codes);
  const interval = chooseInterval(preamble, options, warnings);
  const firstDataLine = head[runStart].line;
  if (interval === null) {
    // A logger's time-of-day column names the stamps better than its date column beside it.
    const stampedColumns = columns.filter((c) => c.kind === 'timestamp');
    const stamped = stampedColumns.find((c) => firstCells[columns.indexOf(c)]?.includes(':')) ?? stampedColumns[0];
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
  const headerLine = header ? header.line : null;
  const headerText = header ? header.text : null;
  return { delimiter, decimalComma, headerLine, headerText, firstDataLine, columns, preamble, interval, cellFormats: fixedFormats(shapes), warnings };
}
