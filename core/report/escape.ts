// Escaping of user text for HTML, Markdown and CSV: the only place report strings are made safe.

const HTML_ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text safe inside HTML element content and double- or single-quoted attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => HTML_ENTITIES[c]);
}

/**
 * Text safe inside a Markdown paragraph or table cell: emphasis, code, link and table punctuation
 * are backslash-escaped, HTML-significant characters entity-encoded, a block marker at the start
 * escaped, and line breaks become spaces.
 */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/[\r\n]+/g, ' ')
    .replace(/[\\`*_[\]|~]/g, (c) => `\\${c}`)
    .replace(/[&<>"]/g, (c) => HTML_ENTITIES[c])
    .replace(/^(\s*)([#+-]|\d+[.)])(?=\s|$)/, '$1\\$2');
}

/** A cell a spreadsheet would run as a formula: starts with = + - @, tab or carriage return. */
const FORMULA_START = /^[=+\-@\t\r]/;

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
  const safe = FORMULA_START.test(value) && !NUMERIC_TEXT.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) || safe !== safe.trim() ? `"${safe.replace(/"/g, '""')}"` : safe;
}
