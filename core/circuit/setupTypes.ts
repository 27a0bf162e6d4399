// The shape of a setup check (can this capture support the answer?) and of what a person states about the setup.

import type { Quantity } from '../quantity';

export type SetupCheckId =
  | 'samples-per-period'
  | 'alias'
  | 'bandwidth'
  | 'acquisition-mode'
  | 'probe-loading'
  | 'ground-lead'
  | 'frequency-drift'
  | 'sustained-oscillation'
  | 'record-length';

export type SetupCheckLevel = 'note' | 'warning' | 'refusal';

export interface SetupCheck {
  id: SetupCheckId;
  level: SetupCheckLevel;
  /** One line, with values and units. */
  message: string;
  /** The numbers behind the message, SI units. */
  values?: Record<string, number | string | Quantity>;
}

/** What the person states about the setup; each optional. */
export interface SetupOptions {
  /** The scope's (or probe's, the lower) bandwidth, Hz. Default: the capture preamble's, else no bandwidth check. */
  scopeBandwidth?: number;
  /** The voltage probe's input capacitance, F: corrected C and f0 beside the measured ones. Default: no correction (10 pF assumed for the ground-lead check). */
  probeCapacitance?: number;
  /** That capacitance's tolerance, relative (0.1 for 10 %); carried into the corrected values. Default: taken as exact, and said so. */
  probeCapacitanceTolerance?: number;
  /** The probe's ground-lead length, m. Default 6 inches (the long clip lead). */
  groundLead?: number;
}
