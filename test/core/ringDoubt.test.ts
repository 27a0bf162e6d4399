// A single decay kept while the record suggests a ring says so in a warning; a clean single decay does not.

import { describe, expect, it } from 'vitest';
import { corpusCapture, corpusSpec } from '../../bench/corpusCapture';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { fitResponse } from '../../core/fit/fitResponse';
import { firstOrderShape, generatedTrace } from './trust/responseRecords';

const DOUBT = /^a ring is suggested but not established \(F-test of the ring against the single decay: p = 0\.00\d+/;

describe('a single decay in doubt', () => {
  it('warns when the F-test suggests a ring it does not establish (a zeta 0.64 step at 11 dB, corpus seed 3 #76)', () => {
    const capture = corpusCapture(corpusSpec(76, 3), 3);
    expect(capture.spec.zeta).toBeCloseTo(0.64, 2);
    const channel = selectChannel(parseCapture(capture.text));
    const fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name });
    expect(fit.regime).toBe('first-order');
    expect(fit.warnings.filter((w) => DOUBT.test(w))).toHaveLength(1);
  });

  it('says nothing of a ring for a clean RC step', () => {
    const span = 2000 * 1e-9;
    const trace = generatedTrace({ seed: 301, samples: 2000, dt: 1e-9, noise: 0.035 }, firstOrderShape({ t0: 0.15 * span, tau: 0.12 * 0.85 * span, yPre: 0, yStart: 0, yFinal: 5 }));
    const fit = fitResponse(trace);
    expect(fit.regime).toBe('first-order');
    expect(fit.warnings.some((w) => w.startsWith('a ring is suggested'))).toBe(false);
  });
});
