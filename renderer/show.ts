// Values for the screen: engineering notation with units, and the raw SI value kept for tests and copying.

import { formatEngineering, formatMeasured } from '../core/units/format';
import { relativeUncertainty, type Quantity } from '../core/quantity';
import { h } from './dom';

export function showQuantity(q: Quantity | null | undefined): string {
  if (!q) return '—';
  if (q.value === null || !Number.isFinite(q.value)) return 'not defined';
  return pretty(formatMeasured(q));
}

export function showValue(value: number | null | undefined, unit: string, digits = 4): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : pretty(formatEngineering(value, unit, digits));
}

/**
 * Value and relative uncertainty only, for narrow tables: '11.02 ks⁻¹ ± 0.13 %'; the standard uncertainty itself
 * where a relative one says nothing (a value within two of them of zero: '-120 µA ± 780 µA').
 */
export function showCompact(q: Quantity): string {
  if (q.value === null || !Number.isFinite(q.value)) return 'not defined';
  const value = showValue(q.value, q.unit, 4);
  if (q.stderr === null) return value;
  const share = q.stderr === 0 ? 0 : relativeUncertainty(q);
  if (share === null) return `${value} ± ${showValue(q.stderr, q.unit, 2)}`;
  const percent = 100 * share;
  return `${value} ± ${percent < 0.1 ? percent.toPrecision(1) : percent.toPrecision(2)} %`;
}

/** Units as they are printed: s^-1 as s⁻¹. */
function pretty(text: string): string {
  return text.replace(/\^-1/g, '⁻¹');
}

/**
 * One row of a result table: the symbol, its words, and the value with its uncertainty; `text`, where given, is the
 * value as the result row table writes it (fitResultRows: an event time has no relative uncertainty).
 */
export function quantityRow(key: string, symbol: string, words: string, q: Quantity | null | undefined, title = words, text?: string): HTMLTableRowElement {
  return h(
    'tr',
    { data: { quantity: key, ...(q ? { value: String(q.value), stderr: String(q.stderr) } : {}) } },
    // The title keeps the words whole where a narrow readout cuts them short.
    h('th', { title, attrs: { scope: 'row' } }, h('span', { class: 'symbol' }, symbol), h('span', { class: 'words' }, words)),
    h('td', { class: 'number' }, text === undefined ? showQuantity(q) : pretty(text)),
  );
}
