// The lines before the header: key/value metadata, and the sample interval and start time they may state.

import { isUnitAttempt, printable, readUnitText, unitProblem, type StatedUnit } from '../units/unitText';
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
  'delta t',
  'deltat',
  'dt',
  'time per point',
  'time step',
  'timestep',
  'increment',
]);
/** Keys that state the time of the first sample (used only when numeric). */
const OFFSET_KEYS = new Set(['t0', 'x0', 'x origin', 'xorigin', 'start', 'start time', 'time offset', 'first time']);

export interface StatedTime {
  /** Value in s. */
  value: number;
  /** The key as written. */
  key: string;
  /** 1-based line. */
  line: number;
}

export interface Preamble {
  metadata: Record<string, string>;
  interval: StatedTime | null;
  offset: StatedTime | null;
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

/** Key and value of one preamble line, or null when the line is not key/value shaped. */
export function splitKeyValue(text: string, delimiter: string): [string, string] | null {
  // 'Key: value' or 'Key = value' when the ':' or '=' comes before any cell separator.
  const separated = /^\s*([^:=,;\t]+?)\s*[:=]\s*(.*?)\s*$/.exec(text);
  if (separated) return [separated[1], separated[2]];
  const separators = [delimiter, '\t', ';', ','].filter((d) => d !== '' && d !== WHITESPACE && text.includes(d));
  for (const separator of separators) {
    const cells = trimTrailingEmpty(splitLine(text, separator)).map((c) => c.trim());
    if (cells.length >= 2 && cells[0] !== '') return [cells[0], cells.slice(1).join(separator)];
  }
  const spaced = /^\s*(.*?[^\s\d.+-].*?)\s+([-+]?\.?\d.*?)\s*$/.exec(text);
  return spaced ? [spaced[1], spaced[2]] : null;
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
/** Text after a number that is meant as its unit: no digits and no separators ('ns', 'furlongs', 'µx'). */
const UNIT_SHAPED = /^[^\s\d.,;:/+\-=()[\]]+$/;

interface TimeReading {
  /** The number as written. */
  number: number;
  /** The unit written after it, or null. */
  unitText: string | null;
}

/**
 * The number and unit of one cell ('2 ns', '2e-9', '2.0E-9 s (500 MSa/s)', '2e-9 2e-9'); null when the cell is no
 * number of time (a date, a clock time).
 */
function readCell(cell: string, decimalComma: boolean): TimeReading | null {
  const found = NUMBER_FIRST.exec((decimalComma ? cell.replace(',', '.') : cell).trim());
  if (!found) return null;
  const [, number, space, rest] = found;
  const token = rest.split(/\s+/)[0];
  if (rest === '' || (space !== '' && NUMBER_FIRST.exec(token)?.[3] === '')) return { number: Number(number), unitText: null };
  return UNIT_SHAPED.test(token) ? { number: Number(number), unitText: token } : null;
}

/** Readings of a value such as '2.000000E-6,2.000000E-6', '2 ns' or '2,5E-6' (decimal comma). */
function timeReadings(value: string, decimalComma: boolean): TimeReading[] {
  const cells = value.split(decimalComma ? /[;\t]/ : /[,;\t]/);
  return cells.map((cell) => readCell(cell, decimalComma)).filter((r): r is TimeReading => r !== null);
}

/**
 * Seconds in a stated time: the --time-unit when given (with a note when the file writes another unit), else the unit
 * after the number, else the key's, else seconds. A unit that does not read as time is a CaptureError on `line`.
 */
function secondsOf(reading: TimeReading, keyUnit: string | null, timeUnit: StatedUnit | undefined, key: string, line: number, notes: string[]): number {
  const written = reading.unitText ?? keyUnit;
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

/** Metadata and stated timing of the preamble lines (blank and comment lines skipped). */
export function readPreamble(lines: PreambleLine[], delimiter: string, decimalComma: boolean, timeUnit?: StatedUnit): Preamble {
  const preamble: Preamble = { metadata: {}, interval: null, offset: null, warnings: [] };
  for (const { text, line } of lines) {
    if (isBlankOrComment(text)) continue;
    const pair = splitKeyValue(text, delimiter);
    if (!pair) continue;
    const [key, value] = pair;
    if (!(key in preamble.metadata)) preamble.metadata[key] = value;
    const { words, unitText } = normaliseKey(key);
    const isInterval = INTERVAL_KEYS.has(words);
    if (!isInterval && !OFFSET_KEYS.has(words)) continue;
    const notes: string[] = [];
    const readings = timeReadings(value, decimalComma).map((r) => secondsOf(r, unitText, timeUnit, key, line, notes));
    if (readings.length === 0) continue;
    preamble.warnings.push(...notes.slice(0, 1));
    const stated: StatedTime = { value: readings[0], key, line };
    if (readings.some((v) => Math.abs(v - readings[0]) > 1e-9 * Math.abs(readings[0]))) {
      preamble.warnings.push(`line ${line}: '${key}' gives several different values; the first (${value.split(/[,;\t]/)[0].trim()}) is used`);
    }
    if (isInterval && preamble.interval === null && readings[0] > 0) preamble.interval = stated;
    if (!isInterval && preamble.offset === null) preamble.offset = stated;
  }
  return preamble;
}
