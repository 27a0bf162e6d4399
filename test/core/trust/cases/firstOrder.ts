// Trust table rows for case 3: first-order records (an RC step, its discharge, its charging current) end
// first-order with tau right within 3 of its standard errors.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { firstOrderShape, generatedTrace, type RecordSpec } from '../responseRecords';

interface FirstOrderRow {
  name: string;
  spec: RecordSpec;
  /** Event time as a share of the record (0: the record starts at the event). */
  pre: number;
  yPre: number;
  yStart: number;
  yFinal: number;
  /** Time constant as a share of the record after the event. */
  tauShare: number;
}

function firstOrderRow(row: FirstOrderRow): TrustCase {
  const span = row.spec.samples * row.spec.dt;
  const t0 = row.pre * span;
  const tau = row.tauShare * (span - t0);
  return {
    issueCase: 3,
    name: row.name,
    expect: 'right',
    truth: { tau },
    regime: 'first-order',
    run: () => outcomeOfFit(fitResponse(generatedTrace(row.spec, firstOrderShape({ t0, tau, yPre: row.yPre, yStart: row.yStart, yFinal: row.yFinal })))),
  };
}

export const firstOrderCases: TrustCase[] = [
  firstOrderRow({ name: 'an RC step 0 to 5 V, 40 dB, 2000 samples', spec: { seed: 301, samples: 2000, dt: 1e-9, noise: 0.035 }, pre: 0.15, yPre: 0, yStart: 0, yFinal: 5, tauShare: 0.12 }),
  firstOrderRow({ name: 'an RC discharge 3.3 V to 1.2 V, 30 dB, 500 samples', spec: { seed: 302, samples: 500, dt: 1e-6, noise: 0.047 }, pre: 0.2, yPre: 3.3, yStart: 3.3, yFinal: 1.2, tauShare: 0.2 }),
  firstOrderRow({ name: 'an RC step at 20 dB over 8000 samples (block means)', spec: { seed: 303, samples: 8000, dt: 1e-8, noise: 0.07 }, pre: 0.1, yPre: 0, yStart: 0, yFinal: 1, tauShare: 0.1 }),
  firstOrderRow({ name: 'an RC discharge already under way at the first sample', spec: { seed: 304, samples: 1500, dt: 1e-9, noise: 0.01 }, pre: 0, yPre: 2, yStart: 2, yFinal: 0.5, tauShare: 0.15 }),
  firstOrderRow({ name: 'an RC charging current (jumps to V/R at the step, then decays)', spec: { seed: 305, samples: 2000, dt: 1e-7, noise: 0.0005 }, pre: 0.2, yPre: 0, yStart: 0.1, yFinal: 0, tauShare: 0.1 }),
];
