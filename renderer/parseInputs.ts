// Reads what the user types into the panels: component values with SI prefixes, times, a sample's known option.
// Tolerances are read by parseTolerance in core/workflow/userValues.ts, the same rule as the command line.

import { parseQuantityText } from '../core/units/parseQuantity';
import { BenchError } from './benchError';

/** '470n', '470 nF', '4k7', '2.2u' in the given unit; positive and finite. */
export function parsePositive(text: string, unit: string, what: string): number {
  let value: number;
  try {
    value = parseQuantityText(text.trim(), unit);
  } catch (error) {
    throw new BenchError(`${what}: ${(error as Error).message}`);
  }
  if (!(value > 0) || !Number.isFinite(value)) throw new BenchError(`${what}: must be a positive value, got '${text}'`);
  return value;
}

/** A value that may be zero or negative (source levels), with SI prefixes. */
export function parseSigned(text: string, unit: string, what: string): number {
  try {
    return parseQuantityText(text.trim(), unit);
  } catch (error) {
    throw new BenchError(`${what}: ${(error as Error).message}`);
  }
}

/** 'C=47u' (a sample's known option) as name and value text. */
export function splitKnownOption(option: string): { name: 'R' | 'L' | 'C'; text: string } | null {
  const match = /^\s*([RLC])\s*=\s*([^,]+?)\s*(?:,.*)?$/i.exec(option);
  return match ? { name: match[1].toUpperCase() as 'R' | 'L' | 'C', text: match[2] } : null;
}

/** A relative tolerance as the user reads it: 0.05 -> '5'. */
export function percentText(tolerance: number): string {
  return tolerance === 0 ? '' : String(Number((tolerance * 100).toPrecision(6)));
}
