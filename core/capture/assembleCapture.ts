// Turns the stored columns and the layout into a Capture: time axes, per-channel dropping, clipping, interval.

import { formatEngineering } from '../units/format';
import { printable } from '../units/unitText';
import { MIN_SAMPLES } from './captureLimits';
import { detectClipping, type Clipping } from './detectClipping';
import { INTERVAL_OPTION, nameChannels, preambleValueUnit, type ColumnPlan, type Layout } from './layout';
import type { RowDrop } from './importSummary';
import type { RowLines, StoredRows } from './segments';
import { summarizeImport, type KeptChannel, type TextSource } from './summarizeImport';
import { findOrderProblem, rebuildAxis, sortByTime, uniformInterval } from './timeAxis';
import { CaptureError, type Capture, type CaptureOptions, type Channel } from './types';

interface Axis {
  /** Time of each output row, s. */
  time: Float64Array;
  /** Source row of each output row, or null when output rows are the file rows in order. */
  order: Uint32Array | null;
  /** Uniform interval of this axis, or null. */
  interval: number | null;
  /** File rows left out of this axis (repeated time stamps when sorted), or null. */
  leftOut: RowDrop | null;
}

function seconds(value: number): string {
  return formatEngineering(value, 's');
}

/** column x scale, in place; a column already in seconds is left as it is (x 1 changes no value). */
function scaleInPlace(column: Float64Array, scale: number): Float64Array {
  if (scale !== 1) for (let i = 0; i < column.length; i++) column[i] = column[i] * scale;
  return column;
}

/** How a note on time read as seconds tells the user to state another unit. */
const TIME_UNIT_ADVICE = 'state another unit with --time-unit';

function label(column: ColumnPlan): string {
  return column.heading || column.name;
}

/**
 * A note naming the time columns of the kept channels that state no unit (none in the header, a units row or the
 * timeUnit option): they are read as seconds, the usual export convention, but a column in microseconds read so
 * would put every frequency 10^6 off without a sign.
 */
