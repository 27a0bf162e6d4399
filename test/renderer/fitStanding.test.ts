// The fit badge: green only for a converged fit with no doubt of its own, red for every other status, no regime then.

import { describe, expect, it } from 'vitest';
import { fitStanding } from '../../renderer/fitStanding';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import type { WorkerReplyValue } from '../../renderer/workerProtocol';
import { flatNoiseCapture } from '../e2e/generatedCaptures';

const RESIDUAL = 'the model leaves a residual of 10.0x the noise level: the circuit may not be second order, or the window includes the excitation';
const DROPPED = '1 row dropped (line 7: N/A)';

describe('fitStanding', () => {
  it.each([
    { status: 'converged', warnings: [], imported: [], tone: 'ok', label: 'converged', regime: true },
    { status: 'converged', warnings: [DROPPED], imported: [DROPPED], tone: 'ok', label: 'converged', regime: true },
    { status: 'converged', warnings: [DROPPED, RESIDUAL], imported: [DROPPED], tone: 'warn', label: 'converged, 1 warning', regime: true },
    { status: 'max-iterations', warnings: [], imported: [], tone: 'bad', label: 'stopped at the iteration limit', regime: false },
    { status: 'failed', warnings: [], imported: [], tone: 'bad', label: 'fit failed', regime: false },
    { status: 'no-response', warnings: [], imported: [], tone: 'bad', label: 'no second-order response found', regime: false },
  ] as const)('$status with $warnings.length warnings is $tone', ({ status, warnings, imported, tone, label, regime }) => {
    const standing = fitStanding({ status: status as 'converged', warnings: [...warnings] }, imported);
    expect(standing.tone).toBe(tone);
    expect(standing.label).toBe(label);
    expect(standing.showRegime).toBe(regime);
  });

  it('puts the fit doubts first and leaves the import notes to the capture panel', () => {
    const standing = fitStanding({ status: 'converged', warnings: ['implausible: a ring of 2 mHz in a 1 ms record', DROPPED, RESIDUAL] }, [DROPPED]);
    expect(standing.doubts).toEqual(['implausible: a ring of 2 mHz in a 1 ms record', RESIDUAL]);
  });

  it('turns red when a setup check refuses the answer and amber when one warns, as the command line exits 1 and 0', () => {
    const converged = { status: 'converged' as const, warnings: [] };
    const refused = fitStanding(converged, [], [{ id: 'sustained-oscillation', level: 'refusal', message: 'the ring does not decay' }]);
    expect([refused.tone, refused.showRegime, refused.doubts]).toEqual(['bad', false, ['the ring does not decay']]);
    const warned = fitStanding(converged, [], [{ id: 'bandwidth', level: 'warning', message: 'the front end moves alpha' }, { id: 'record-length', level: 'note', message: 'short' }]);
    expect([warned.tone, warned.doubts]).toEqual(['warn', ['the front end moves alpha']]);
  });

  it('never shows green beside the fit of a flat, noisy record', () => {
    handleWorkerRequest({ type: 'open', captureId: 'flat', name: 'flat-noise.csv', content: { text: flatNoiseCapture() } }, () => undefined);
    const reply = handleWorkerRequest({ type: 'measure', captureId: 'flat', channel: 0, window: {} }, () => undefined).value as Extract<WorkerReplyValue, { type: 'measure' }>;
    const summary = reply.reply.result?.summary;
    if (summary) expect(fitStanding(summary, []).tone).not.toBe('ok');
    else expect(reply.reply.fitError).not.toBeNull();
  });
});
