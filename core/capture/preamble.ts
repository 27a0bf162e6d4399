// The lines before the header: key/value metadata, and the sample interval and start time they may state.

import { parseQuantityText } from '../units/parseQuantity';
import { unitScale } from '../units/unitScale';
import { WHITESPACE, splitLine, trimTrailingEmpty } from './splitLine';

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
const OFFSET_KEYS = new Set(['t0', 'x0', 'x origin', 'xorigin', 'start time', 'time offset', 'first time']);

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

function normaliseKey(key: string): { words: string; scale: number } {
  let scale = 1;
  const withoutUnit = key.replace(/\s*[([]\s*([^()[\]]*?)\s*[)\]]\s*/g, (_, unit: string) => {
    const found = unitScale(unit);
    if (found && found.unit === 's') scale = found.scale;
    return ' ';
  });
  const words = withoutUnit
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
  return { words, scale };
}

/** Numeric readings of a value such as '2.000000E-6,2.000000E-6', '2 ns' or '2,5E-6' (decimal comma). */
function timeReadings(value: string, decimalComma: boolean): number[] {
  const attempt = (text: string): number | null => {
    const normal = decimalComma ? text.replace(',', '.') : text;
    try {
      return parseQuantityText(normal, 's');
    } catch {
      return null;
    }
  };
  const whole = attempt(value);
  if (whole !== null) return [whole];
  const pieces = value.split(decimalComma ? /[;\t]|\s+/ : /[,;\t]|\s+/).filter((p) => p.trim() !== '');
  return pieces.map(attempt).filter((v): v is number => v !== null);
}

/** Metadata and stated timing of the preamble lines (blank and comment lines skipped). */
export function readPreamble(lines: PreambleLine[], delimiter: string, decimalComma: boolean): Preamble {
  const preamble: Preamble = { metadata: {}, interval: null, offset: null, warnings: [] };
  for (const { text, line } of lines) {
    if (isBlankOrComment(text)) continue;
    const pair = splitKeyValue(text, delimiter);
    if (!pair) continue;
    const [key, value] = pair;
    if (!(key in preamble.metadata)) preamble.metadata[key] = value;
    const { words, scale } = normaliseKey(key);
    const isInterval = INTERVAL_KEYS.has(words);
    if (!isInterval && !OFFSET_KEYS.has(words)) continue;
    const readings = timeReadings(value, decimalComma).map((v) => v * scale);
    if (readings.length === 0) continue;
    const stated: StatedTime = { value: readings[0], key, line };
    if (readings.some((v) => Math.abs(v - readings[0]) > 1e-9 * Math.abs(readings[0]))) {
      preamble.warnings.push(`line ${line}: '${key}' gives several different values; the first (${value.split(/[,;\t]/)[0].trim()}) is used`);
    }
    if (isInterval && preamble.interval === null && readings[0] > 0) preamble.interval = stated;
    if (!isInterval && preamble.offset === null) preamble.offset = stated;
  }
  return preamble;
}
