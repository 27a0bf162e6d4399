// Whole-number converter codes under a preamble that states their scale: converted to volts (or amperes) when the
// preamble says how, else kept as codes; either way said in a warning of the import summary.

import { formatEngineering } from '../units/format';
import { readUnitText } from '../units/unitText';
import type { DataShape } from './dataShape';
import type { Preamble } from './preamble';
import type { UnreadUnit } from './types';

/** A whole number as counters and converter codes are written. */
const WHOLE_NUMBER = /^[-+]?\d+$/;
/** Keys stating how many codes make one division (checked before the per-division scale, which they resemble). */
const CODES_PER_DIVISION = /(?:codes?|counts?|levels?|lsbs?)\s*(?:per|\/)\s*div/i;
/** Keys stating a vertical scale per division. */
const PER_DIVISION = /vertical\s*(?:scale|gain)|(?:volts?|scale|amps?)\s*(?:per|\/)\s*div|\bv\s*\/\s*div/i;
/** Keys stating the value of one code. */
const PER_CODE = /(?:per|\/)\s*(?:code|count|lsb)\b|\by\s*-?\s*increment\b|^\s*lsb\b/i;
/** Keys stating the value at code 0. */
const OFFSET = /offset|y\s*-?\s*origin/i;
/** Keys stating the code that reads as the offset (the converter's zero). */
const REFERENCE = /y\s*-?\s*reference|reference\s*code|zero\s*code/i;
/** A number, then a unit, perhaps per division ('0.2', '200 mV/div', '2,5 mV'). */
const NUMBER_AND_UNIT = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([a-zA-Zµμ]*)\s*(?:\/\s*div\w*)?\s*$/;
/** Keys about the time axis or the trigger, which the patterns above must not take ('Time/div', 'Trigger offset'). */
const NOT_VERTICAL = /time|horizontal|trigger|sampl|x\s*-?\s*(?:origin|increment)/i;
/** Units converter codes may be scaled to. */
const CODE_UNITS = new Set(['V', 'A']);

/** What the conversion needs of a planned column; `unit`, `scale` and `offset` are set on conversion. */
export interface CodedColumn {
  kind: string;
  name: string;
  unit: string;
  scale: number;
  offset: number;
  /** Set when the header gives a unit that could not be read: such a column holds no codes to convert. */
  unreadUnit: UnreadUnit | null;
}

interface Stated {
  key: string;
  value: number;
  /** SI unit and scale of the written unit (in the value, else the key's brackets), or null when none is written. */
  unit: { unit: string; scale: number } | null;
}

/** The first preamble entry whose key matches, read as a number with an optional unit; null when absent or no number. */
function stated(preamble: Preamble, pattern: RegExp, decimalComma: boolean, skip?: RegExp): Stated | null {
  const key = Object.keys(preamble.metadata).find((k) => pattern.test(k) && !NOT_VERTICAL.test(k) && !skip?.test(k));
  if (key === undefined) return null;
  const text = preamble.metadata[key].trim();
  const found = NUMBER_AND_UNIT.exec(decimalComma ? text.replace(',', '.') : text);
  if (!found) return null;
  const written = found[2] || (/[([]\s*([a-zA-Zµμ]+)\s*(?:\/\s*div\w*)?\s*[)\]]/.exec(key)?.[1] ?? '');
  const reading = written === '' ? null : readUnitText(written);
  const unit = reading?.kind === 'known' && CODE_UNITS.has(reading.unit) ? { unit: reading.unit, scale: reading.scale } : null;
  if (written !== '' && unit === null) return null;
  return { key, value: Number(found[1]), unit };
}

/**
 * Value columns of whole numbers without a unit, under a preamble stating a vertical scale or a value per code: they
 * are converted (value = code × step + offset) when the step is known (per code, or per division with the codes per
 * division) and any offset is zero or carries a unit; otherwise kept as codes. Returns the warning saying which, or null.
 */
export function readConverterCodes(columns: CodedColumn[], shapes: DataShape[], preamble: Preamble, decimalComma: boolean): string | null {
  const perCode = stated(preamble, PER_CODE, decimalComma);
  const codesPerDivision = stated(preamble, CODES_PER_DIVISION, decimalComma);
  const perDivision = stated(preamble, PER_DIVISION, decimalComma, CODES_PER_DIVISION);
  const scaleKey =
    perCode?.key ??
    perDivision?.key ??
    Object.keys(preamble.metadata).find((k) => [PER_CODE, PER_DIVISION, CODES_PER_DIVISION].some((p) => p.test(k)) && !NOT_VERTICAL.test(k));
  if (scaleKey === undefined) return null;
  const coded = columns.filter((column, c) => column.kind === 'value' && column.unit === '' && column.unreadUnit === null && shapes.every((s) => WHOLE_NUMBER.test(s.cells[c]?.trim() ?? '')));
  if (coded.length === 0) return null;
  const names = `channel(s) ${coded.map((c) => `'${c.name}'`).join(', ')}`;
  const kept = (why: string) => `${names} hold whole numbers and the preamble states a vertical scale ('${scaleKey}'): they look like converter codes, and are kept as codes, unscaled (${why})`;

  let step: { value: number; unit: Stated['unit']; from: string };
  if (perCode) step = { value: perCode.value, unit: perCode.unit, from: `'${perCode.key}'` };
  else if (perDivision && codesPerDivision && codesPerDivision.value > 0) {
    step = { value: perDivision.value / codesPerDivision.value, unit: perDivision.unit, from: `'${perDivision.key}' ÷ '${codesPerDivision.key}'` };
  } else return kept('the preamble gives neither the value of one code nor the codes per division');
  if (!(Number.isFinite(step.value) && step.value > 0)) return kept(`the scale from ${step.from} is not a positive number`);

  const offset = stated(preamble, OFFSET, decimalComma);
  if (offset && offset.value !== 0 && offset.unit === null) return kept(`the offset '${offset.key}' (${offset.value}) gives no unit: volts or divisions`);
  // A step written without a unit is in the offset's base unit, else in volts (said in the warning).
  const unit = step.unit?.unit ?? offset?.unit?.unit ?? 'V';
  if (offset?.unit && offset.unit.unit !== unit) return kept(`the offset '${offset.key}' is in ${offset.unit.unit}, the scale in ${unit}`);
  const perCodeSI = step.value * (step.unit?.scale ?? 1);
  const reference = stated(preamble, REFERENCE, decimalComma);
  const offsetSI = (offset ? offset.value * (offset.unit?.scale ?? 1) : 0) - (reference ? reference.value * perCodeSI : 0);
  for (const column of coded) {
    column.unit = unit;
    column.scale = perCodeSI;
    column.offset = offsetSI;
  }
  const assumed = step.unit === null && (offset?.unit ?? null) === null ? ` (no unit stated: ${unit} assumed)` : '';
  const sources = [step.from, offset ? `'${offset.key}'` : null, reference ? `'${reference.key}'` : null].filter((s) => s !== null).join(', ');
  return (
    `${names} hold converter codes: converted as code × ${formatEngineering(perCodeSI, unit)} ${offsetSI < 0 ? '-' : '+'} ${formatEngineering(Math.abs(offsetSI), unit)}` +
    `${assumed}, from ${sources} in the preamble`
  );
}
