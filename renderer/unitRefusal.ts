// A capture refused for a unit it writes that cannot be read: which of the window's unit choices states it instead.

import { CaptureError } from '../core/capture/types';
import type { UnitRefusal } from './workerProtocol';
import { inWindowTerms } from './windowTerms';

/** The command-line option each refusal names (the window's choice for it: windowTerms.ts). */
const STATED_BY = { time: '--time-unit', value: '--value-unit' } as const;

/** The refusal in the window's words, or null when the error is not about a unit the user can state. */
export function unitRefusal(error: unknown): UnitRefusal | null {
  if (!(error instanceof CaptureError)) return null;
  for (const unit of ['time', 'value'] as const) {
    if (error.message.includes(`with ${STATED_BY[unit]}`)) return { unit, message: inWindowTerms(error.message) };
  }
  return null;
}
