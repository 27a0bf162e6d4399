// Reads what the user types into the panels that the command line has no option for: signed source levels and
// window times, a sample's known option. Parts, tolerances and positive values are read by core/workflow/userValues.ts.

import { parseQuantityText } from '../core/units/parseQuantity';
import { BenchError } from './benchError';

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
