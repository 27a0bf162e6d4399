// Measurement cursors: two times and two levels on the plot, and what they read (Δt, 1/Δt, ΔV) in engineering notation.

import { formatEngineering } from '../../core/units/format';
import type { Range } from './viewRange';

export type CursorId = 't1' | 't2' | 'v1' | 'v2';
export type CursorPositions = Record<CursorId, number>;

/** Where new cursors are placed: at these shares of the view, apart enough to grab and read at once. */
const FIRST_SHARE = 1 / 3;
const SECOND_SHARE = 2 / 3;
/** Digits of a cursor readout: a pixel of a 1600-pixel plot is about 1/1600 of the view. */
const DIGITS = 4;

export interface CursorReadout {
  id: string;
  label: string;
  value: number;
  text: string;
}

/** Cursors placed inside the view shown. */
export function placeCursors(x: Range, y: Range): CursorPositions {
  const at = (r: Range, share: number) => r[0] + (r[1] - r[0]) * share;
  return { t1: at(x, FIRST_SHARE), t2: at(x, SECOND_SHARE), v1: at(y, FIRST_SHARE), v2: at(y, SECOND_SHARE) };
}

/** The readouts in the order shown: each cursor, then the differences (ΔV in the channel's unit; ΔI for a current). */
export function cursorReadouts(p: CursorPositions, unit: string): CursorReadout[] {
  const level = levelSymbol(unit);
  const dt = p.t2 - p.t1;
  const dv = p.v2 - p.v1;
  const read = (id: string, label: string, value: number, valueUnit: string): CursorReadout => ({
    id,
    label,
    value,
    text: Number.isFinite(value) ? formatEngineering(value, valueUnit, DIGITS) : '—',
  });
  return [
    read('t1', 'T1', p.t1, 's'),
    read('t2', 'T2', p.t2, 's'),
    read('dt', 'Δt', dt, 's'),
    read('rate', '1/Δt', dt === 0 ? Number.NaN : 1 / Math.abs(dt), 'Hz'),
    read('v1', `${level}1`, p.v1, unit),
    read('v2', `${level}2`, p.v2, unit),
    read('dv', `Δ${level}`, dv, unit),
  ];
}

/** The letter of a level cursor: I on a current channel, V otherwise. */
export function levelSymbol(unit: string): string {
  return unit === 'A' ? 'I' : 'V';
}
