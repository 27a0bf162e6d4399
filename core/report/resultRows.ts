// The one table of what a measurement shows (alpha ... C, then the step's transition metrics) and
// how; every face reads its rows here.

import type { Quantity } from '../quantity';
import { formatEngineering, formatMeasured, formatWithUncertainty } from '../units/format';
import { fitSucceeded, type FitSummary } from './fitSummary';
import type { VerdictQuantity } from '../circuit/verdict';

export interface ResultRowSpec {
  /** JSON key path of the quantity in a fit summary ('alpha', 'components.R'); a derived row's own key. */
  name: string;
  /** The symbol as people read it. */
  symbol: string;
  /** SI unit of the value; null where it is the channel's own (the final value). */
  unit: string | null;
  /** CSV column of the value in SI base units; its uncertainty goes in `<column>_stderr`. */
  column: string;
  /**
   * Present only for some fits: omega_d for an underdamped one, tau for a first-order one, R, L, C when components
   * were derived, each ringing mode's rows when the fit has several, the slow term's for a ring on an exponential.
   */
  optional?: 'underdamped' | 'first-order' | 'components' | 'modes' | 'slow term';
  /** A row computed from another (f0 from omega0; a mode's energy in % from its share) rather than stored in the summary. */
  derived?: { from: string; convert: (q: Quantity) => Quantity };
  /** How a person reads the value when not 'value ± stderr (rel %)' (a share with no standard error, an instant). */
  describe?: (q: Quantity, fit: FitSummary) => string;
}

/** A row of one fit, formatted both ways a face shows it. */
export interface ResultRow extends ResultRowSpec {
  quantity: Quantity;
  /** 'value ± stderr (rel %)' in engineering notation: the full result. */
  text: string;
  /** The value alone in engineering notation: a cell of a one-line-per-measurement table. */
  brief: string;
}

/** How t0 reads for a fit that saw no samples before its event (FitSummary.startsInResponse). */
const NO_EVENT = 'the first fitted sample: no event in the window';

export const RESULT_ROWS = [
  { name: 'alpha', symbol: 'alpha', unit: 's^-1', column: 'alpha_per_s' },
  { name: 'omega0', symbol: 'omega0', unit: 'rad/s', column: 'omega0_rad_per_s' },
  { name: 'omegaD', symbol: 'omega_d', unit: 'rad/s', column: 'omega_d_rad_per_s', optional: 'underdamped' },
  { name: 'f0', symbol: 'f0', unit: 'Hz', column: 'f0_hz', derived: { from: 'omega0', convert: hertz } },
  { name: 'zeta', symbol: 'zeta', unit: '', column: 'zeta' },
  { name: 'Q', symbol: 'Q', unit: '', column: 'Q' },
  { name: 'tau', symbol: 'tau', unit: 's', column: 'tau_s', optional: 'first-order' },
  { name: 'finalValue', symbol: 'final value', unit: null, column: 'final_value' },
  // An instant on the capture's own time axis, whose zero (the trigger) is arbitrary: no relative uncertainty. A fit
  // that saw no samples before its event starts at its first sample, which is no event time.
  { name: 't0', symbol: 't0', unit: 's', column: 't0_s', describe: (q, fit) => (fit.startsInResponse ? `${formatEngineering(q.value, q.unit)} (${NO_EVENT})` : formatWithUncertainty(q)) },
  { name: 'components.R', symbol: 'R', unit: 'ohm', column: 'R_ohm', optional: 'components' },
  { name: 'components.L', symbol: 'L', unit: 'H', column: 'L_h', optional: 'components' },
  { name: 'components.C', symbol: 'C', unit: 'F', column: 'C_f', optional: 'components' },
] as const satisfies readonly ResultRowSpec[];

export type ResultRowName = (typeof RESULT_ROWS)[number]['name'];

/** Ringing modes given rows of their own (the fit tries at most three). */
const MODE_ROW_COUNT = 3;

/**
 * Each ringing mode's rows (f0, zeta, Q, its amplitude at t0, its share of the response's energy), then the
 * slow term's, shown when the fit has several modes or a slow term (the top-level rows are mode 1's then);
 * the same columns in every CSV, empty where a fit has fewer modes.
 */
