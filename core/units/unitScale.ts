// Reads a unit token such as 'mV', 'µs' or 'kΩ' (from a column header or a value) into scale and SI unit.

import { PREFIX_EXPONENT, canonicalUnit } from './prefixes';

export interface UnitScale {
  /** Multiplier from the written unit to the SI base unit (1e-3 for 'mV'). */
  scale: number;
  /** Internal SI unit string ('V', 's', 'ohm', ...). */
  unit: string;
}

/** 'mV' -> { scale: 1e-3, unit: 'V' }, 'us' -> { 1e-6, 's' }; null when the token is not a known unit. */
export function unitScale(unitText: string): UnitScale | null {
  const token = unitText.trim();
  if (token === '') return null;
  const whole = canonicalUnit(token);
  if (whole !== null) return { scale: 1, unit: whole };
  const exponent = PREFIX_EXPONENT[token[0]];
  if (exponent === undefined) return null;
  const rest = canonicalUnit(token.slice(1));
  return rest === null ? null : { scale: Number(`1e${exponent}`), unit: rest };
}
