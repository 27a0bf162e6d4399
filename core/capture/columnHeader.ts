// Reads a column header cell ('Time (s)', 't [us]', 'time_ns', 'CH1 [mV]', 'Voltage(V)', 'Time in ms') into name and unit, and
// settles the unit a column is read in (the header's, or the one an option states).

import { canonicalUnit } from '../units/prefixes';
import { LONG_TIME_SYMBOL, TIME_UNIT, isUnitAttempt, printable, readUnitText, unitProblem, type StatedUnit, type UnitReading } from '../units/unitText';
import { CaptureError, type CaptureOptions } from './types';

export interface ColumnHeading {
  /** Name without its unit, as written ('' when the cell held only a unit). */
  name: string;
  /** The unit as written, or null when the header gives none. */
  unitText: string | null;
  /** What the unit text reads as; null with no unit. */
  reading: UnitReading | null;
}

const BRACKETED = /^(.*?)\s*[([]\s*([^()[\]]*?)\s*[)\]]\s*$/;
const SLASHED = /^(.+?)\s*\/\s*([^\s/]+)$/;
const UNDERSCORED = /^(.+?)_([^_\s]+)$/;
/** 'Time, s' or 'Voltage, V': a name, a comma, then the unit (counted only when it reads as one). */
const COMMA_UNIT = /^(.+?)\s*,\s*([^\s,]+)$/;
/**
 * A circuit simulator's probe ('V(out)', 'v(n001)', 'I(L1)', 'V(a,b)'): the letter is the quantity, volts or amperes
 * (SPICE's output convention, common practice), and the brackets name the node or branch, which stays part of the
 * channel's name.
 */
const SIMULATOR_PROBE = /^([VI])\(\s*([^()\s][^()]*?)\s*\)$/i;
/** A level in decibels ('dB', 'dBV', 'dBm', 'dBuV'): no scale turns it into the linear values a fit needs. */
const DECIBELS = /^db/i;
/** 'Time in ms', 'C1 in V', or a bare 'in s' (a name left empty), the unit the last word. */
const IN_UNIT = /^(?:(.*?)\s+)?in\s+(\S+)$/i;
/**
 * 'Time', 'X_Value' (a data logger's horizontal axis) and the word for time in the languages a scope's export may be
 * set to (German, Italian, French, Spanish, ...).
 */
const TIME_NAME = /^(?:t|x|x[ _]?values?|sec|secs|seconds?|timestamp|zeit|tempo|temps|tiempo|tijd|tid|czas|aika|\u0432\u0440\u0435\u043c\u044f|\u65f6\u95f4|\u6642\u9593)$|^time/i;
/**
 * A heading longer than this is a name, never read for a unit: the patterns above backtrack through runs of spaces,
 * in time growing with the square of a cell's length (a 300 000-character heading of two words took minutes), and
 * no instrument writes a heading of more than a few dozen characters.
 */
const LONGEST_HEADING = 256;

/** True for a column name that means time ('Time', 't', 'TimeV_S', 'Time - V_C', 'timestamp'). */
export function isTimeName(name: string): boolean {
  return TIME_NAME.test(name.trim());
}

/** A unit's own symbol as written ('s', 'h', 'V'), not a loose spelling ('S'). */
function isExactSymbol(text: string): boolean {
  return canonicalUnit(text) !== null || Object.values(LONG_TIME_SYMBOL).includes(text);
}

/** True when the unit reads as time, or as one of two times ('MS'). */
export function readsAsTime(reading: UnitReading | null): boolean {
  return reading !== null && (reading.kind === 'ambiguous' || (reading.kind === 'known' && reading.unit === TIME_UNIT));
}

/** The name and the unit after it; a label in brackets ('Vout (CH1)') is no unit. */
function withUnit(name: string, unitText: string): ColumnHeading {
  return isUnitAttempt(unitText) ? { name, unitText, reading: readUnitText(unitText) } : { name, unitText: null, reading: null };
}

/** A unit after '/' or '_' counts only when it reads as one; otherwise it is part of the name ('V_out', 'V/div'). */
function readsAsUnit(heading: ColumnHeading): boolean {
  return heading.reading !== null && heading.reading.kind !== 'unknown';
}