export const MODE_RESULT_ROWS: readonly ResultRowSpec[] = [
  ...Array.from({ length: MODE_ROW_COUNT }, (_, i): ResultRowSpec[] => {
    const at = `modes.${i}`;
    const k = i + 1;
    return [
      { name: `${at}.f0`, symbol: `mode ${k} f0`, unit: 'Hz', column: `mode${k}_f0_hz`, optional: 'modes', derived: { from: `${at}.omega0`, convert: hertz } },
      { name: `${at}.zeta`, symbol: `mode ${k} zeta`, unit: '', column: `mode${k}_zeta`, optional: 'modes' },
      { name: `${at}.Q`, symbol: `mode ${k} Q`, unit: '', column: `mode${k}_Q`, optional: 'modes' },
      { name: `${at}.amplitude`, symbol: `mode ${k} amplitude`, unit: null, column: `mode${k}_amplitude`, optional: 'modes' },
      {
        name: `${at}.energy`,
        symbol: `mode ${k} energy`,
        unit: '%',
        column: `mode${k}_energy_pct`,
        optional: 'modes',
        derived: { from: `${at}.energyShare`, convert: (share) => ({ value: share.value * 100, stderr: null, unit: '%' }) },
        describe: (q) => `${+q.value.toPrecision(3)} % of the response's energy`,
      },
    ];
  }).flat(),
  { name: 'slowTerm.tau', symbol: 'slow term tau', unit: 's', column: 'slow_tau_s', optional: 'slow term' },
  { name: 'slowTerm.amplitude', symbol: 'slow term amplitude', unit: null, column: 'slow_amplitude', optional: 'slow term' },
];

/**
 * The rows this fit has, in table order: omega_d only when underdamped, tau only when first-order, R, L, C
 * only with components; a quantity that does not apply (the alpha of a first-order fit: NaN) is left out.
 */
export function fitResultRows(fit: FitSummary): ResultRow[] {
  // The modes' rows go before the components', which are derived from one of them.
  const components = RESULT_ROWS.findIndex((row: ResultRowSpec) => row.optional === 'components');
  const specs: readonly ResultRowSpec[] = [...RESULT_ROWS.slice(0, components), ...MODE_RESULT_ROWS, ...RESULT_ROWS.slice(components)];
  return specs.flatMap((spec: ResultRowSpec) => {
    const q = rowQuantity(spec, fit);
    return q ? [{ ...spec, quantity: q, text: spec.describe ? spec.describe(q, fit) : formatMeasured(q), brief: formatEngineering(q.value, q.unit) }] : [];
  });
}

/** The quantity of one row for this fit, or undefined when the fit has none or it does not apply (NaN, null after JSON). */
export function rowQuantity(spec: ResultRowSpec, fit: FitSummary): Quantity | undefined {
  // One mode is the top-level rows themselves: its own rows are shown only beside others.
  if (spec.optional === 'modes' && (fit.modes?.length ?? 0) < 2) return undefined;
  const stored = valueAtPath(fit, spec.derived?.from ?? spec.name) as Quantity | number | null | undefined;
  // A stored number (a mode's energy share) is a value with no standard error.
  const source = typeof stored === 'number' ? { value: stored, stderr: null, unit: '' } : stored;
  if (source === undefined || source === null || source.value === null || Number.isNaN(source.value)) return undefined;
  return spec.derived ? spec.derived.convert(source) : source;
}

/**
 * 'two ringing modes (BIC -5123.4): ...': the one line saying how many modes the fit holds and why that order
 * won (or that it was forced: --modes, the window's choice); null for a fit without a ring or a record logged before modes were fitted.
 */
export function modelOrderText(fit: Pick<FitSummary, 'modelOrder'>): string | null {
  const order = fit.modelOrder;
  if (!order) return null;
  const chosen = order.table.find((row) => row.chosen);
  if (!chosen) return `${order.forced ? 'order forced: ' : ''}${order.reason}`;
  const why = withoutModel(order.reason, chosen.model);
  const score = Number.isFinite(chosen.criterion) ? `${order.criterion} ${chosen.criterion.toFixed(1)}` : order.criterion;
  return `${chosen.model} (${score}${order.forced ? ', order forced' : ''}): ${why}`;
}

/** The reason without what the line already says: a leading 'forced: ' and the model's name ('two ringing modes: ...', '... (...)'). */
function withoutModel(reason: string, model: string): string {
  const rest = reason.replace(/^forced: /, '');
  if (!rest.startsWith(model)) return rest;
  const after = rest.slice(model.length).trim();
  if (after.startsWith(': ')) return after.slice(2);
  return after.startsWith('(') && after.endsWith(')') ? after.slice(1, -1) : after || rest;
}

/** 'for mode 2 of 2 (f0 95.00 MHz)': which ringing mode R, L and C are for, as every face writes it; '' with one mode. */
export function componentModeText(components: NonNullable<FitSummary['components']>): string {
  const mode = components.mode;
  return mode ? `for mode ${mode.index} of ${mode.of} (f0 ${formatEngineering(mode.f0.value, 'Hz')})` : '';
}

