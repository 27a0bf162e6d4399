// The lines before the header: key/value metadata, and the sample interval, start time and time unit they may state.

import { isUnitAttempt, printable, readUnitText, unitProblem, type StatedUnit } from '../units/unitText';
import { readsAsTime } from './columnHeader';
import { WHITESPACE, splitLine, trimTrailingEmpty } from './splitLine';
import { CaptureError } from './types';

/** Normalised keys (lower case, words separated by one space, unit removed) that state the sample interval. */
const INTERVAL_KEYS = new Set([
  'sample interval',
  'sampling interval',
  'sample period',
  'sampling period',
  'xincrement',
  'x increment',
  'xincr',
  'x incr',
  'delta t',
  'deltat',
  'delta x',
  'dt',
  'time per point',
  'time step',
  'timestep',
  'increment',
]);
/** Normalised keys that state the sample rate instead: the interval is its reciprocal (when no interval is stated). */
const RATE_KEYS = new Set(['sample rate', 'sampling rate', 'samplerate', 'sample frequency', 'sampling frequency', 'sa rate']);
/**
 * The unit after a rate's number: samples or cycles per second with an SI prefix ('GSa/s', 'MS/s', 'kHz', 'Msps');
 * none means per second.
 */
const RATE_UNIT = /^([kMG]?)(?:Sa\/s|S\/s|sps|SPS|Hz)$|^$/;
const RATE_PREFIX: Readonly<Record<string, number>> = { '': 1, k: 1e3, M: 1e6, G: 1e9 };

/**
 * Normalised keys naming the sample clock ('#CLOCK=2.0000nS'): its unit tells whether it states the interval (a unit
 * of time) or the rate (Hz, Sa/s); without a unit it states neither.
 */
const CLOCK_KEYS = new Set(['clock', 'sample clock', 'sampling clock']);

/** Keys that state the time of the first sample (used only when numeric). */
const OFFSET_KEYS = new Set(['t0', 'x0', 'x origin', 'xorigin', 'start', 'start time', 'time offset', 'first time']);
/** Keys that state the unit of the horizontal axis: of a time column without a unit, and of times stated without one. */
const TIME_UNIT_KEYS = new Set([
  'horizontal unit',
  'horizontal units',
  'time unit',
  'time units',
  'x unit',
  'x units',
  'xunit',
  'xunits',
  'x axis unit',
  'x axis units',
]);

/** Keys that state the unit of the vertical axis: of a channel whose header gives none ('Vertical Units,V'). */
const VALUE_UNIT_KEYS = new Set(['vertical unit', 'vertical units', 'y unit', 'y units', 'yunit', 'yunits', 'y axis unit', 'y axis units', 'y unit label']);

export interface StatedTime {
  /** Value in s. */
  value: number;
  /** The key as written. */
  key: string;
  /** 1-based line. */
  line: number;
  /** False when neither the line nor a stated time unit (the preamble's or the timeUnit option) gave the unit: read as seconds. */
  unitStated: boolean;
}

/** A time unit a preamble line states, read ('Horizontal units,us': 1e-6 s). */
export interface StatedTimeUnit extends StatedUnit {
  /** The key as written. */
  key: string;
  /** 1-based line. */
  line: number;
  /** Why the text is no unit of time ('' when it is one): refused only where the unit is needed (usableTimeUnit). */
  problem: string;
}

/** A channel unit a preamble line states, read ('Vertical Units,V'; 'Vertical Units,CH1:mV' for one channel). */
export interface StatedValueUnit extends StatedUnit {
  /** The key as written. */
  key: string;
  /** 1-based line. */
  line: number;
}

export interface Preamble {
  metadata: Record<string, string>;
  interval: StatedTime | null;
  offset: StatedTime | null;
  /** The unit of the horizontal axis the preamble states, or null. */
  timeUnit: StatedTimeUnit | null;
  /** The channels' unit the preamble states when it reads as one (V, mV, A...), or null: for channels whose header gives none. */
  valueUnit: StatedValueUnit | null;
  warnings: string[];
}

export interface PreambleLine {
  text: string;
  line: number;
}

/** True for a line with no content or a comment ('#', ';', '//', '%'). */
export function isBlankOrComment(text: string): boolean {
  const t = text.trim();
  return t === '' || t[0] === '#' || t[0] === ';' || t[0] === '%' || t.startsWith('//');
}

/**
 * Key and value of one preamble line, or null when the line is not key/value shaped. Read by scanning, not by one
 * regular expression with lazy groups: those took time quadratic or worse in a long line's length (a 400 kB line of
 * words and spaces ran for minutes).
 */
