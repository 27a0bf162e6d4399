// Words and numbers of the lot report shared by its HTML, Markdown and CSV forms.

import { DISPLAY_PREFIX } from '../units/prefixes';
import type { CapabilityIndex } from './capability';
import { describeDecisionRule, type DecisionRule, type DecisionZone } from '../circuit/decisionRule';
import type { LotQuantity, LotSummary, YieldFigure } from './lotSummary';

export const ZONE_LABELS: Record<DecisionZone, string> = {
  pass: 'pass',
  'conditional-pass': 'conditional pass',
  'conditional-fail': 'conditional fail',
  fail: 'fail',
};

/** Decimals of Cp and Cpk: two, as capability indices are quoted (1.33, 1.67)... */
const INDEX_DECIMALS = 2;
/** ...up to this size; above it three significant digits (215, not 215.13: a level far inside wide limits). */
const INDEX_DECIMALS_BELOW = 10;

/** An index or an interval bound as the lot report writes it (see INDEX_DECIMALS_BELOW). */
function indexNumber(x: number): string {
  return Math.abs(x) < INDEX_DECIMALS_BELOW ? x.toFixed(INDEX_DECIMALS) : x.toPrecision(3);
}

/** '1.33 [1.02, 1.64]' (the 95 % interval in brackets), or 'not defined (no limits)'. */
export function indexText(index: CapabilityIndex): string {
  const interval = intervalText(index);
  return interval === null ? indexValueText(index) : `${indexValueText(index)} ${interval}`;
}

/** '1.33', or 'not defined (no limits)': the index alone, for a cell that shows its interval on a line of its own. */
export function indexValueText(index: CapabilityIndex): string {
  return index.value === null ? `not defined (${index.reason})` : indexNumber(index.value);
}

/** '[1.02, 1.64]', the index's 95 % interval, or null where the index is not defined. */
export function intervalText(index: CapabilityIndex): string | null {
  if (index.value === null) return null;
  return `[${indexNumber(index.interval.lower)}, ${indexNumber(index.interval.upper)}]`;
}

/** '92.5 % (37 of 40)', or '–' when no unit was checked. */
export function yieldText(figure: YieldFigure, checked: number): string {
  return figure.percent === null ? '–' : `${figure.percent.toFixed(1)} % (${figure.count} of ${checked})`;
}

/** The decision rules the verdicts name, in the verdict's own words. */
export function decisionRuleText(rules: readonly DecisionRule[]): string {
  if (!rules.length) return 'Decisions as logged: in tolerance is pass, out of tolerance is fail (these records carry no decision zones).';
  return rules.length === 1 ? `Decision rule: ${describeDecisionRule(rules[0])}.` : `Decision rules: ${rules.map(describeDecisionRule).join('; ')}.`;
}

/** Marks a quantity that does not enter the units' decisions, in the table and its note. */
export const NOT_COUNTED_MARK = '†';

/** The note under a quantity table that has a row marked NOT_COUNTED_MARK. */
export const NOT_COUNTED_NOTE = `${NOT_COUNTED_MARK} Not counted in the units' decisions: a part derived with another taken at its design value carries that part's tolerance, so its zones are shown for diagnosis only (a design may limit it).`;

/** The heading counts: '41 measurements of 40 units (38 checked)'. */
export function lotCounts(summary: LotSummary): string {
  const units = summary.checkedUnits + summary.notCheckedUnits;
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  return `${plural(summary.measurements, 'measurement')} of ${plural(units, 'unit')} (${summary.checkedUnits} checked against a design)`;
}

/** Significant digits of the largest value of a table row (and of its standard deviation). */
const ROW_DIGITS = 4;
/** Most decimals shown in a row (toFixed allows 100; beyond 9 a ratio is noise on a bench). */
const MAX_DECIMALS = 9;

/** Units that take no SI prefix: ratios (zeta, Q) and percentages (overshoot). */
const UNPREFIXED = new Set(['', '%']);

/** Whether values in `unit` are shown with an SI prefix (not a ratio or a percentage). */
export function takesPrefix(unit: string): boolean {
  return !UNPREFIXED.has(unit);
}

/** One prefix per table row, so the columns read as plain numbers: 'Mrad/s', divide by 1e6, 2 decimals. */
export interface RowScale {
  /** The prefixed unit for the row's unit column ('Mrad/s', 'nH', '' for a ratio). */
  unit: string;
  divisor: number;
  /** Decimals that give the row's largest value ROW_DIGITS significant digits. */
  decimals: number;
}

/** The scale of a quantity's row from its largest value among mean, min, max, limits and design. */
export function rowScale(q: LotQuantity): RowScale {
  const values = [q.stats?.mean, q.stats?.min, q.stats?.max, q.limits?.lower, q.limits?.upper, q.design];
  const largest = Math.max(0, ...values.filter((v): v is number => typeof v === 'number' && Number.isFinite(v)).map(Math.abs));
  const exponent = largest > 0 && takesPrefix(q.unit) ? Math.min(9, Math.max(-15, 3 * Math.floor(Math.log10(largest) / 3))) : 0;
  const divisor = 10 ** exponent;
  const leading = largest > 0 ? Math.floor(Math.log10(largest / divisor)) : 0;
  // A ratio below 1e-6 would ask for more decimals than fixed notation gives.
  return { unit: `${DISPLAY_PREFIX[exponent]}${q.unit}`, divisor, decimals: Math.min(MAX_DECIMALS, Math.max(0, ROW_DIGITS - 1 - leading)) };
}

/** A value of the row in its scale ('63.09'), or '–' for none (an open limit). */
export function scaledText(value: number | null | undefined, scale: RowScale): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  const text = (value / scale.divisor).toFixed(scale.decimals);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** A standard deviation in the row's scale with its own ROW_DIGITS significant digits ('0.2492'). */
export function spreadText(sd: number | null | undefined, scale: RowScale): string {
  if (sd === null || sd === undefined || !Number.isFinite(sd)) return '–';
  return sd === 0 ? '0' : String(Number((sd / scale.divisor).toPrecision(ROW_DIGITS)));
}
