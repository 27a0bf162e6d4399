// The window's added-capacitor run: rows parsed, each capture's f0 = omega0 / 2 pi used, snubber suggested.

import { describe, expect, it } from 'vitest';
import { extractFromCaptures, type ExtractionRow } from '../../renderer/extraction';
import type { FitClient } from '../../renderer/fitClient';
import { quantity } from '../../core/quantity';

// Loop of 6.5 nH and 390 pF (our own switch-node scenario); f = 1 / (2 pi sqrt(L C)) (derived).
const L = 6.5e-9;
const Cp = 390e-12;
const alpha = 2e7;

/** A stand-in for the worker: each capture's text is its added capacitance, the fit the exact omega0. */
function stubClient(): FitClient {
  return {
    request: async (request: { type: string; text?: string }) => {
      const added = Number(request.text);
      const omega0 = 1 / Math.sqrt(L * (Cp + added));
      return { type: 'fitText', fit: { status: 'converged', omega0: quantity(omega0, omega0 * 1e-4, 'rad/s'), alpha: quantity(alpha, alpha * 1e-3, 's^-1') }, sampleInterval: 2e-10 };
    },
  } as unknown as FitClient;
}

const rows = (added: string[]): ExtractionRow[] => added.map((a, i) => ({ name: `c${i}.csv`, text: String([0, 470e-12, 1e-9][i]), addedText: a, toleranceText: '' }));
const settings = { probeText: '', probeToleranceText: '', voltageText: '48', switchingText: '500k' };

describe('extractFromCaptures', () => {
  it('recovers the loop L and C from three captures and suggests R = sqrt(L / C)', async () => {
    const stages: string[] = [];
    const result = await extractFromCaptures(stubClient(), rows(['0', '470p', '1n']), settings, (s) => stages.push(s));
    expect(result.extraction.L.value).toBeCloseTo(L, 15);
    expect(result.extraction.C.value / Cp).toBeCloseTo(1, 9);
    expect(result.frequencies[0].f0.unit).toBe('Hz');
    expect(result.snubber?.R.value).toBeCloseTo(Math.sqrt(L / Cp), 9);
    expect(result.snubber?.powerAt?.voltage).toBe(48);
    expect(stages).toContain('fitting capture 3 of 3');
  });

  it.each([
    [['0'], /at least two captures/],
    [['0', 'lots'], /capture 2: added capacitance/],
    [['0', '-1n'], /capture 2: added capacitance/],
  ])('refuses %j in plain words', async (added, message) => {
    await expect(extractFromCaptures(stubClient(), rows(added), settings, () => undefined)).rejects.toThrow(message);
  });

  it('keeps the extraction when only the snubber inputs are wrong', async () => {
    const result = await extractFromCaptures(stubClient(), rows(['0', '470p']), { ...settings, switchingText: 'fast' }, () => undefined);
    expect(result.snubber).toBeNull();
    expect(result.snubberError).toMatch(/switching frequency/);
    expect(result.extraction.L.value).toBeGreaterThan(0);
  });
});