export function splitKeyValue(text: string, delimiter: string): [string, string] | null {
  // 'Key: value' or 'Key = value' when the ':' or '=' comes before any cell separator.
  const mark = text.search(/[:=,;\t]/);
  if (mark > 0 && (text[mark] === ':' || text[mark] === '=')) {
    const key = text.slice(0, mark).trim();
    if (key !== '') return [key, text.slice(mark + 1).trim()];
  }
  const separators = [delimiter, '\t', ';', ','].filter((d) => d !== '' && d !== WHITESPACE && text.includes(d));
  for (const separator of separators) {
    const cells = trimTrailingEmpty(splitLine(text, separator)).map((c) => c.trim());
    if (cells.length >= 2 && cells[0] !== '') return [cells[0], cells.slice(1).join(separator)];
  }
  return spacedKeyValue(text.trim());
}

/** A character that can stand in a number ('-1.5e+3' less the e): a key holds at least one other. */
const NUMBER_CHARACTER = /[\s\d.+-]/;
/** The start of a number: an optional sign, an optional point, a digit. */
const NUMBER_START = /^[-+]?\.?\d/;

/**
 * 'Sample interval 2e-9' or 'Points   2500': the key runs to the first whitespace, after a character no number holds,
 * that a number follows; the value is the rest. Null when there is none.
 */
function spacedKeyValue(line: string): [string, string] | null {
  let i = 0;
  while (i < line.length && NUMBER_CHARACTER.test(line[i])) i++;
  for (i++; i < line.length; i++) {
    if (!/\s/.test(line[i])) continue;
    let next = i;
    while (next < line.length && /\s/.test(line[next])) next++;
    if (NUMBER_START.test(line.slice(next, next + 3))) return [line.slice(0, i), line.slice(next)];
    i = next;
  }
  return null;
}

/** The key's words (lower case, unit removed) and the unit of its last bracket ('Sample interval (us)'; not '(CH1)'). */
function normaliseKey(key: string): { words: string; unitText: string | null } {
  let unitText: string | null = null;
  const withoutUnit = key.replace(/\s*[([]\s*([^()[\]]*?)\s*[)\]]\s*/g, (_, unit: string) => {
    unitText = isUnitAttempt(unit) ? unit : null;
    return ' ';
  });
  const words = withoutUnit
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
  return { words, unitText };
}

/** A number, the space after it, then what follows it in the same cell. */
const NUMBER_FIRST = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(\s*)(.*)$/;
/** A label naming what a number is for, before it in the same cell ('Analog:2.00E-09', 'CH1: 2e-9'): left out. */
const LABELLED = /^[A-Za-z][\w ]*?:\s*(?=[+-]?\.?\d)/;
/** Text after a number that is meant as its unit: no digits and no separators ('ns', 'furlongs', 'µx'). */
const UNIT_SHAPED = /^[^\s\d.,;:/+\-=()[\]]+$/;

interface TimeReading {
  /** The number as written. */
  number: number;
  /** The unit written after it, or null. */
  unitText: string | null;
}

/**
 * The number and unit of one cell ('2 ns', '2e-9', '2.0E-9 s (500 MSa/s)', '2e-9 2e-9', 'Analog:2e-9'); null when the cell is no
 * number of time (a date, a clock time).
 */
function readCell(cell: string, decimalComma: boolean): TimeReading | null {
  const bare = cell.trim().replace(LABELLED, '');
  const found = NUMBER_FIRST.exec(decimalComma ? bare.replace(',', '.') : bare);
  if (!found) return null;
  const [, number, space, rest] = found;
  const token = rest.split(/\s+/)[0];
  if (rest === '' || (space !== '' && NUMBER_FIRST.exec(token)?.[3] === '')) return { number: Number(number), unitText: null };
  return UNIT_SHAPED.test(token) ? { number: Number(number), unitText: token } : null;
}

/**
 * Readings of a value such as '2.000000E-6,2.000000E-6', '2 ns', '2,5E-6' (decimal comma) or '0.2,us' (the unit in
 * the cell after the number).
 */
function timeReadings(value: string, decimalComma: boolean): TimeReading[] {
  const cells = value.split(decimalComma ? /[;\t]/ : /[,;\t]/).map((c) => c.trim());
  const readings: TimeReading[] = [];
  cells.forEach((cell, k) => {
    const reading = readCell(cell, decimalComma);
    if (reading === null) return;
    const next = cells[k + 1] ?? '';
    if (reading.unitText === null && UNIT_SHAPED.test(next) && readsAsTime(readUnitText(next))) reading.unitText = next;
    readings.push(reading);
  });
  return readings;
}

/** The time unit a preamble line states ('us', 'S', 'Seconds'), or why it is none. */
function readTimeUnit(text: string, key: string, line: number): StatedTimeUnit {
  const written = text.split(/[,;\t]/)[0].trim();
  const reading = readUnitText(written);
  const problem = written === '' ? 'no unit given' : unitProblem(written, reading, true);
  if (reading.kind !== 'known' || problem !== '') return { text: written, scale: 1, unit: '', key, line, problem };
  return { text: written, scale: reading.scale, unit: reading.unit, key, line, problem };
}

