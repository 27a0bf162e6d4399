// Trust table rows for case 6: responses that jump at the event (a capacitor's current after a current step,
// an inductor's voltage after a voltage step) end right, the jump found without being told.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { generatedTrace, secondOrderShape, type RecordSpec } from '../responseRecords';

interface JumpRow {
  name: string;
  spec: RecordSpec;
  zeta: number;
  /** Ring frequency in periods over the record. */
  periods: number;
  /** The level before the event and the one the response settles to. */
  level: number;
  /** The jump at the event. */
  jump: number;
  pre: number;
}

/**
 * The parallel RLC's capacitor current after a current step I (or the series RLC's inductor voltage after a
 * voltage step V): I e^(-alpha t) (cos omega_d t - (alpha / omega_d) sin omega_d t), a jump of I at t0 and
 * zero in the end (the textbook step response of the second-order circuit: the state variables start at
 * rest, so the whole step appears across the capacitor's current or the inductor's voltage).
 */
function jumpRow(row: JumpRow): TrustCase {
  const span = row.spec.samples * row.spec.dt;
  const t0 = row.pre * span;
  const omega0 = (2 * Math.PI * row.periods) / (span - t0) / Math.sqrt(1 - row.zeta * row.zeta);
  const alpha = row.zeta * omega0;
  const params = { t0, yPre: row.level, yFinal: row.level, alpha, omega0, a: row.jump, b: -alpha * row.jump };
  return {
    issueCase: 6,
    name: row.name,
    expect: 'right',
    truth: { alpha, omega0 },
    regime: 'underdamped',
    run: () => outcomeOfFit(fitResponse(generatedTrace(row.spec, secondOrderShape(params)))),
  };
}

export const jumpStartCases: TrustCase[] = [
  jumpRow({ name: 'a capacitor current after a current step, zeta 0.1, 40 dB', spec: { seed: 601, samples: 2000, dt: 1e-9, noise: 0.007 }, zeta: 0.1, periods: 12, level: 0, jump: 1, pre: 0.1 }),
  jumpRow({ name: 'an inductor voltage ringdown from a 12 V jump, zeta 0.05, 30 dB, 0.5 V offset', spec: { seed: 602, samples: 3000, dt: 2e-9, noise: 0.27 }, zeta: 0.05, periods: 20, level: 0.5, jump: 12, pre: 0.2 }),
  jumpRow({ name: 'a jump-start response at zeta 0.5, 25 dB, 1000 samples', spec: { seed: 603, samples: 1000, dt: 1e-8, noise: 0.04 }, zeta: 0.5, periods: 4, level: 0, jump: -1, pre: 0.15 }),
  jumpRow({ name: 'a jump-start ringdown over 30000 samples (block means)', spec: { seed: 604, samples: 30000, dt: 1e-9, noise: 0.02 }, zeta: 0.03, periods: 40, level: 1, jump: 2, pre: 0.1 }),
];
