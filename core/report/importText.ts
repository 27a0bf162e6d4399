// What the importer inferred, as labelled lines of text: the one wording every face shows (fit, reports, the window).
// Names taken from the file (columns, units, keys) are shown with their control characters escaped.

import type { ChannelImport, DelimiterName, ImportSummary, TimeSource } from '../capture/importSummary';
import { formatEngineering } from '../units/format';
import { escapeControls } from './escape';

export interface ImportRow {
  label: string;
  text: string;
}

const DELIMITER_TEXT: Record<DelimiterName, string> = {
  comma: 'comma-separated',
  semicolon: 'semicolon-separated',
  tab: 'tab-separated',
  whitespace: 'space-separated',
  none: 'one column',
};
const LINE_END_TEXT = { CRLF: 'CR LF line ends', LF: 'LF line ends', CR: 'CR line ends' } as const;

function plural(count: number, one: string): string {
  return `${count.toLocaleString('en')} ${one}${count === 1 ? '' : 's'}`;
}

function readAs(s: ImportSummary): string {
  const named = s.encoding.byteOrderMark ? `${s.encoding.name} with byte-order mark` : s.encoding.name;
  const encoding = s.encoding.note ? `${named} (${s.encoding.note})` : named;
  const decimal = s.decimalMark === ',' ? 'decimal comma' : 'decimal point';
  return [encoding, DELIMITER_TEXT[s.delimiter], decimal, s.lineEnd === null ? 'one line' : LINE_END_TEXT[s.lineEnd]].join(', ');
}

function table(s: ImportSummary): string {
  const header = s.headerLine === null ? 'no header' : `header on line ${s.headerLine}`;
  return `${header}, data from line ${s.firstDataLine}, ${plural(s.rows, 'row')}`;
}

/** Where the time came from, in words: the column and its unit, or the interval and where it was stated. */
export function timeSourceText(time: TimeSource): string {
  if (time.kind === 'column') return `column '${escapeControls(time.column)}' ${time.unit === '' ? '(no unit: seconds)' : `in ${escapeControls(time.unit)}`}`;
  const where = time.from === 'option' ? '--sample-interval' : `'${escapeControls(time.key ?? '')}' on line ${time.line}`;
  return `interval ${formatEngineering(time.interval, 's')} from ${where}`;
}

function timeAxis(s: ImportSummary): string {
  const step =
    s.jitter === null
      ? `every ${formatEngineering(s.sampleInterval, 's')}`
      : `uneven: mean step ${formatEngineering(s.sampleInterval, 's')}, jitter ${formatEngineering(s.jitter, 's')}`;
  return s.time.kind === 'column' ? `${timeSourceText(s.time)}, ${step}` : `${timeSourceText(s.time)}${s.jitter === null ? '' : `, ${step}`}`;
}

function channel(c: ChannelImport): string {
  const counts = [plural(c.samples, 'sample')];
  if (c.dropped > 0) counts.push(`${c.dropped.toLocaleString('en')} dropped`);
  if (c.clipped > 0) counts.push(`${c.clipped.toLocaleString('en')} clipped`);
  return `${escapeControls(c.name)}${c.unit ? ` (${escapeControls(c.unit)})` : ''}: ${counts.join(', ')}`;
}

function droppedRows(s: ImportSummary): string {
  return s.droppedRows.map((d) => `${d.count.toLocaleString('en')} (${d.reason}${d.firstLine === null ? '' : `, first on line ${d.firstLine}`})`).join('; ');
}

function sections(s: ImportSummary): string {
  const parts = s.ignoredSections.map((x) => `lines ${x.firstLine}-${x.lastLine} ignored (${x.reason})`);
  if (s.segments.length > 0) parts.push(`${plural(s.segments.length, 'segment')}: ${s.segments.map((g) => `lines ${g.firstLine}-${g.lastLine}${g.read ? ' (read)' : ''}`).join(', ')}`);
  return parts.join('; ');
}

/** Four to six labelled rows: how the text was read, the table, the time axis, the channels, and any drops or sections. */
export function importRows(s: ImportSummary): ImportRow[] {
  const rows: ImportRow[] = [
    { label: 'import', text: readAs(s) },
    { label: 'table', text: table(s) },
    { label: 'time axis', text: timeAxis(s) },
    { label: 'channels', text: s.channels.map(channel).join('; ') },
  ];
  if (s.droppedRows.length > 0) rows.push({ label: 'rows left out', text: droppedRows(s) });
  if (s.ignoredSections.length > 0 || s.segments.length > 0) rows.push({ label: 'sections', text: sections(s) });
  return rows;
}
