// The check of an import summary kept in a bench-log record (read from the log or sent by a window), field by field.

import { isCount, isObject, isText, MAX_WARNING, type Json } from './jsonShape';

const SUMMARY_KEYS = [
  'encoding',
  'delimiter',
  'decimalMark',
  'lineEnd',
  'headerLine',
  'firstDataLine',
  'rows',
  'time',
  'sampleInterval',
  'jitter',
  'channels',
  'droppedRows',
  'ignoredSections',
  'segments',
  'warnings',
];
const DELIMITERS = ['comma', 'semicolon', 'tab', 'whitespace', 'none'];
const LINE_ENDS = ['CRLF', 'LF', 'CR', null];

function isLine(value: unknown): boolean {
  return typeof value === 'number' && Number.isInteger(value) && value >= 1;
}

function isListOf(value: unknown, item: (x: Json) => boolean): boolean {
  return Array.isArray(value) && value.every((x) => isObject(x) && item(x));
}

function timeProblem(time: unknown): string | null {
  if (!isObject(time)) return 'time must be an object';
  if (time.kind === 'column') {
    return isText(time.column) && isLine(time.index) && isText(time.unit) ? null : 'time: a column source needs column, index and unit';
  }
  if (time.kind === 'interval') {
    const stated = time.from === 'preamble' ? isText(time.key) && isLine(time.line) : time.from === 'option' && time.key === null && time.line === null;
    return typeof time.interval === 'number' && time.interval > 0 && stated ? null : 'time: an interval source needs interval, from, key and line';
  }
  return "time.kind must be 'column' or 'interval'";
}

/** The first thing wrong with an import summary, as a phrase naming the field, or null. */
export function importSummaryProblem(value: unknown): string | null {
  if (!isObject(value)) return 'must be an import summary';
  const extra = Object.keys(value).find((key) => !SUMMARY_KEYS.includes(key));
  if (extra !== undefined) return `has an unknown field "${extra}"`;
  const encoding = value.encoding;
  if (!isObject(encoding) || !isText(encoding.name) || typeof encoding.byteOrderMark !== 'boolean') return 'encoding must give name and byteOrderMark';
  if (!DELIMITERS.includes(value.delimiter as string)) return `delimiter must be one of ${DELIMITERS.join(', ')}`;
  if (value.decimalMark !== '.' && value.decimalMark !== ',') return "decimalMark must be '.' or ','";
  if (!LINE_ENDS.includes(value.lineEnd as string | null)) return 'lineEnd must be CRLF, LF, CR or null';
  if (!(value.headerLine === null || isLine(value.headerLine)) || !isLine(value.firstDataLine) || !isCount(value.rows)) {
    return 'headerLine, firstDataLine and rows must be line numbers and a count';
  }
  const time = timeProblem(value.time);
  if (time) return time;
  if (typeof value.sampleInterval !== 'number' || !(value.jitter === null || typeof value.jitter === 'number')) return 'sampleInterval and jitter must be numbers';
  if (!isListOf(value.channels, (c) => isText(c.name) && isText(c.unit) && isCount(c.samples) && isCount(c.dropped) && isCount(c.clipped))) {
    return 'channels must list name, unit, samples, dropped and clipped';
  }
  if (!isListOf(value.droppedRows, (d) => isText(d.reason) && isCount(d.count) && (d.firstLine === null || isLine(d.firstLine)))) {
    return 'droppedRows must list reason, count and firstLine';
  }
  if (!isListOf(value.ignoredSections, (x) => isLine(x.firstLine) && isLine(x.lastLine) && isText(x.reason))) return 'ignoredSections must list firstLine, lastLine and reason';
  if (!isListOf(value.segments, (x) => isLine(x.firstLine) && isLine(x.lastLine) && isCount(x.rows))) return 'segments must list firstLine, lastLine and rows';
  if (!Array.isArray(value.warnings) || !value.warnings.every((w) => isText(w, MAX_WARNING))) return 'warnings must be a list of text';
  return null;
}