/** A step metric, shown from the fitted model (value ± stderr) beside the samples' own value. */
export interface TransitionRowSpec {
  /** Key under the fit summary's transitions.model and transitions.measured. */
  name: 'riseTime' | 'overshoot' | 'peakTime' | 'settlingTime2';
  /** The name as people read it. */
  symbol: string;
  unit: 's' | '%';
  /** CSV columns: the model's value (its uncertainty in `<model>_stderr`) and the measured value. */
  columns: { model: string; measured: string };
}

/** A transition row of one fit; null and '–' where a metric is not defined (no overshoot, no peak). */
export interface TransitionRow extends TransitionRowSpec {
  model: Quantity | null;
  measured: number | null;
  modelText: string;
  measuredText: string;
}

export const TRANSITION_ROWS = [
  { name: 'riseTime', symbol: 'rise time', unit: 's', columns: { model: 'rise_time_s', measured: 'rise_time_measured_s' } },
  { name: 'overshoot', symbol: 'overshoot', unit: '%', columns: { model: 'overshoot_pct', measured: 'overshoot_measured_pct' } },
  { name: 'peakTime', symbol: 'peak time', unit: 's', columns: { model: 'peak_time_s', measured: 'peak_time_measured_s' } },
  { name: 'settlingTime2', symbol: 'settling (2 %)', unit: 's', columns: { model: 'settling_2pct_s', measured: 'settling_2pct_measured_s' } },
] as const satisfies readonly TransitionRowSpec[];

/** Shown for a metric that is not defined. */
const NONE = '–';

/** The transition rows of a measured step; none for a ringdown, a failed fit or a summary without them. */
export function fitTransitionRows(fit: FitSummary): TransitionRow[] {
  const t = fit.transitions;
  if (!t || t.reason !== null || !t.model) return [];
  return TRANSITION_ROWS.map((spec: TransitionRowSpec) => {
    const model = t.model?.[spec.name] ?? null;
    const measured = t.measured?.[spec.name] ?? null;
    return {
      ...spec,
      model,
      measured,
      modelText: model ? formatMeasured(model) : NONE,
      measuredText: measured === null ? NONE : formatEngineering(measured, spec.unit),
    };
  });
}

/** 'state levels: fitted model; ...', or why the transitions were not measured; null without transitions. */
export function transitionNote(fit: FitSummary): string | null {
  const t = fit.transitions;
  if (!t) return null;
  return t.reason === null ? `state levels: ${t.levelMethod}; peak and settling times from t0` : `not measured: ${t.reason}`;
}

/** The damping regime of a fit; null when the fit failed (records logged before that rule may still carry one). */
export function regimeTag(fit: Pick<FitSummary, 'status' | 'regime'>): NonNullable<FitSummary['regime']> | null {
  return fitSucceeded(fit) ? (fit.regime ?? null) : null;
}

/** 'converged, underdamped', or the status alone when the fit failed. */
export function fitStateText(fit: Pick<FitSummary, 'status' | 'regime'>): string {
  const regime = regimeTag(fit);
  return regime === null ? fit.status : `${fit.status}, ${regime}`;
}

/** The value alone of the named row ('f0', 'zeta'), or '-' when this fit has none. */
export function briefValue(fit: FitSummary, name: ResultRowName): string {
  const q = rowQuantity(RESULT_ROWS.find((row) => row.name === name)!, fit);
  return q ? formatEngineering(q.value, q.unit) : '-';
}

/** What sits at a dotted key path of a JSON value ('components.R'); undefined when a step is missing. */
export function valueAtPath(value: unknown, path: string): unknown {
  let at = value;
  for (const key of path.split('.')) {
    if (typeof at !== 'object' || at === null) return undefined;
    at = (at as Record<string, unknown>)[key];
  }
  return at;
}

/** f = omega / (2 pi), Hz. */
export function hertz(omega: Quantity): Quantity {
  const k = 1 / (2 * Math.PI);
  return { value: omega.value * k, stderr: omega.stderr === null ? null : omega.stderr * k, unit: 'Hz' };
}

/** 'margin 1.3 sigma' style text for a verdict quantity. */
export function marginText(q: VerdictQuantity): string {
  return Number.isFinite(q.marginSigma) ? `${q.marginSigma.toFixed(2)} σ` : '∞ σ';
}

/** '2025-03-14 09:26:53 UTC' from an ISO time; the text as given when it is not one. */
export function showTime(iso: string): string {
  const ms = Date.parse(iso);
  return Number.isNaN(ms) ? iso : `${new Date(ms).toISOString().slice(0, 19).replace('T', ' ')} UTC`;
}
