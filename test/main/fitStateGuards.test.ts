// The bench API's guard on a logged fit: a converged fit states its regime, a failed one has none.
import { describe, expect, it } from 'vitest';
import { benchLogRequestProblem } from '../../main/api/guards';
import { sampleFit } from '../fixtures/benchLog/sampleRecord';
import type { FitSummary } from '../../core/report/fitSummary';

function logRequest(fit: FitSummary): Record<string, unknown> {
  return {
    unit: 'SN-0042',
    operator: null,
    note: null,
    capture: { path: '/home/bench/ring.csv', sha256: 'a'.repeat(64), bytes: 1234, channel: 'CH1' },
    settings: { topology: null, known: null, column: null, sampleInterval: null, from: null, to: null, sortTime: false },
    fit,
    verdict: null,
    design: null,
    cautions: { fired: [], energies: {} },
  };
}

describe('a logged fit and its regime', () => {
  it('a converged fit needs a regime and its evidence', () => {
    expect(benchLogRequestProblem(logRequest(sampleFit()))).toBeNull();
    expect(benchLogRequestProblem(logRequest(sampleFit({ regime: 'first-order' })))).toBeNull();
    expect(benchLogRequestProblem(logRequest(sampleFit({ regime: undefined, regimeEvidence: undefined })))).toMatch(/regime must be one of/);
  });

  it.each(['max-iterations', 'failed', 'no-response'] as const)('a fit ending in %s has none', (status) => {
    const failed = sampleFit({ status, regime: undefined, regimeEvidence: undefined });
    expect(benchLogRequestProblem(logRequest(failed))).toBeNull();
    expect(benchLogRequestProblem(logRequest({ ...failed, regime: 'underdamped', regimeEvidence: 'zeta < 1' }))).toMatch(/did not converge has no regime/);
  });
});
