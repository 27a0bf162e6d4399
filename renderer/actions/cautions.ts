// The cautions for the channel on screen when only the parts changed and no refit is needed: weighCautions, as measureCapture weighs them.

import { weighCautions } from '../../core/workflow/measure';
import type { BenchState } from '../benchState';
import { plainMessage } from '../plainMessage';

export function reweighCautions(state: BenchState): void {
  const { trace, design, components } = state;
  try {
    state.cautions = trace ? weighCautions(trace, { design: design?.design, components }) : null;
  } catch (error) {
    state.cautions = null;
    state.error = plainMessage(error);
  }
}
