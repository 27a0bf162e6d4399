// The worker keeps the fit when the design probes another unit or the known part gives no components: the error comes beside it.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseDesign } from '../../core/circuit/design';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import type { WorkerAsk, WorkerReplyValue } from '../../renderer/workerProtocol';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');
const KNOWN_C = { topology: 'series', known: { name: 'C', value: 47e-6 } } as const;

function ask<A extends WorkerAsk>(request: A): Extract<WorkerReplyValue, { type: A['type'] }> {
  return handleWorkerRequest(request, () => undefined).value as Extract<WorkerReplyValue, { type: A['type'] }>;
}

/** The input filter's own design, but probing the choke's current: the capture is in volts. */
function currentProbeDesign() {
  const text = readFileSync(path.join(SAMPLES, 'designs/input-filter-step.json'), 'utf8');
  return parseDesign(text.replace('"capacitor-voltage"', '"inductor-current"'));
}

/** A growing oscillation with a little seeded noise: no decaying response, so no physical components. */
function growingOscillation(): string {
  let seed = 3;
  const random = () => (seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 4294967296;
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < 1000; i++) {
    const t = (i - 100) * 1e-7;
    const y = t < 0 ? 0 : Math.exp(1e4 * t) * Math.sin(2e5 * t);
    lines.push(`${t.toExponential(6)},${(y + 0.01 * (random() - 0.5)).toFixed(5)}`);
  }
  return `${lines.join('\n')}\n`;
}

describe('a design or known-part problem beside the fit', () => {
  it('keeps the fit and its cautions when the design probes another unit than the channel', () => {
    ask({ type: 'open', captureId: 'wrong-unit', name: 'input-filter-step.csv', content: { text: readFileSync(path.join(SAMPLES, 'input-filter-step.csv'), 'utf8') } });
    const design = currentProbeDesign();
    const plain = ask({ type: 'measure', captureId: 'wrong-unit', channel: 0, window: {} }).reply;
    const { reply } = ask({ type: 'measure', captureId: 'wrong-unit', channel: 0, window: {}, design, knownPart: KNOWN_C });
    expect(reply.fitError).toBeNull();
    expect(reply.verdictError).toMatch(/^the design probes inductor-current \(A\) but channel 'CH1' of input-filter-step\.csv is in V$/);
    expect(reply.componentsError).toBeNull();
    expect(reply.result!.verdict).toBeNull();
    expect(reply.result!.fit.status).toBe('converged');
    expect(reply.result!.summary.alpha).toEqual(plain.result!.summary.alpha);
    expect(reply.result!.summary.components?.known).toBe("C = 47 µF, taken as exact (no tolerance given: R and L carry the fit's uncertainty only)");
    // With a design the cautions weigh its parts, not the derived ones.
    expect(reply.result!.cautions.energies).not.toEqual(plain.result!.cautions.energies);
    expect(reply.result!.cautions.fired.length).toBeGreaterThan(0);

    const checked = ask({ type: 'check', captureId: 'wrong-unit', channel: 0, design, fit: reply.result!.summary, setupChecks: reply.result!.setupChecks });
    expect(checked.verdict).toBeNull();
    expect(checked.verdictError).toBe(reply.verdictError);
  });

  it('keeps the fit when the known part cannot give components, and weighs the cautions without parts', () => {
    ask({ type: 'open', captureId: 'growing', name: 'growing.csv', content: { text: growingOscillation() } });
    const plain = ask({ type: 'measure', captureId: 'growing', channel: 0, window: {} }).reply;
    const { reply } = ask({ type: 'measure', captureId: 'growing', channel: 0, window: {}, knownPart: KNOWN_C });
    expect(reply.fitError).toBeNull();
    expect(reply.verdictError).toBeNull();
    expect(reply.componentsError).toMatch(/^alpha: must be positive and finite/);
    expect(reply.result).not.toBeNull();
    expect(Number.isFinite(reply.result!.fit.alpha.value) && reply.result!.fit.alpha.value > 0).toBe(false);
    expect(reply.result!.summary.components).toBeUndefined();
    expect(reply.result!.summary.samplesUsed).toBe(plain.result!.summary.samplesUsed);
    expect(reply.result!.cautions).toEqual(plain.result!.cautions);
  });
});
