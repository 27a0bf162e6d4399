// The caution inputs a capture and its fitted components provide: peak |V| or |I|, L and C.

import type { Quantity } from '../quantity';
import type { CautionInputs } from './evaluateCautions';

/** Components as a fit or a design gives them (values in F and H). */
export interface CautionComponents {
  C?: Quantity | number;
  L?: Quantity | number;
}

/**
 * Peak |value| of the channel as a voltage when its unit is 'V', as a current when 'A' (any other unit gives
 * neither, and says so: a silent pass would read as safe), with the capacitance and inductance when known.
 * Non-finite samples are skipped.
 */
export function cautionInputsFromCapture(
  values: ArrayLike<number>,
  unit: string,
  components: CautionComponents = {},
): CautionInputs {
  const inputs: CautionInputs = {};
  const peak = peakMagnitude(values);
  if (peak !== undefined && unit === 'V') inputs.peakVoltage = peak;
  if (peak !== undefined && unit === 'A') inputs.peakCurrent = peak;
  if (peak !== undefined && unit !== 'V' && unit !== 'A') inputs.peakNotWeighed = notWeighed(unit);
  const C = valueOf(components.C);
  const L = valueOf(components.L);
  if (C !== undefined) inputs.capacitance = C;
  if (L !== undefined) inputs.inductance = L;
  return inputs;
}

/** Why a channel's peak is not weighed against the voltage and current thresholds. */
function notWeighed(unit: string): string {
  const why = unit === '' ? 'the channel states no unit' : `the channel is in ${unit}`;
  return `${why}, so its peak was weighed neither as a voltage nor as a current; state V or A with --value-unit`;
}

function peakMagnitude(values: ArrayLike<number>): number | undefined {
  let peak = -1;
  for (let i = 0; i < values.length; i++) {
    const v = Math.abs(values[i]);
    if (v > peak) peak = v;
  }
  return peak < 0 ? undefined : peak;
}

function valueOf(component: Quantity | number | undefined): number | undefined {
  const value = typeof component === 'number' ? component : component?.value;
  return value !== undefined && Number.isFinite(value) && value > 0 ? value : undefined;
}
