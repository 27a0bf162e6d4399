// Whether a measurement's frequencies and components could come from a circuit on a bench at all: a second
// net under the unit reading, for results that are only explained by a misread unit or a wrong known part.

import type { Quantity } from '../quantity';

/**
 * What a ringing bench circuit can hold (our bounds, common practice): parts from a femto-unit (layout
 * parasitics) to a farad, a kilohenry and a gigaohm, and natural frequencies from 1 mHz to 1 THz. The gaps
 * to real parts are wide on purpose: only a result off by orders of magnitude is flagged.
 */
const COMPONENT_BOUNDS: Record<'R' | 'L' | 'C', { min: number; max: number; unit: string }> = {
  R: { min: 1e-6, max: 1e9, unit: 'ohm' },
  L: { min: 1e-15, max: 1e3, unit: 'H' },
  C: { min: 1e-15, max: 1, unit: 'F' },
};
/** Natural frequencies, Hz: no bench circuit rings below 1 mHz (a period over 16 minutes); above 1 THz no bench probe follows. */
const FREQUENCY_BOUNDS = { min: 1e-3, max: 1e12 };

export interface PlausibilityInput {
  /** Natural frequency f0 = omega0 / (2 pi), Hz. */
  f0: number;
  /** Length of the record, s. */
  recordSpan: number;
  components?: { R: Quantity; L: Quantity; C: Quantity } | null;
}

/** One sentence saying what is out of reach, the likely cause and the options that fix it; null when all is plausible. */
export function implausibility(input: PlausibilityInput): string | null {
  const { f0, recordSpan } = input;
  if (Number.isFinite(f0) && f0 > 0) {
    if (f0 < FREQUENCY_BOUNDS.min) {
      return `implausible: a natural frequency of ${f0.toPrecision(3)} Hz in a record of ${recordSpan.toPrecision(3)} s; the time unit is probably misread (state it with --time-unit or --sample-interval)`;
    }
    if (f0 > FREQUENCY_BOUNDS.max) {
      return `implausible: a natural frequency of ${f0.toPrecision(3)} Hz, beyond any bench probe; the time unit is probably misread (state it with --time-unit or --sample-interval)`;
    }
  }
  for (const name of ['C', 'L', 'R'] as const) {
    const part = input.components?.[name];
    const beyond = part ? outOfReach(name, part.value) : null;
    if (beyond) return `implausible: ${name} = ${beyond}; likely a misread time or value unit, or the wrong known part (check --known, --time-unit, --value-unit)`;
  }
  return null;
}

/** '470 F is outside what a bench circuit holds (1e-15 to 1 F)' for a finite part value beyond COMPONENT_BOUNDS; null within them. */
export function outOfReach(name: 'R' | 'L' | 'C', value: number): string | null {
  const bounds = COMPONENT_BOUNDS[name];
  if (!Number.isFinite(value) || (value >= bounds.min && value <= bounds.max)) return null;
  return `${value.toPrecision(3)} ${bounds.unit} is outside what a bench circuit holds (${bounds.min} to ${bounds.max} ${bounds.unit})`;
}