function unitlessTimeNote(columns: ColumnPlan[], kept: KeptChannel[]): string | null {
  const unitless = new Set<number>();
  for (const { column } of kept) {
    const index = column.timeColumn;
    if (index !== null && columns[index].kind === 'time' && columns[index].unit === '') unitless.add(index);
  }
  if (unitless.size === 0) return null;
  const names = [...unitless].map((index) => (columns[index].heading ? `'${printable(columns[index].heading)}'` : `${index + 1}`));
  if (names.length === 1) return `time column ${names[0]} states no unit and was read as seconds; ${TIME_UNIT_ADVICE}`;
  const listed = `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
  return `time columns ${listed} state no unit and were read as seconds; ${TIME_UNIT_ADVICE}`;
}

/**
 * A note when the time axis is built from an interval, or a start time other than 0, that the file states with no unit
 * (none on its line, in the preamble or the timeUnit option): read as seconds, the usual convention, but an interval in
 * microseconds read so would put every frequency 10^6 off without a sign, and a start so read would shift every time.
 */
function unitlessAxisNote(interval: NonNullable<Layout['interval']>, offset: Layout['preamble']['offset']): string | null {
  const unitless = [
    ...(interval.unitStated ? [] : [`the sample interval '${printable(interval.key)}' on line ${interval.line}`]),
    ...(offset && !offset.unitStated && offset.value !== 0 ? [`the start time '${printable(offset.key)}' on line ${offset.line}`] : []),
  ];
  if (unitless.length === 0) return null;
  const [verb, read] = unitless.length === 1 ? ['states', 'was'] : ['state', 'were'];
  return `${unitless.join(' and ')} ${verb} no unit and ${read} read as seconds; ${TIME_UNIT_ADVICE}`;
}

/** A headerless first column is time when strictly increasing (or to be sorted); otherwise it is a channel. */
function resolveFirstColumn(layout: Layout, store: StoredRows, lines: RowLines, options: CaptureOptions): void {
  // The first column that is not ignored (a leading empty field or a sample index may come before it).
  const index = layout.columns.findIndex((c) => c.kind === 'maybe-time');
  if (index < 0) return;
  const first = layout.columns[index];
  const problem = findOrderProblem(store.column(index));
  if (problem === null || options.sortTime) {
    first.kind = 'time';
    return;
  }
  first.kind = 'value';
  const stated = layout.preamble.valueUnit;
  ({ unit: first.unit, scale: first.scale } = options.valueUnit ?? (stated ? preambleValueUnit(label(first), stated, layout.warnings) : { unit: '', scale: 1 }));
  for (const column of layout.columns) column.timeColumn = null;
  nameChannels(layout.columns, false);
  if (layout.interval === null) {
    throw new CaptureError(
      'no time column: the first column stops increasing here, so it is read as a channel, and the file states no ' +
        'sample interval; give the sample interval (option sampleInterval), or sortTime to sort by the first column',
      lines.lineOf(problem.row),
    );
  }
}

function columnAxis(index: number, layout: Layout, store: StoredRows, lines: RowLines, options: CaptureOptions, warnings: string[]): Axis {
  const column = layout.columns[index];
  const time = scaleInPlace(store.keep(index), column.scale);
  if (layout.interval?.key === INTERVAL_OPTION) return statedIntervalAxis(time, layout.interval.value, column, warnings);
  const problem = findOrderProblem(time);
  if (problem === null) return { time, order: null, interval: uniformInterval(time), leftOut: null };
  const line = lines.lineOf(problem.row);
  const copies = problem.time === problem.previous ? withoutCopiedRows(time, index, layout, store, lines, warnings) : null;
  if (copies) return copies;
  if (!options.sortTime) {
    const where = `(column '${label(column)}')`;
    if (problem.time !== problem.previous) {
      throw new CaptureError(`time ${seconds(problem.time)} is earlier than ${seconds(problem.previous)} on the row before ${where}; time must increase (option sortTime sorts the rows)`, line);
    }
    // Stamps that often repeat and never decrease were written with too few digits: sorting would drop every repeat.
    const repeats = repeatsIfNeverDecreasing(time);
    const advice =
      repeats >= ROUNDED_REPEATS
        ? `${repeats} of the ${time.length} time stamps repeat the one before and none decreases: they were written with too few digits for the sample interval; give the sample interval (option sampleInterval) to build the time axis from it`
        : 'time must increase (option sortTime sorts the rows)';
    throw new CaptureError(`time ${seconds(problem.time)} repeats the time stamp of the row before ${where}; ${advice}`, line);
  }
  const sorted = sortByTime(time);
  const sortedTime = new Float64Array(sorted.order.length);
  for (let k = 0; k < sortedTime.length; k++) sortedTime[k] = time[sorted.order[k]];
  warnings.push(`time in column '${label(column)}' does not increase from line ${line} on; rows were sorted by time`);
  let leftOut: Axis['leftOut'] = null;
  if (sorted.repeated > 0 && sorted.firstRepeatedRow !== null) {
    const firstLine = lines.lineOf(sorted.firstRepeatedRow);
    warnings.push(`${sorted.repeated} row(s) repeating an earlier time stamp were left out (first on line ${firstLine})`);
    leftOut = { reason: 'repeated time stamp', count: sorted.repeated, firstLine };
  }
  return { time: sortedTime, order: sorted.order, interval: uniformInterval(sortedTime), leftOut };
}

/**
 * The axis without the rows that repeat the row before whole, its time stamp and every value of its channels (lines a
 * logger or an export wrote twice: they hold nothing new, and kept they would shift every later sample by a step),
 * with a warning. Null when any repeated stamp's row differs from the one before (stamps written with too few digits,
 * say), or when the axis without them is not evenly stepped: a copy written over a row, not beside it, leaves a gap.
 */
function withoutCopiedRows(time: Float64Array, index: number, layout: Layout, store: StoredRows, lines: RowLines, warnings: string[]): Axis | null {
  const values = layout.columns.flatMap((c, k) => (c.kind === 'value' && c.timeColumn === index ? [store.column(k)] : []));
  const kept: number[] = [];
  let firstCopy = -1;
  for (let i = 0; i < time.length; i++) {
    const copied = i > 0 && time[i] === time[i - 1];
    if (!copied) kept.push(i);
    else if (!values.every((column) => Object.is(column[i], column[i - 1]))) return null;
    else if (firstCopy < 0) firstCopy = i;
  }
  const order = Uint32Array.from(kept);
  const keptTime = Float64Array.from(order, (row) => time[row]);
  const interval = findOrderProblem(keptTime) === null ? uniformInterval(keptTime) : null;
  if (interval === null) return null;
  const count = time.length - kept.length;
  const firstLine = lines.lineOf(firstCopy);
  const column = layout.columns[index];
  warnings.push(`${count} row(s) repeating the row before whole (time in column '${label(column)}' and every value) were left out (first on line ${firstLine})`);
  return { time: keptTime, order, interval, leftOut: { reason: 'row repeated whole', count, firstLine } };
}

/**
 * Repeated stamps, in a column that never decreases, that mark it as written with too few digits for its interval
 * rather than a line copied twice or two (a rounding to whole steps of more than the interval repeats many).
 */
const ROUNDED_REPEATS = 3;

/** How many time stamps equal the one before, or -1 when one is earlier than one before it (rows without a time skipped). */
function repeatsIfNeverDecreasing(time: Float64Array): number {
  let previous = -Infinity;
  let repeats = 0;
  for (let i = 0; i < time.length; i++) {
    const t = time[i];
    if (t < previous) return -1;
    if (t === previous) repeats++;
    if (t === t) previous = t;
  }
  return repeats;
}

/**
 * The axis the sampleInterval option states, over a time column's own stamps (written with too few digits, or
 * uneven): t = t0 + i dt, with t0 from the first stamp, so that the trigger stays where the file put it.
 */
function statedIntervalAxis(time: Float64Array, interval: number, column: ColumnPlan, warnings: string[]): Axis {
  let first = 0;
  while (first < time.length && !Number.isFinite(time[first])) first++;
  const offset = first < time.length ? time[first] - first * interval : 0;
  warnings.push(`the sampleInterval option replaces the time stamps of column '${label(column)}': t = ${seconds(offset)} + i × ${seconds(interval)}`);
  return { time: rebuildAxis(time.length, interval, offset), order: null, interval, leftOut: null };
}

function intervalAxis(layout: Layout, rows: number, warnings: string[], stamped: ColumnPlan | null): Axis {
  const interval = layout.interval;
  if (interval === null) throw new CaptureError('no sample interval to build the time axis from', layout.firstDataLine);
  const offset = layout.preamble.offset;
  const unitless = unitlessAxisNote(interval, offset);
  if (unitless) warnings.push(unitless);
  const start = offset ? offset.value : 0;
  if (stamped) {
    const from = offset ? ` and the start from '${offset.key}' on line ${offset.line}` : '';
    warnings.push(
      `column '${label(stamped)}' holds wall-clock time stamps; the time axis was rebuilt as ` +
        `t = ${seconds(start)} + i × ${seconds(interval.value)}, with the interval from ${interval.source}${from}`,
    );
  }
  return { time: rebuildAxis(rows, interval.value, start), order: null, interval: interval.value, leftOut: null };
}

/** One channel (stored column c): samples with both a time and a value, scaled to SI, with its clipping. */
function buildChannel(column: ColumnPlan, store: StoredRows, c: number, axis: Axis): { channel: Channel; clipping: Clipping } {
  const n = axis.time.length;
  const values = store.column(c);
  let time = axis.time;
  let out: Float64Array;
  if (axis.order === null && !values.includes(NaN) && !time.includes(NaN)) {
    // Every sample usable, in file order (the usual case): the stored column becomes the channel, scaled in place.
    out = valuesInPlace(store.keep(c), column.scale, column.offset);
  } else {
    // Copy in one pass while every sample is usable; filter only when one is not.
    out = new Float64Array(n);
    if (copyWhileUsable(values, axis, column.scale, column.offset, out) < n) {
      ({ time, values: out } = usableSamples(values, axis, column.scale, column.offset));
    }
  }
  const clipping = detectClipping(out);
  const channel: Channel = { name: column.name, unit: column.unit, time, values: out, clipped: clipping.clipped, dropped: n - out.length };
  if (column.unreadUnit) channel.unreadUnit = column.unreadUnit;
  return { channel, clipping };
}

// The loops over a channel's samples are small functions of their own: each runs once over a long record, and a
// small function is compiled (on the fly, mid-loop) far sooner than one holding several loops.

/** Fills out[k] with value x scale + offset until the first sample without a time or a value; returns how many. */
function copyWhileUsable(values: Float64Array, axis: Axis, scale: number, offset: number, out: Float64Array): number {
  const { time, order } = axis;
  let k = 0;
  for (; k < out.length; k++) {
    const v = values[order ? order[k] : k];
    if (v !== v || time[k] !== time[k]) break;
    out[k] = v * scale + offset;
  }
  return k;
}

/** values x scale + offset in place, for a channel every sample of which is usable; x 1 + 0 changes only -0 (to 0), found natively. */
function valuesInPlace(values: Float64Array, scale: number, offset: number): Float64Array {
  if (scale === 1 && offset === 0) for (let i = values.indexOf(0); i >= 0; i = values.indexOf(0, i + 1)) values[i] = 0;
  else for (let i = 0; i < values.length; i++) values[i] = values[i] * scale + offset;
  return values;
}

/** The samples with both a time and a value, the value x scale + offset. */
function usableSamples(values: Float64Array, axis: Axis, scale: number, offset: number): { time: Float64Array; values: Float64Array } {
  const { time, order } = axis;
  let usable = 0;
  for (let k = 0; k < time.length; k++) {
    const v = values[order ? order[k] : k];
    if (v === v && time[k] === time[k]) usable++;
  }
  const keptTime = new Float64Array(usable);
  const kept = new Float64Array(usable);
  let j = 0;
  for (let k = 0; k < time.length; k++) {
    const v = values[order ? order[k] : k];
    const t = time[k];
    if (v !== v || t !== t) continue;
    keptTime[j] = t;
    kept[j++] = v * scale + offset;
  }
  return { time: keptTime, values: kept };
}

function clippingWarning(channel: Channel, clipping: Clipping): string | null {
  const parts: string[] = [];
  if (clipping.high > 0) parts.push(`${clipping.high} samples at the top rail (${formatEngineering(clipping.highLevel, channel.unit)})`);
  if (clipping.low > 0) parts.push(`${clipping.low} samples at the bottom rail (${formatEngineering(clipping.lowLevel, channel.unit)})`);
  if (parts.length === 0) return null;
  return `channel '${channel.name}': ${parts.join(' and ')} sit in flat runs and look clipped by the ADC; they are marked and left out of fits`;
}

export function assembleCapture(
  layout: Layout,
  store: StoredRows,
  lines: RowLines,
  options: CaptureOptions,
  footer: string[],
  source: TextSource,
): Capture {
  const rows = store.length;
  if (rows < MIN_SAMPLES) {
    throw new CaptureError(`only ${rows} data row(s) from line ${layout.firstDataLine}; at least ${MIN_SAMPLES} samples are needed`);
  }
  resolveFirstColumn(layout, store, lines, options);
  const warnings = [...layout.warnings];
  const axes = new Map<number | null, Axis>();
  const axisOf = (column: ColumnPlan): Axis => {
    const key = column.timeColumn;
    let axis = axes.get(key);
    if (axis) return axis;
    const source = key === null ? null : layout.columns[key];
    axis =
      source === null || source.kind === 'timestamp'
        ? intervalAxis(layout, rows, warnings, source)
        : columnAxis(key as number, layout, store, lines, options, warnings);
    axes.set(key, axis);
    return axis;
  };

  const channels: Channel[] = [];
  const kept: KeptChannel[] = [];
  for (let c = 0; c < layout.columns.length; c++) {
    const column = layout.columns[c];
    if (column.kind !== 'value') continue;
    const axis = axisOf(column);
    const { channel, clipping } = buildChannel(column, store, c, axis);
    const usable = channel.values.length;
    if (usable < MIN_SAMPLES) {
      warnings.push(`channel '${channel.name}' has only ${usable} usable sample(s) and was left out`);
      continue;
    }
    if (channel.dropped > 0) {
      warnings.push(`channel '${channel.name}': ${channel.dropped} sample(s) dropped (empty, NaN, infinite or overrange cells)`);
    }
    const clipped = clippingWarning(channel, clipping);
    if (clipped) warnings.push(clipped);
    channels.push(channel);
    kept.push({ channel, column, axis });
  }
  if (channels.length === 0) {
    throw new CaptureError(`no channel has at least ${MIN_SAMPLES} usable samples`, layout.firstDataLine);
  }
  const unitless = unitlessTimeNote(layout.columns, kept);
  if (unitless) warnings.push(unitless);
  const sampleInterval = commonInterval(kept.map((k) => k.axis));
  const stated = layout.interval;
  if (stated && kept.some((k) => k.axis.interval !== null && Math.abs(k.axis.interval - stated.value) > 0.01 * stated.value)) {
    warnings.push(`the time column's step differs from the interval stated by ${stated.source} (${seconds(stated.value)}); the time column is used`);
  }
  warnings.push(...footer);
  return {
    channels,
    sampleInterval,
    metadata: layout.preamble.metadata,
    warnings,
    layout: {
      delimiter: layout.delimiter,
      decimalComma: layout.decimalComma,
      headerLine: layout.headerLine,
      firstDataLine: layout.firstDataLine,
      rows,
    },
    importSummary: summarizeImport(source, layout, rows, kept, lines, warnings),
  };
}

/** The interval shared by all axes (to 1e-6), or null. */
function commonInterval(axes: Axis[]): number | null {
  const first = axes[0]?.interval ?? null;
  if (first === null) return null;
  return axes.every((a) => a.interval !== null && Math.abs(a.interval - first) <= 1e-6 * first) ? first : null;
}
