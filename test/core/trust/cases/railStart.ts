// Trust table rows, case 7: a record whose level before the event sits at (or beyond) a converter rail, read
// through an 8-bit converter: the samples there are censored, never a flat pre-event level. See trustCase.ts;
// that the rail is never reported as the level before the event is checked in test/core/fitResponseStart.test.ts.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { makeRecord, type RecordSpec } from '../startRecords';

/** A step of height 1.1 with 40 dB noise (rms 11 mV, about 2 codes), its event at sample 300.4 of 2000. */
const BASE: Omit<RecordSpec, 'seed' | 'preLevel' | 'height' | 'converter'> = { zeta: 0.2, omega0: 2 * Math.PI * 5e6, samples: 2000, perPeriod: 40, eventAt: 300.4, kind: 'step', snrDb: 40, noise: { kind: 'white' } };
const CODES = 256;

function row(label: string, spec: RecordSpec): TrustCase {
  return {
    issueCase: 7,
    name: label,
    expect: 'right',
    truth: { alpha: spec.zeta * spec.omega0, omega0: spec.omega0 },
    run: () => outcomeOfFit(fitResponse(makeRecord(spec).trace)),
  };
}

export const railStartCases: TrustCase[] = [
  row('rising step from 0.1 below the bottom rail (every sample before the event on the rail)', { ...BASE, preLevel: -0.1, height: 1.1, converter: { codes: CODES, bottom: 0, top: 1.7 }, seed: 7701 }),
  row('rising step from the bottom rail itself (half the samples before the event on it)', { ...BASE, preLevel: 0, height: 1.1, converter: { codes: CODES, bottom: 0, top: 1.7 }, seed: 7702 }),
  row('rising step from one noise level above the bottom rail', { ...BASE, preLevel: 0.011, height: 1.1, converter: { codes: CODES, bottom: 0, top: 1.7 }, seed: 7703 }),
  row('falling step from above the top rail', { ...BASE, preLevel: 1.7, height: -1.1, converter: { codes: CODES, bottom: -0.2, top: 1.6 }, seed: 7704 }),
];
