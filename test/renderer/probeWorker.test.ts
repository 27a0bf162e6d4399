// The window's worker with a probe set on a channel: its trace and its fit see the scaled, turned-over values,
// as the command line's --probe-ratio and --invert give them.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import type { WorkerAsk, WorkerReplyValue } from '../../renderer/workerProtocol';
import { repoRoot } from '../e2e/benchHarness';

const ask = <T extends WorkerAsk['type']>(request: WorkerAsk & { type: T }) => handleWorkerRequest(request, () => undefined).value as Extract<WorkerReplyValue, { type: T }>;
const text = readFileSync(join(repoRoot, 'sample-captures/input-filter-step.csv'), 'utf8');
/** Same capture, same fit: the scaled final value agrees to the fit's last digits. */
const AGREEMENT = 1e-6;

function finalValue(captureId: string): number {
  const reply = ask({ type: 'measure', captureId, channel: 0, window: {} });
  if (!reply.reply.result) throw new Error(reply.reply.fitError);
  return reply.reply.result.summary.finalValue.value;
}

describe('probe in the worker', () => {
  it('scales the trace and the fitted final value of the channel it is set on', () => {
    ask({ type: 'open', captureId: 'plain', name: 'input-filter-step.csv', content: { text } });
    ask({ type: 'open', captureId: 'probed', name: 'input-filter-step.csv', content: { text } });
    ask({ type: 'probe', captureId: 'probed', channel: 0, probe: { ratio: 10, invert: true } });
    const plain = ask({ type: 'trace', captureId: 'plain', channel: 0 }).trace.values;
    const probed = ask({ type: 'trace', captureId: 'probed', channel: 0 }).trace.values;
    expect(Array.from(probed)).toEqual(Array.from(plain, (v) => -10 * v));
    expect(Math.abs(finalValue('probed') / finalValue('plain') + 10)).toBeLessThan(10 * AGREEMENT);
  });

  it('refuses a channel the capture does not have', () => {
    ask({ type: 'open', captureId: 'one-channel', name: 'input-filter-step.csv', content: { text } });
    expect(() => ask({ type: 'probe', captureId: 'one-channel', channel: 3, probe: { ratio: 10, invert: false } })).toThrow(/no channel 4/);
  });
});
