// Trust table rows, case 1: a fit window set by hand. Any window that holds the event gives the automatic
// answer; a window that starts after the event is a ringdown in progress. See trustCase.ts.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { makeRecord, sampleCaptureTrace, type RecordSpec } from '../startRecords';

/** A step of a lightly damped loop, 40 samples a ring period, its event at sample 400.37 of 2000, 40 dB. */
const STEP: RecordSpec = { zeta: 0.1, omega0: 2 * Math.PI * 1e6, samples: 2000, perPeriod: 40, eventAt: 400.37, kind: 'step', snrDb: 40, noise: { kind: 'white' }, seed: 1101 };
const DT = 1 / (1e6 * STEP.perPeriod);

function sampleCaptureRow(file: string, window: { start?: number; end?: number }, label: string): TrustCase {
  return {
    issueCase: 1,
    name: `${file}, window ${label} (sample capture; truth: the stated circuit in sample-captures/manifest.json)`,
    expect: 'right',
    truth: (() => {
      const { alpha, omega0 } = sampleCaptureTrace(file);
      return { alpha, omega0 };
    })(),
    run: () => outcomeOfFit(fitResponse(sampleCaptureTrace(file).trace, { window })),
  };
}

function generatedRow(name: string, window: { start?: number; end?: number }): TrustCase {
  return {
    issueCase: 1,
    name: `generated step (event at sample 400.37), ${name}`,
    expect: 'right',
    truth: { alpha: STEP.zeta * STEP.omega0, omega0: STEP.omega0 },
    run: () => outcomeOfFit(fitResponse(makeRecord(STEP).trace, { window })),
  };
}

export const handSetWindowCases: TrustCase[] = [
  sampleCaptureRow('switch-node-before.csv', { start: -30e-9 }, 'from -30 ns'),
  sampleCaptureRow('input-filter-step.csv', { start: -100e-6, end: 600e-6 }, 'from -100 us to 600 us'),
  ...[10, 200, 380].map((start) => generatedRow(`window from sample ${start}`, { start: start * DT })),
  generatedRow('window from 3 samples before the event (too few to fit the level before it)', { start: 397 * DT }),
  generatedRow('window from sample 450, after the event (a ringdown in progress)', { start: 450 * DT }),
  generatedRow('window from sample 300 to sample 1200', { start: 300 * DT, end: 1200 * DT }),
];