/** The stated time unit, to read times in: a CaptureError on its line when it is no unit of time. */
export function usableTimeUnit(stated: StatedTimeUnit): StatedTimeUnit {
  if (stated.problem === '') return stated;
  throw new CaptureError(`'${printable(stated.key)}': ${stated.problem}; state the time unit with --time-unit`, stated.line);
}

/**
 * Seconds in a stated time: the --time-unit when given (with a note when the file writes another unit), else the unit
 * after the number, else the key's, else the preamble's time unit, else seconds. A unit that does not read as time is
 * a CaptureError on `line`.
 */
function secondsOf(
  reading: TimeReading,
  keyUnit: string | null,
  timeUnit: StatedUnit | undefined,
  stated: StatedTimeUnit | null,
  key: string,
  line: number,
  notes: string[],
): number {
  const written = reading.unitText ?? keyUnit;
  if (!timeUnit && written === null && stated) {
    if (usableTimeUnit(stated).scale !== 1) {
      notes.push(`line ${line}: '${printable(key)}' gives no unit: read in ${stated.text}, as '${printable(stated.key)}' on line ${stated.line} states`);
    }
    return reading.number * stated.scale;
  }
  if (timeUnit) {
    const file = written === null ? null : readUnitText(written);
    const same = file?.kind === 'known' && file.unit === timeUnit.unit && file.scale === timeUnit.scale;
    if (written !== null && !same) notes.push(`line ${line}: the unit '${printable(written)}' of '${printable(key)}' is replaced by --time-unit ${timeUnit.text}`);
    return reading.number * timeUnit.scale;
  }
  if (written === null) return reading.number;
  const file = readUnitText(written);
  const problem = unitProblem(written, file, true);
  if (problem !== '' || file.kind !== 'known') throw new CaptureError(`'${printable(key)}': ${problem}; state the time unit with --time-unit`, line);
  return reading.number * file.scale;
}

