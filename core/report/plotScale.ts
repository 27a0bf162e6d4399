// Axis ticks for report plots: steps of 1, 2 or 5 times a power of ten, labelled with one SI prefix per axis.

import { formatEngineering, rangeDigits } from '../units/format';
import { DISPLAY_PREFIX } from '../units/prefixes';

/**
 * A range more than this many spans from zero is labelled from an origin ('Time − 1.2345 ks (µs)'): its labels
 * would need more decimals than a label holds (6), and its ticks all read '1.234500'.
 */
const OFFSET_SPANS = 100;

export interface AxisScale {
  /** Tick positions in SI units, inside [min, max]. */
  ticks: number[];
  /** Tick labels as numbers in units of the prefix ('0', '2.5', '-10'). */
  labels: string[];
  /** Prefixed unit for the axis title ('µs', 'V', 'mA'), or the prefix alone when the unit is ''. */
  unit: string;
  /** The origin the labels count from, written for the title ('1.2345 ks'), or null when they count from 0. */
  origin: string | null;
}

/** The axis title: 'Time (µs)', or 'Time − 1.2345 ks (µs)' for labels counted from an origin. */
export function axisTitle(name: string, scale: AxisScale, unit = scale.unit): string {
  const from = scale.origin === null ? '' : ` − ${scale.origin}`;
  return unit === '' ? `${name}${from}` : `${name}${from} (${unit})`;
}

/**
 * Ticks for the range [min, max] (min < max) at most about `target` of them; with `fromOrigin`, a range far from zero
 * (OFFSET_SPANS) is labelled from a round origin inside it.
 */
export function scaleAxis(min: number, max: number, unit: string, target = 6, fromOrigin = false): AxisScale {
  const span = max - min;
  if (fromOrigin && span > 0 && Math.max(Math.abs(min), Math.abs(max)) > OFFSET_SPANS * span) {
    const roundTo = Math.pow(10, Math.ceil(Math.log10(span)));
    const origin = Math.round((min + max) / 2 / roundTo) * roundTo;
    const inner = scaleAxis(min - origin, max - origin, unit, target);
    const written = formatEngineering(origin, unit, rangeDigits(origin, origin + roundTo, 1));
    return { ...inner, ticks: inner.ticks.map((t) => t + origin), origin: written };
  }
  const raw = (max - min) / Math.max(1, target);
  const magnitude = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 5, 10].map((m) => m * magnitude).find((s) => s >= raw) ?? 10 * magnitude;
  const first = Math.ceil(min / step - 1e-9);
  const ticks: number[] = [];
  for (let k = first; k * step <= max + step * 1e-9; k++) ticks.push(k * step === 0 ? 0 : k * step);
  const largest = Math.max(Math.abs(min), Math.abs(max));
  const exponent = largest > 0 ? Math.min(9, Math.max(-12, 3 * Math.floor(Math.log10(largest) / 3))) : 0;
  const divisor = Math.pow(10, exponent);
  const decimals = Math.max(0, Math.ceil(-Math.log10(step / divisor) - 1e-9));
  const labels = ticks.map((t) => {
    const text = (t / divisor).toFixed(Math.min(decimals, 6));
    return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
  });
  return { ticks, labels, unit: `${DISPLAY_PREFIX[exponent]}${unit}`, origin: null };
}
