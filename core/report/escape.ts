// Escaping of user text for the terminal, HTML, Markdown and CSV: the only place printed and report strings are made safe.

/**
 * Characters that act instead of showing: C0 controls (ESC starts the sequences that clear a screen or set a
 * terminal's title), DEL, C1 controls (U+009B is a one-byte CSI to some terminals), the line and paragraph
 * separators, and the bidirectional controls that reorder what is shown (U+202E, right-to-left override).
 */
const CONTROLS = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;
/** The same, less the line feed and tab that lay out a whole page of output. */
const CONTROLS_BUT_LAYOUT = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/**
 * Every control character shown as its `\uXXXX` escape (ESC as `\u001b`), so text from a capture header, a
 * cell, a file name or a log record can neither drive a terminal nor reorder a line. `'keep-layout'` leaves
 * line feeds and tabs for whole output; a single field escapes them too. The `\uXXXX` form is also a JSON
 * escape of the same character, so JSON output escaped this way still parses to the same strings.
 */
export function escapeControls(text: string, mode: 'all' | 'keep-layout' = 'all'): string {
  return text.replace(mode === 'all' ? CONTROLS : CONTROLS_BUT_LAYOUT, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

const HTML_ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text safe inside HTML element content and double- or single-quoted attribute values; controls shown escaped. */
export function escapeHtml(text: string): string {
  return escapeControls(text, 'keep-layout').replace(/[&<>"']/g, (c) => HTML_ENTITIES[c]);
}

/**
 * Text safe inside a Markdown paragraph or table cell: line breaks become spaces, other controls are shown
 * escaped, emphasis, code, link and table punctuation are backslash-escaped, HTML-significant characters
 * entity-encoded, and a block marker at the start (heading, list, rule, numbered item) escaped.
 */
export function escapeMarkdown(text: string): string {
  return escapeControls(text.replace(/[\r\n]+/g, ' '))
    .replace(/[\\`*_[\]|~]/g, (c) => `\\${c}`)
    .replace(/[&<>"]/g, (c) => HTML_ENTITIES[c])
    .replace(/^(\s*)(?:([#+=-])(?=[#+=-]*(?:\s|$))|(\d+)([.)])(?=\s|$))/, (_, space, marker, digits, mark) =>
      marker ? `${space}\\${marker}` : `${space}${digits}\\${mark}`,
    );
}

/**
 * Text inside a Markdown code span (`...`), where backslash escapes do not work: a backtick would close the
 * span, so it becomes an apostrophe, and a line break would end the block around it, so every control is
 * shown escaped.
 */
export function markdownCode(text: string): string {
  return `\`${escapeControls(text).replace(/`/g, "'")}\``;
}

/**
 * A cell a spreadsheet would run as a formula: = + - @ after any leading white space, or a tab or carriage
 * return first.
 */
const FORMULA_START = /^\s*[=+\-@]|^[\t\r]/;

/** A plain decimal number such as '-12.5' or '4.7e-9': left as it is. */
const NUMERIC_TEXT = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/**
 * One CSV cell (RFC 4180 quoting). Numbers stay numbers; text that a spreadsheet would read as a
 * formula gets a leading apostrophe (common practice against CSV injection, see the OWASP
 * "CSV Injection" page).
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const safe = FORMULA_START.test(value) && !NUMERIC_TEXT.test(value.trim()) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) || safe !== safe.trim() ? `"${safe.replace(/"/g, '""')}"` : safe;
}
