// Trust table rows for case 2: records with no response at all (a level and noise) end declared failed;
// a weak ring in the same noise is still found and right.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { generatedTrace, secondOrderShape, type RecordSpec } from '../responseRecords';

/** A DC level and white noise: nothing second order (nor first order) is there, so no answer exists. */
function levelRow(name: string, spec: RecordSpec, level: number): TrustCase {
  return {
    issueCase: 2,
    name,
    expect: 'failed',
    truth: {},
    run: () => outcomeOfFit(fitResponse(generatedTrace(spec, (time) => time.map(() => level)))),
  };
}

/** A ringdown about 0 V from 0 V with an initial slope (a kicked tank), amplitude over noise as given. */
function weakRingRow(name: string, spec: RecordSpec, alpha: number, omega0: number, peak: number, expect: TrustCase['expect']): TrustCase {
  const omegaD = Math.sqrt(omega0 * omega0 - alpha * alpha);
  const params = { t0: spec.samples * spec.dt * 0.2, yPre: 0, yFinal: 0, alpha, omega0, a: 0, b: peak * omegaD };
  return {
    issueCase: 2,
    name,
    expect,
    truth: { alpha, omega0 },
    regime: 'underdamped',
    run: () => outcomeOfFit(fitResponse(generatedTrace(spec, secondOrderShape(params)))),
  };
}

const TAU = 2 * Math.PI;

export const noResponseCases: TrustCase[] = [
  levelRow('a 3.3 V level with 10 mV of noise, 2000 samples', { seed: 201, samples: 2000, dt: 1e-9, noise: 0.01 }, 3.3),
  levelRow('a level of -0.7 V, 500 samples', { seed: 202, samples: 500, dt: 2e-6, noise: 0.002 }, -0.7),
  levelRow('a 12 V level over 20000 samples (fitted on block means)', { seed: 203, samples: 20000, dt: 1e-8, noise: 0.05 }, 12),
  levelRow('noise about zero, 5000 samples', { seed: 204, samples: 5000, dt: 1e-9, noise: 1e-3 }, 0),
  // Peak 6 noise levels, about 30 periods of ring: found and right.
  weakRingRow('a weak ring (peak 6x the noise) in the same noise is found', { seed: 205, samples: 3000, dt: 1e-9, noise: 0.01 }, 2e6, TAU * 20e6, 0.06, 'right'),
  // Peak 1.5 noise levels: too weak to be sure of; an answer, if one is given, must be right.
  weakRingRow('a ring buried in noise (peak 1.5x the noise)', { seed: 206, samples: 3000, dt: 1e-9, noise: 0.01 }, 2e6, TAU * 20e6, 0.015, 'right-or-failed'),
];
