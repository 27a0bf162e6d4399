// Trust table rows, case 9: steps under bandwidth-limited noise (white noise through one or two low-pass poles):
// the event is found, or the fit is declared failed. See trustCase.ts.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { accuracyCases, synthesize } from '../../../../bench/accuracyCases';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { makeRecord, type NoiseShape, type RecordSpec } from '../startRecords';

function row(label: string, spec: RecordSpec): TrustCase {
  return {
    issueCase: 9,
    name: label,
    expect: 'right-or-failed',
    truth: { alpha: spec.zeta * spec.omega0, omega0: spec.omega0 },
    run: () => outcomeOfFit(fitResponse(makeRecord(spec).trace)),
  };
}

const SHAPES: [string, NoiseShape][] = [
  ['one pole, neighbour correlation 0.8', { kind: 'one-pole', rho: 0.8 }],
  ['one pole, neighbour correlation 0.9', { kind: 'one-pole', rho: 0.9 }],
  ['two poles, each of neighbour correlation 0.7', { kind: 'two-pole', rho: 0.7 }],
];

/** The accuracy benchmark's record that missed its event (zeta 0.1, 30 dB, low-pass noise; run 96 of seed 1). */
function accuracyRecordRow(): TrustCase {
  const c = accuracyCases().find((k) => k.noise === 'low-pass' && k.zeta === 0.1);
  if (!c) throw new Error('the accuracy benchmark has no low-pass case at zeta 0.1');
  const record = () => synthesize(c, 2000, 96, 1);
  const { truth } = record();
  return {
    issueCase: 9,
    name: 'accuracy benchmark, zeta 0.1, 30 dB, low-pass noise, run 96 of seed 1 (its event was missed)',
    expect: 'right-or-failed',
    truth: { alpha: truth.alpha, omega0: truth.omega0 },
    run: () => outcomeOfFit(fitResponse(record().trace)),
  };
}

export const bandLimitedNoiseCases: TrustCase[] = [
  accuracyRecordRow(),
  ...SHAPES.flatMap(([label, noise], k) =>
    [0.1, 0.3].map((zeta, j) =>
      row(`step, zeta ${zeta}, 30 dB, ${label}`, { zeta, omega0: 2 * Math.PI * 1e6, samples: 2000, perPeriod: 19 / zeta, eventAt: 200.37, kind: 'step', snrDb: 30, noise, seed: 9900 + 10 * k + j }),
    ),
  ),
];
