// Reads a column header cell ('Time (s)', 't [us]', 'time_ns', 'CH1 [mV]', 'Voltage(V)') into name, unit and scale.

import { unitScale } from '../units/unitScale';

export interface ColumnHeading {
  /** Name without its unit, as written ('' when the cell held only a unit). */
  name: string;
  /** SI unit after prefix scaling, '' when none or unknown. */
  unit: string;
  /** Multiplier from the written values to SI base units. */
  scale: number;
  /** The unit text when it was given but not recognised, else null. */
  unknownUnit: string | null;
}

const BRACKETED = /^(.*?)\s*[([]\s*([^()[\]]*?)\s*[)\]]\s*$/;
const SLASHED = /^(.+?)\s*\/\s*([^\s/]+)$/;
const UNDERSCORED = /^(.+?)_([^_\s]+)$/;
const TIME_NAME = /^(?:t|x|sec|secs|seconds?|timestamp|zeit|tempo)$|^time/i;

/** True for a column name that means time ('Time', 't', 'TimeV_S', 'Time - V_C', 'timestamp'). */
export function isTimeName(name: string): boolean {
  return TIME_NAME.test(name.trim());
}

export function parseColumnHeading(cell: string): ColumnHeading {
  const text = cell.trim();
  const bracketed = BRACKETED.exec(text);
  if (bracketed) {
    const found = bracketed[2] === '' ? { scale: 1, unit: '' } : unitScale(bracketed[2]);
    return {
      name: bracketed[1],
      unit: found?.unit ?? '',
      scale: found?.scale ?? 1,
      unknownUnit: found ? null : bracketed[2],
    };
  }
  const slashed = SLASHED.exec(text);
  const bySlash = slashed ? unitScale(slashed[2]) : null;
  if (slashed && bySlash) return { name: slashed[1], ...bySlash, unknownUnit: null };
  // 'time_ns' or 'CH1_mV'; a one-letter suffix ('V_C', 'I_A') is part of the name unless the column is time.
  const underscored = UNDERSCORED.exec(text);
  const byUnderscore = underscored ? unitScale(underscored[2]) : null;
  if (underscored && byUnderscore && (underscored[2].length >= 2 || isTimeName(underscored[1]))) {
    return { name: underscored[1], ...byUnderscore, unknownUnit: null };
  }
  return { name: text, unit: '', scale: 1, unknownUnit: null };
}

/** True when every non-empty cell is only a unit ('(s)', '[V]', 'mV'): a units row under the names. */
export function isUnitsRow(cells: string[]): boolean {
  const filled = cells.map((c) => c.trim()).filter((c) => c !== '');
  return filled.length > 0 && filled.every((c) => unitScale(c.replace(/^[([]\s*|\s*[)\]]$/g, '')) !== null);
}
