// The design files beside the sample captures: each parses, predicts exactly the response the
// capture was generated from, and one full check of a capture against its design passes.
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { parseDesign } from '../../core/circuit/design';
import { predictResponse, probeUnit } from '../../core/circuit/predict';
import { checkDesign } from '../../core/circuit/verdict';
import { fitResponse } from '../../core/fit/fitResponse';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');
const MANIFEST = path.join(SAMPLES, 'manifest.json');
const present = existsSync(MANIFEST);
if (!present) console.warn(`circuitSampleDesigns: ${MANIFEST} missing; skipped`);

interface SampleEntry {
  file: string;
  channel: string;
  unit: string;
  eventTime: number;
  response: Record<'t0' | 'yPre' | 'yFinal' | 'alpha' | 'omega0' | 'a' | 'b', number>;
}

const entries: SampleEntry[] = present ? JSON.parse(readFileSync(MANIFEST, 'utf8')).captures : [];
const designOf = (file: string) => parseDesign(readFileSync(path.join(SAMPLES, 'designs', file.replace(/\.csv$/, '.json')), 'utf8'));

describe.skipIf(!present)('sample-captures/designs', () => {
  it.each(entries)('$file: the design predicts the generated response', (entry) => {
    const design = designOf(entry.file);
    const p = predictResponse(design, entry.eventTime);
    expect(probeUnit(design)).toBe(entry.unit);
    for (const key of ['yPre', 'yFinal', 'alpha', 'omega0', 'a', 'b'] as const) {
      const want = entry.response[key];
      const scale = Math.max(Math.abs(want), key === 'b' ? Math.abs(entry.response.a * entry.response.omega0) : 1e-12);
      expect(Math.abs(p[key] - want) / scale).toBeLessThan(1e-9);
    }
  });

  it('input-filter-step.csv passes the check against its design', () => {
    const capture = parseCapture(readFileSync(path.join(SAMPLES, 'input-filter-step.csv'), 'utf8'));
    const channel = selectChannel(capture);
    const fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit });
    const verdict = checkDesign(designOf('input-filter-step.csv'), fit, channel);
    expect(verdict.pass).toBe(true);
    expect(verdict.likelyCause).toBeNull();
    // The capture's noise is 300 mV rms, quantised to a 390.6 mV step (sample-captures/README.md).
    expect(verdict.rmsDifference!).toBeLessThan(0.5);
  });
});
