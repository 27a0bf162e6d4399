// Axis ticks and titles in engineering units ('Time (µs)', 'Voltage (mV)'), from the range shown.

import { axisTitle, scaleAxis } from '../../core/report/plotScale';
import { DISPLAY_PREFIX } from '../../core/units/prefixes';
import type { Range } from './viewRange';

/** About one tick label per this many pixels along an axis: labels stay apart at every plot size. */
const PIXELS_PER_TICK = { x: 95, y: 48 };

export interface AxisTicks {
  tickvals: number[];
  ticktext: string[];
  title: string;
}

/** Ticks at 1, 2, 5 times a power of ten, labelled in one prefix of the unit, which the title names. */
export function axisTicks(range: Range, unit: string, name: string, pixels: number, direction: 'x' | 'y'): AxisTicks {
  const [low, high] = range[0] < range[1] ? range : [range[0] - 1, range[0] + 1];
  const target = Math.max(2, Math.round(pixels / PIXELS_PER_TICK[direction]));
  const scale = scaleAxis(low, high, unit, target, true);
  return { tickvals: scale.ticks, ticktext: scale.labels, title: axisTitle(name, scale, unit === '' ? powerOfPrefix(scale.unit) : scale.unit) };
}

/** A unitless axis names its scale as a power of ten ('×1e-3'), since a prefix alone reads as a unit. */
function powerOfPrefix(prefix: string): string {
  const exponent = Object.entries(DISPLAY_PREFIX).find(([, p]) => p === prefix)?.[0] ?? '0';
  return exponent === '0' ? '×1' : `×1e${exponent}`;
}

/** The word for what a channel measures, from its unit. */
export function quantityName(unit: string): string {
  return unit === 'V' ? 'Voltage' : unit === 'A' ? 'Current' : 'Value';
}
