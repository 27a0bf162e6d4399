// A capture refused for a unit it writes that cannot be read, or for a time axis it lacks: which of the window's choices states it instead.

import { CaptureError } from '../core/capture/types';
import type { UnitRefusal } from './workerProtocol';
import { inWindowTerms } from './windowTerms';

/** How each refusal names the option that fixes it (the window's choice for it: windowTerms.ts). */
const STATED_BY = { time: 'with --time-unit', value: 'with --value-unit', interval: 'option sampleInterval' } as const;

/** The refusal in the window's words, or null when the error is not about a unit or an interval the user can state. */
export function unitRefusal(error: unknown): UnitRefusal | null {
  if (!(error instanceof CaptureError)) return null;
  for (const unit of ['time', 'value', 'interval'] as const) {
    if (error.message.includes(STATED_BY[unit])) return { unit, message: inWindowTerms(error.message) };
  }
  return null;
}
