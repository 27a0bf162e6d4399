// Values a person types (command-line options, form fields) read into numbers and names; bad text is a UsageError.

import { parseQuantityText } from '../units/parseQuantity';
import type { KnownComponent, Topology } from '../circuit/components';
import { UsageError } from '../inputError';

const UNIT_OF = { R: 'ohm', L: 'H', C: 'F' } as const;

/** '--known C=470n' or 'C=470nF,5%' (value, optional tolerance in percent). */
export function parseKnown(text: string): KnownComponent {
  const match = /^\s*([RLCrlc])\s*=\s*([^,]+?)\s*(?:,\s*([^,]+?)\s*)?$/.exec(text);
  if (!match) throw new UsageError(`--known '${text}': expected NAME=VALUE[,TOL], e.g. C=470n or L=2.2u,10 (tolerance in %)`);
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

/**
 * A tolerance is a percentage, the '%' sign optional: '5', '5%' and '5 %' are 5 %, '0.05' is 0.05 %,
 * '' is none. Answers the relative tolerance in [0, 1).
 */
export function parseTolerance(text: string, where: string): number {
  const percent = Number(text.trim().replace(/\s*%$/, ''));
  if (!Number.isFinite(percent) || percent < 0 || percent >= 100) {
    throw new UsageError(`${where}: tolerance '${text}' must be a percentage from 0 to below 100, e.g. 5 or 5%`);
  }
  return percent / 100;
}

export function parseTopology(text: string): Topology {
  const value = text.trim().toLowerCase();
  if (value !== 'series' && value !== 'parallel') {
    throw new UsageError(`--topology '${text}': expected series or parallel`);
  }
  return value;
}

/** A channel given as a name ('CH2') or a 0-based index ('1'); selectChannel takes a channel named so first. */
export function parseChannel(text: string): string | number {
  return /^\d+$/.test(text.trim()) ? Number(text.trim()) : text;
}

/** A time as written ('2n', '2e-9', '2ns'), any sign; text that is no finite time is refused. */
function parseTimeText(text: string, option: string): number {
  let value: number;
  try {
    value = parseQuantityText(text, 's');
  } catch (error) {
    throw new UsageError(`${option} '${text}': ${(error as Error).message}`);
  }
  if (!Number.isFinite(value)) throw new UsageError(`${option} '${text}': must be a finite time`);
  return value;
}

/** A positive time such as '2n', '2e-9', '2ns'. */
export function parseTime(text: string, option: string): number {
  const value = parseTimeText(text, option);
  if (!(value > 0)) throw new UsageError(`${option} '${text}': must be a positive time`);
  return value;
}

/** A time on the capture's axis, which may lie before the trigger or at it: '-5n', '0', '20n'. */
export function parseSignedTime(text: string, option: string): number {
  const value = parseTimeText(text, option);
  // Zero is a time like any other (the trigger); -0 is read as 0.
  return value === 0 ? 0 : value;
}

/** '--added C=470p,1n' (or '470p,1n'): one added capacitance per capture after the first. */
export function parseAddedCapacitances(text: string, captures: number): number[] {
  const list = text.replace(/^\s*C\s*=\s*/i, '').split(',').map((s) => s.trim());
  const values = list.map((item) => {
    let value: number;
    try {
      value = parseQuantityText(item, 'F');
    } catch (error) {
      throw new UsageError(`--added '${text}': ${(error as Error).message}`);
    }
    if (!(value > 0) || !Number.isFinite(value)) throw new UsageError(`--added '${text}': '${item}' must be a positive capacitance`);
    return value;
  });
  if (values.length !== captures - 1) {
    throw new UsageError(`--added gives ${values.length} value(s) for ${captures - 1} capture(s) after the first (the bare loop)`);
  }
  return values;
}

/** An optional positive value in `unit` with SI prefixes ('10p', '200M'); undefined when not given. */
export function parsePositiveValue(text: string | undefined, option: string, unit: string): number | undefined {
  if (text === undefined) return undefined;
  let value: number;
  try {
    value = parseQuantityText(text, unit);
  } catch (error) {
    throw new UsageError(`${option} '${text}': ${(error as Error).message}`);
  }
  if (!(value > 0) || !Number.isFinite(value)) throw new UsageError(`${option} '${text}': must be a positive value`);
  return value;
}

/** Ringing modes a fit can be asked for (--modes): the multi-mode fit tries at most three. */
export const MAX_RINGING_MODES = 3;

/** --modes: how many ringing modes to fit, a whole number from 1 to MAX_RINGING_MODES. */
export function parseModeCount(text: string): number {
  const n = /^\s*\d+\s*$/.test(text) ? Number(text) : NaN;
  if (!Number.isSafeInteger(n) || n < 1 || n > MAX_RINGING_MODES) {
    throw new UsageError(`--modes '${text}': expected a number of ringing modes from 1 to ${MAX_RINGING_MODES}`);
  }
  return n;
}

/** --mode: which ringing mode R, L and C are derived for, 1-based as the output counts them (1 is the dominant one). */
export function parseModeNumber(text: string): number {
  const n = /^\s*\d+\s*$/.test(text) ? Number(text) : NaN;
  if (!Number.isSafeInteger(n) || n < 1 || n > MAX_RINGING_MODES) {
    throw new UsageError(`--mode '${text}': expected a mode number from 1 to ${MAX_RINGING_MODES} (1 is the dominant mode)`);
  }
  return n;
}

/** Metres per unit a length may be typed in (an inch is 25.4 mm exactly). */
const METRES_PER = { m: 1, cm: 0.01, mm: 0.001, in: 0.0254, inch: 0.0254, inches: 0.0254, '"': 0.0254 } as const;

/** A positive length with its unit ('6in', '15 cm', '25mm', '0.15m'), in metres; a bare number is refused as ambiguous. */
export function parseLength(text: string, option: string): number {
  const match = /^\s*(\d+(?:\.\d*)?|\.\d+)\s*(m|cm|mm|in|inch|inches|")\s*$/i.exec(text);
  const value = match ? Number(match[1]) * METRES_PER[match[2].toLowerCase() as keyof typeof METRES_PER] : NaN;
  if (!(value > 0) || !Number.isFinite(value)) throw new UsageError(`${option} '${text}': expected a positive length with its unit, e.g. 6in, 15cm or 25mm`);
  return value;
}
