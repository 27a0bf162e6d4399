// Axis ticks for report plots: steps of 1, 2 or 5 times a power of ten, labelled with one SI prefix per axis.

import { DISPLAY_PREFIX } from '../units/prefixes';

export interface AxisScale {
  /** Tick positions in SI units, inside [min, max]. */
  ticks: number[];
  /** Tick labels as numbers in units of the prefix ('0', '2.5', '-10'). */
  labels: string[];
  /** Prefixed unit for the axis title ('µs', 'V', 'mA'), or the prefix alone when the unit is ''. */
  unit: string;
}

/** Ticks for the range [min, max] (min < max) at most about `target` of them. */
export function scaleAxis(min: number, max: number, unit: string, target = 6): AxisScale {
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
  return { ticks, labels, unit: `${DISPLAY_PREFIX[exponent]}${unit}` };
}
