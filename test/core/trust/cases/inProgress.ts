// Trust table rows, case 4: a record caught with its response in progress (the event before the first sample),
// at every eighth of a ring period of starting phase. See trustCase.ts; that t0 is then not reported as a
// measured event is checked in test/core/fitResponseStart.test.ts.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { makeRecord, type RecordSpec } from '../startRecords';

const PER_PERIOD = 50;
const RINGDOWN: Omit<RecordSpec, 'eventAt' | 'seed'> = { zeta: 0.03, omega0: 2 * Math.PI * 20e6, samples: 2000, perPeriod: PER_PERIOD, kind: 'ringdown', snrDb: 35, noise: { kind: 'white' } };
const STEP: Omit<RecordSpec, 'eventAt' | 'seed'> = { zeta: 0.3, omega0: 2 * Math.PI * 50e3, samples: 2000, perPeriod: 200, kind: 'step', snrDb: 40, noise: { kind: 'white' } };

function row(label: string, spec: RecordSpec): TrustCase {
  return {
    issueCase: 4,
    name: label,
    expect: 'right',
    truth: { alpha: spec.zeta * spec.omega0, omega0: spec.omega0 },
    run: () => outcomeOfFit(fitResponse(makeRecord(spec).trace)),
  };
}

export const inProgressCases: TrustCase[] = [
  ...Array.from({ length: 8 }, (_, k) =>
    row(`ringdown from ${k}/8 of a period plus 3.3 samples before the record`, { ...RINGDOWN, eventAt: -((k / 8) * PER_PERIOD + 3.3), seed: 4400 + k }),
  ),
  row('step caught 30 samples after its event (rising)', { ...STEP, eventAt: -30.4, seed: 4410 }),
  row('step caught at its first peak', { ...STEP, eventAt: -100.2, seed: 4411 }),
];