export function parseColumnHeading(cell: string): ColumnHeading {
  const text = cell.trim();
  if (text.length > LONGEST_HEADING) return { name: text, unitText: null, reading: null };
  const probe = SIMULATOR_PROBE.exec(text);
  // 'V(mV)' and 'I(A)' are a name and its unit: a probe names a node or a branch, which reads as no unit.
  if (probe && readUnitText(probe[2]).kind === 'unknown') {
    const unitText = probe[1].toUpperCase() === 'V' ? 'V' : 'A';
    return { name: text, unitText, reading: readUnitText(unitText) };
  }
  const bracketed = BRACKETED.exec(text);
  if (bracketed) return withUnit(bracketed[1], bracketed[2]);
  const slashed = SLASHED.exec(text);
  const bySlash = slashed ? withUnit(slashed[1], slashed[2]) : null;
  if (bySlash && readsAsUnit(bySlash)) return bySlash;
  // 'time_ns' or 'CH1_mV'; a one-letter suffix ('V_C', 'I_A', 'TimeV_S') is part of the name unless the column is
  // time and the letter is the exact symbol ('time_s').
  const underscored = UNDERSCORED.exec(text);
  const byUnderscore = underscored ? withUnit(underscored[1], underscored[2]) : null;
  if (underscored && byUnderscore && readsAsUnit(byUnderscore)) {
    const suffix = underscored[2];
    if (suffix.length >= 2 || (isTimeName(underscored[1]) && isExactSymbol(suffix))) return byUnderscore;
  }
  // A comma, or 'in' (as some scopes and most German exports head a column), then a unit: only a unit read as known
  // counts ('Node, out', 'Log in' and 'Plug in A2' stay names).
  for (const pattern of [COMMA_UNIT, IN_UNIT]) {
    const found = pattern.exec(text);
    const byWord = found ? withUnit(found[1] ?? '', found[2]) : null;
    if (byWord?.reading?.kind === 'known') return byWord;
  }
  return { name: text, unitText: null, reading: null };
}

/** A cell that is only bracketed text meant as a unit ('(VV)'), whether or not it reads as one. */
const BRACKETED_UNIT = /^\s*[([]([^()[\]]*)[)\]]\s*$/;

/**
 * True when every non-empty cell is only a unit ('(s)', '[V]', 'mV'), and one at least reads as one: a units row under
 * the names. A bracketed unit that does not read ('(VV)', a scope's math channel) is still that column's unit, then
 * refused for that column alone (columnUnit).
 */
export function isUnitsRow(cells: string[]): boolean {
  const filled = cells.filter((c) => unitCellText(c) !== '');
  const reads = (cell: string) => readUnitText(unitCellText(cell)).kind !== 'unknown';
  const bracketedUnit = (cell: string) => isUnitAttempt(BRACKETED_UNIT.exec(cell)?.[1] ?? '');
  return filled.some(reads) && filled.every((c) => reads(c) || bracketedUnit(c));
}

/** The unit of a units-row cell without its brackets ('(mV)' -> 'mV'); a cell longer than a heading is left as it is. */
export function unitCellText(cell: string): string {
  const text = cell.trim();
  return text.length > LONGEST_HEADING ? text : text.replace(/^[([]\s*|\s*[)\]]$/g, '');
}

/** The SI unit and scale a column is read in; for a channel whose header's unit cannot be read, why not (see columnUnit). */
export interface ColumnUnit {
  unit: string;
  scale: number;
  unread?: string;
}

/**
 * The SI unit and scale a column is read in: the one the option states (time columns: options.timeUnit; channels:
 * options.valueUnit), with a note when the header says otherwise; else the header's. A time column whose header gives
 * a unit that is not recognised, ambiguous or of the wrong kind is a CaptureError on `line` naming the column and the
 * option. A channel's is not (another channel may be the one wanted: a scope's math channel in 'VV' beside CH1 in V):
 * the channel is kept without a unit, `unread` says why in the words of that error, and a fit of it is refused.
 */
export function columnUnit(
  heading: ColumnHeading,
  label: string,
  isTime: boolean,
  options: CaptureOptions,
  line: number | null,
  warnings: string[],
): ColumnUnit {
  const stated: StatedUnit | undefined = isTime ? options.timeUnit : options.valueUnit;
  const option = isTime ? '--time-unit' : '--value-unit';
  const { unitText, reading } = heading;
  if (stated) {
    const same = reading?.kind === 'known' && reading.unit === stated.unit && reading.scale === stated.scale;
    if (unitText !== null && !same) {
      warnings.push(`column '${printable(label)}': its unit '${printable(unitText)}' is replaced by ${option} ${stated.text}`);
    }
    return { unit: stated.unit, scale: stated.scale };
  }
  if (unitText === null || reading === null) return { unit: '', scale: 1 };
  if (!isTime && DECIBELS.test(unitText)) {
    return unreadChannelUnit(label, `unit '${printable(unitText)}' is a level in decibels, and a response is fitted to linear values; export the channel in volts or amperes`, warnings);
  }
  const problem = unitProblem(unitText, reading, isTime);
  if (problem === '' && reading.kind === 'known') return { unit: reading.unit, scale: reading.scale };
  if (!isTime) return unreadChannelUnit(label, `${problem}; state the channel's unit with ${option}`, warnings);
  throw new CaptureError(`column '${printable(label)}': ${problem}; state the time unit with ${option}`, line);
}

/** A channel kept without a unit, since its header's cannot be read: noted, and the reason kept for a fit of it. */
function unreadChannelUnit(label: string, why: string, warnings: string[]): ColumnUnit {
  const unread = `column '${printable(label)}': ${why}`;
  warnings.push(`${unread} (the channel is kept without a unit, and is not fitted until its unit is known)`);
  return { unit: '', scale: 1, unread };
}
