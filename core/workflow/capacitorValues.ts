// Typed values of real capacitors for the added-capacitor method: a derating per added part ('2.2n@0.6'), a
// factor, and a value with an optional tolerance ('180p,10'); bad text is a UsageError naming the option.
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

/** 'VALUE[,TOL]' in `unit` ('180p,10': 180 pF with a 10 % tolerance), positive; the tolerance relative, 0 when not given. */
export function parseValueWithTolerance(text: string, option: string, unit: string): { value: number; tolerance: number } {
  const [valueText, toleranceText, extra] = text.split(',').map((s) => s.trim());
  if (extra !== undefined || !valueText) throw new UsageError(`${option} '${text}': expected VALUE[,TOL], e.g. 180p,10 (tolerance in %)`);
  let value: number;
  try {
    value = parseQuantityText(valueText, unit);
  } catch (error) {
    throw new UsageError(`${option} '${text}': ${(error as Error).message}`);
  }
  if (!(value > 0) || !Number.isFinite(value)) throw new UsageError(`${option} '${text}': must be a positive value`);
  return { value, tolerance: toleranceText === undefined ? 0 : parseTolerance(toleranceText, `${option} '${text}'`) };
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