/** The comment marker and the space after it, at the start of a comment line. */
const COMMENT_MARKER = /^\s*(?:#+|;+|%+|\/\/+)\s*/;

/** A comment line's text after its marker; any other line as it is. */
export function uncommented(text: string): string {
  return text.replace(COMMENT_MARKER, '');
}

/**
 * True for a line that states the timing or a unit under a key this reader knows, with a value that reads as one
 * ('Vertical Units,V', 'Sample Interval,1e-9', 'YUNIT,V'): preamble, never the names of the columns, however much it
 * looks like them. A header whose first column is named like a key ('dt,CH1') states nothing, and stays a header.
 */
export function isStatingLine(text: string, delimiter: string): boolean {
  const pair = splitKeyValue(uncommented(text), delimiter);
  if (!pair) return false;
  const [key, value] = pair;
  const { words } = normaliseKey(key);
  if (TIME_UNIT_KEYS.has(words) || VALUE_UNIT_KEYS.has(words)) return unitCells(value).some((cell) => readUnitText(cell).kind === 'known');
  const timing = [INTERVAL_KEYS, RATE_KEYS, CLOCK_KEYS, OFFSET_KEYS].some((keys) => keys.has(words));
  return timing && NUMBER_FIRST.test(value.trim().replace(LABELLED, ''));
}

/** The units of a line stating them, one per channel or one for all ('Volts\tVolts', 'CH1:V,CH2:V'), labels left out. */
function unitCells(value: string): string[] {
  return value
    .split(/[,;\t]/)
    .map((c) => c.trim().replace(/^[A-Za-z][\w ]*?:\s*/, ''))
    .filter((c) => c !== '');
}

/**
 * The key, value and line of the first line whose key is one of `keys`. A comment line counts ('# Time units = us'): a
 * unit stated only there is still the unit the samples are written in.
 */
function firstKeyed(lines: PreambleLine[], delimiter: string, keys: ReadonlySet<string>): { key: string; value: string; line: number } | null {
  for (const { text, line } of lines) {
    const pair = splitKeyValue(uncommented(text), delimiter);
    if (pair && keys.has(normaliseKey(pair[0]).words)) return { key: pair[0], value: pair[1], line };
  }
  return null;
}

/** The first line stating the unit of the horizontal axis, read. */
function statedTimeUnit(lines: PreambleLine[], delimiter: string): StatedTimeUnit | null {
  const stated = firstKeyed(lines, delimiter, TIME_UNIT_KEYS);
  return stated && readTimeUnit(stated.value, stated.key, stated.line);
}

/**
 * The first line stating the unit of the vertical axis, when it holds one unit (after a channel label, 'CH1:V'; or the
 * same one per channel, 'Volts,Volts') and that reads as a channel's unit. A unit not read (divisions, a typing slip)
 * gives none, and so do several ('V,A': which channel has which is not sure): the channels then stay without a unit.
 */
function statedValueUnit(lines: PreambleLine[], delimiter: string): StatedValueUnit | null {
  const stated = firstKeyed(lines, delimiter, VALUE_UNIT_KEYS);
  if (!stated) return null;
  const cells = unitCells(stated.value);
  // One unit for each channel, the same for all ('Volts\tVolts'), is that unit.
  if (new Set(cells).size !== 1) return null;
  const written = cells[0];
  const reading = readUnitText(written);
  if (reading.kind !== 'known' || unitProblem(written, reading, false) !== '') return null;
  return { text: written, scale: reading.scale, unit: reading.unit, key: stated.key, line: stated.line };
}

/**
 * Metadata and stated timing of the preamble lines (blank lines skipped, comment lines but for the interval or rate). Times
 * stated without a unit are in the preamble's time unit when it states one; `timeUnit` (the option) is over both.
 */
export function readPreamble(lines: PreambleLine[], delimiter: string, decimalComma: boolean, timeUnit?: StatedUnit): Preamble {
  const stated = timeUnit ? null : statedTimeUnit(lines, delimiter);
  const preamble: Preamble = { metadata: {}, interval: null, offset: null, timeUnit: stated, valueUnit: statedValueUnit(lines, delimiter), warnings: [] };
  let rate: StatedTime | null = null;
  for (const { text, line } of lines) {
    // Behind a comment marker, only the sample interval or rate counts ('#Sampling rate:200MSa/s', as some scopes
    // write it): a comment's prose ('# Gate loop, bench 3') is no metadata.
    const commented = isBlankOrComment(text);
    const pair = splitKeyValue(commented ? uncommented(text) : text, delimiter);
    if (!pair) continue;
    const [key, value] = pair;
    const { words, unitText } = normaliseKey(key);
    const clock = CLOCK_KEYS.has(words) ? clockKind(value, unitText, decimalComma) : null;
    const isInterval = INTERVAL_KEYS.has(words) || clock === 'interval';
    const isRate = RATE_KEYS.has(words) || clock === 'rate';
    if (commented && !isInterval && !isRate) continue;
    if (!(key in preamble.metadata)) preamble.metadata[key] = value;
    if (CLOCK_KEYS.has(words) && !clock) continue;
    if (isRate) {
      rate ??= statedRate(value, key, line, decimalComma);
      continue;
    }
    if (!isInterval && !OFFSET_KEYS.has(words)) continue;
    const notes: string[] = [];
    const written = timeReadings(value, decimalComma);
    const readings = written.map((r) => secondsOf(r, unitText, timeUnit, stated, key, line, notes));
    if (readings.length === 0) continue;
    preamble.warnings.push(...notes.slice(0, 1));
    const unitStated = timeUnit !== undefined || stated !== null || (written[0].unitText ?? unitText) !== null;
    const time: StatedTime = { value: readings[0], key, line, unitStated };
    if (readings.some((v) => Math.abs(v - readings[0]) > 1e-9 * Math.abs(readings[0]))) {
      preamble.warnings.push(`line ${line}: '${key}' gives several different values; the first (${value.split(/[,;\t]/)[0].trim()}) is used`);
    }
    if (isInterval && preamble.interval === null && readings[0] > 0) preamble.interval = time;
    if (!isInterval && preamble.offset === null) preamble.offset = time;
  }
  preamble.interval ??= rate;
  return preamble;
}

/** Whether a sample clock's value states the interval or the rate, by its unit; null without a unit that says. */
function clockKind(value: string, keyUnit: string | null, decimalComma: boolean): 'interval' | 'rate' | null {
  const written = timeReadings(value, decimalComma)[0];
  const unit = written?.unitText ?? keyUnit;
  if (unit === null) return null;
  const reading = readUnitText(unit);
  if (reading.kind === 'known' && reading.unit === 's') return 'interval';
  return RATE_UNIT.test(unit) && unit !== '' ? 'rate' : null;
}

/** The sample interval a stated rate gives ('Sample Rate,1GSa/s': 1 ns), or null when the value reads as no rate. */
function statedRate(value: string, key: string, line: number, decimalComma: boolean): StatedTime | null {
  const first = value.split(decimalComma ? /[;\t]/ : /[,;\t]/)[0].trim().replace(LABELLED, '');
  const found = NUMBER_FIRST.exec(decimalComma ? first.replace(',', '.') : first);
  const unit = found ? RATE_UNIT.exec(found[3].split(/[\s(]/)[0]) : null;
  if (!found || !unit) return null;
  const perSecond = Number(found[1]) * RATE_PREFIX[unit[1] ?? ''];
  return perSecond > 0 && Number.isFinite(perSecond) ? { value: 1 / perSecond, key, line, unitStated: true } : null;
}
