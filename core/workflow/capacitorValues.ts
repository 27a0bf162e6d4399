// Typed values of real capacitors for the added-capacitor method: a derating per added part ('2.2n@0.6'), a
// factor, a value with its tolerance ('180p,10'), and the tolerances that must be stated; bad text is a UsageError
// naming the option.
import { parseQuantityText } from '../units/parseQuantity';
import { UsageError } from '../inputError';
import { parseTolerance } from './userValues';

/** '--added C=470p,2.2n@0.6' split into the nominal list as parseAddedCapacitances reads it and each part's derating. */
export function splitAddedDeratings(text: string, option: string): { nominal: string; deratings: (number | undefined)[] } {
  const items = text.replace(/^\s*C\s*=\s*/i, '').split(',');
  const split = items.map((item) => {
    const [value, factor, extra] = item.split('@').map((s) => s.trim());
    if (extra !== undefined) throw new UsageError(`${option} '${text}': '${item.trim()}' has more than one '@'`);
    return { value, factor: factor === undefined ? undefined : parseFactor(factor, `${option} '${text}'`) };
  });
  return { nominal: split.map((s) => s.value).join(','), deratings: split.map((s) => s.factor) };
}

/**
 * A capacitor's value at the operating voltage over its nominal value, as a fraction ('0.6') or a percentage
 * ('60%'), in (0, 1]: a derating does not raise the value.
 */
export function parseFactor(text: string, where: string): number {
  const trimmed = text.trim();
  const number = Number(trimmed.replace(/\s*%$/, ''));
  const factor = /%$/.test(trimmed) ? number / 100 : number;
  if (trimmed === '' || !Number.isFinite(factor) || !(factor > 0) || factor > 1) {
    throw new UsageError(`${where}: factor '${text}' must be a fraction in (0, 1] or a percentage up to 100 %, e.g. 0.6 or 60%`);
  }
  return factor;
}

/** 'VALUE[,TOL]' in `unit` as `shape` says it is written: the value positive, the tolerance relative, undefined when not given. */
function readValueAndTolerance(text: string, option: string, unit: string, shape: string): { value: number; tolerance?: number } {
  const [valueText, toleranceText, extra] = text.split(',').map((s) => s.trim());
  if (extra !== undefined || !valueText) throw new UsageError(`${option} '${text}': expected ${shape} (tolerance in %)`);
  let value: number;
  try {
    value = parseQuantityText(valueText, unit);
  } catch (error) {
    throw new UsageError(`${option} '${text}': ${(error as Error).message}`);
  }
  if (!(value > 0) || !Number.isFinite(value)) throw new UsageError(`${option} '${text}': must be a positive value`);
  return toleranceText === undefined || toleranceText === '' ? { value } : { value, tolerance: parseTolerance(toleranceText, `${option} '${text}'`) };
}

/**
 * 'VALUE,TOL' in `unit` ('180p,10': 180 pF with a 10 % tolerance), positive, the tolerance relative. The tolerance must
 * be stated: a datasheet's typical value or a level read off a trace is uncertain, and what is derived from it (the
 * layout's share of C_p, the edge's L) is known no better; taken as exact by default, C_p - C_switch printed +-4 % where
 * a 20 % Coss leaves more than 10 %. 'VALUE,0' takes the value as exact.
 */
export function parseValueWithTolerance(text: string, option: string, unit: string): { value: number; tolerance: number } {
  const { value, tolerance } = readValueAndTolerance(text, option, unit, 'VALUE,TOL, e.g. 180p,10');
  if (tolerance === undefined) {
    const valueText = text.split(',')[0].trim();
    throw new UsageError(`${option} '${text}': give its tolerance in % after a comma, e.g. ${valueText},10 (what is derived from it is known no better; ${valueText},0 takes it as exact)`);
  }
  return { value, tolerance };
}

/** A probe's input capacitance, 'VALUE[,TOL]' ('10p' or '10p,10'); undefined when not given. */
export function parseProbeCapacitance(text: string | undefined, option: string): { value: number; tolerance?: number } | undefined {
  return text === undefined ? undefined : readValueAndTolerance(text, option, 'F', 'VALUE[,TOL], e.g. 10p,10');
}

/** The setup options a probe capacitance read by parseProbeCapacitance gives: its tolerance only where stated. */
export function probeSetup(probe: { value: number; tolerance?: number }): { probeCapacitance: number; probeCapacitanceTolerance?: number } {
  return probe.tolerance === undefined ? { probeCapacitance: probe.value } : { probeCapacitance: probe.value, probeCapacitanceTolerance: probe.tolerance };
}

/**
 * The probe capacitance's tolerance where it is taken off C_p, which must then be stated, after the value or as its
 * own option (`toleranceText`), once: C_p is known no better than the probe's datasheet value. 0 without a probe.
 */
export function probeCapacitanceTolerance(probe: { value: number; tolerance?: number } | undefined, toleranceText: string | undefined, option: string): number {
  if (probe === undefined) return 0;
  const separate = toleranceText === undefined || toleranceText.trim() === '' ? undefined : parseTolerance(toleranceText, option);
  if (probe.tolerance !== undefined && separate !== undefined) throw new UsageError(`${option}: the probe capacitance already carries its tolerance after the comma: give it once`);
  const tolerance = probe.tolerance ?? separate;
  if (tolerance === undefined) {
    throw new UsageError(`${option}: give the probe capacitance's tolerance in %, e.g. 10 (C_p is given with the probe's C taken off, known no better than it; 0 takes it as exact)`);
  }
  return tolerance;
}

/**
 * The derating of each added part (its own factor, or none) with the tolerance of the factors: a factor below 1 read
 * off a curve is uncertain, so one is refused without a stated tolerance ('0' takes it as exact); a factor of 1 marks a
 * part that does not derate and carries none.
 */
export function deratingsWithTolerance(
  factors: readonly (number | undefined)[],
  dcBiasFactor: number | undefined,
  toleranceText: string | undefined,
  option: string,
): { deratings: ({ factor: number; tolerance: number } | undefined)[]; dcBias: { factor: number; tolerance: number } | undefined } {
  const derated = [...factors, dcBiasFactor].some((f) => f !== undefined && f < 1);
  if (derated && (toleranceText === undefined || toleranceText.trim() === '')) {
    throw new UsageError(`${option}: give the tolerance of the derating factors in %, e.g. 15 (a factor read off a curve is uncertain; 0 takes it as exact)`);
  }
  const tolerance = derated ? parseTolerance(toleranceText as string, option) : 0;
  const withTolerance = (factor: number | undefined) => (factor === undefined ? undefined : { factor, tolerance: factor < 1 ? tolerance : 0 });
  return { deratings: factors.map(withTolerance), dcBias: withTolerance(dcBiasFactor) };
}

/**
 * The added capacitors' tolerance, which must be stated: their values set the scale of the whole extraction (L_p and
 * C_p are known no better than the parts), and taking them as exact by default printed the sample set's L_p to
 * 0.05 % where 5 % parts leave 2 %. '0' takes them as exact: parts measured on a bridge, whose accuracy belongs here.
 */
export function addedPartsTolerance(text: string | undefined, option: string): number {
  if (text === undefined || text.trim() === '') {
    throw new UsageError(`${option}: give the tolerance of the added capacitors in %, e.g. 5 for 5 % parts (L_p and C_p are known no better than the parts; 0 takes them as exact)`);
  }
  return parseTolerance(text, option);
}
