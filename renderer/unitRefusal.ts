// A capture refused for a unit it writes that cannot be read: which of the window's unit choices states it instead.

import { CaptureError } from '../core/capture/types';
import type { UnitRefusal } from './workerProtocol';

/** The command-line option each refusal names, and the window's choice that does the same. */
const STATED_BY = {
  time: { option: '--time-unit', control: "the 'Time in' choice" },
  value: { option: '--value-unit', control: "the 'Values in' choice" },
} as const;

/** The refusal in the window's words, or null when the error is not about a unit the user can state. */
export function unitRefusal(error: unknown): UnitRefusal | null {
  if (!(error instanceof CaptureError)) return null;
  for (const unit of ['time', 'value'] as const) {
    const { option, control } = STATED_BY[unit];
    if (error.message.includes(`with ${option}`)) return { unit, message: error.message.replace(`with ${option}`, `with ${control}`) };
  }
  return null;
}
