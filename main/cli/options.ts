// Parsing of option values shared by several commands (component values, topology, channel).

import { parseQuantityText } from '../../core/units/parseQuantity';
import type { KnownComponent, Topology } from '../../core/circuit/components';
import { UsageError } from '../../core/inputError';

const UNIT_OF = { R: 'ohm', L: 'H', C: 'F' } as const;

/** '--known C=470n' or 'C=470nF,5%' (value, optional relative tolerance). */
export function parseKnown(text: string): KnownComponent {
  const match = /^\s*([RLCrlc])\s*=\s*([^,]+?)\s*(?:,\s*([^,]+?)\s*)?$/.exec(text);
  if (!match) throw new UsageError(`--known '${text}': expected NAME=VALUE[,TOL%], e.g. C=470n or L=2.2u,10%`);
  const name = match[1].toUpperCase() as 'R' | 'L' | 'C';
  let value: number;
  try {
    value = parseQuantityText(match[2], UNIT_OF[name]);
  } catch (error) {
    throw new UsageError(`--known '${text}': ${(error as Error).message}`);
  }
  if (!(value > 0) || !Number.isFinite(value)) {
    throw new UsageError(`--known '${text}': ${name} must be a positive, finite value`);
  }
  const known: KnownComponent = { name, value };
  if (match[3] !== undefined) known.tolerance = parseTolerance(match[3], `--known '${text}'`);
  return known;
}

/** '5%' or '0.05' as a relative tolerance in [0, 1). */
export function parseTolerance(text: string, where: string): number {
  const percent = text.trim().endsWith('%');
  const number = Number(percent ? text.trim().slice(0, -1) : text.trim());
  const tolerance = percent ? number / 100 : number;
  if (!Number.isFinite(tolerance) || tolerance < 0 || tolerance >= 1) {
    throw new UsageError(`${where}: tolerance '${text}' must be between 0 and 100 %`);
  }
  return tolerance;
}

export function parseTopology(text: string): Topology {
  const value = text.trim().toLowerCase();
  if (value !== 'series' && value !== 'parallel') {
    throw new UsageError(`--topology '${text}': expected series or parallel`);
  }
  return value;
}

/** A channel given as a 0-based index ('1') or a name ('CH2'). */
export function parseChannel(text: string): string | number {
  return /^\d+$/.test(text.trim()) ? Number(text.trim()) : text;
}

/** A positive time such as '2n', '2e-9', '2ns'. */
export function parseTime(text: string, option: string): number {
  let value: number;
  try {
    value = parseQuantityText(text, 's');
  } catch (error) {
    throw new UsageError(`${option} '${text}': ${(error as Error).message}`);
  }
  if (!(value > 0) || !Number.isFinite(value)) throw new UsageError(`${option} '${text}': must be a positive time`);
  return value;
}
