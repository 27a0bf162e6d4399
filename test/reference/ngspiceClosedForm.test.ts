// The second-order closed form against ngspice transient simulations of the same stated circuits.
// Source: ngspice (fixtures written by test/reference/ngspice/generate.ts from the netlists beside them).

import { describe, expect, it } from 'vitest';
import { evaluateResponse } from '../../core/response/secondOrder';
import { circuitResponseParams } from '../../sample-captures/circuitResponse';
import { readFixture, readManifest } from './ngspice/fixtures';

const manifest = readManifest();

describe('closed form agrees with ngspice', () => {
  it('covers both topologies, all three regimes and every probe', () => {
    const kinds = new Set(manifest.circuits.map((c) => `${c.topology}/${c.probe}`));
    expect(kinds).toEqual(
      new Set(['series/capacitor-voltage', 'series/resistor-voltage', 'parallel/capacitor-voltage', 'parallel/inductor-current']),
    );
    const zetas = manifest.circuits.map((c) =>
      c.topology === 'series' ? (c.R / 2) * Math.sqrt(c.C / c.L) : (1 / (2 * c.R)) * Math.sqrt(c.L / c.C),
    );
    expect(zetas.some((z) => z < 0.5)).toBe(true);
    expect(zetas.some((z) => Math.abs(z - 1) < 0.1)).toBe(true);
    expect(zetas.some((z) => z > 1.3)).toBe(true);
  });

  it.each(manifest.circuits.map((c) => [c.name, c] as const))('%s: within 1e-4 of the scale', (_name, entry) => {
    // ngspice transient analysis of test/reference/ngspice/netlists/<name>.cir
    const waveform = readFixture(entry);
    const model = evaluateResponse(circuitResponseParams(entry, entry.eventTime), waveform.time);
    let worst = 0;
    for (let i = 0; i < model.length; i++) worst = Math.max(worst, Math.abs(model[i] - waveform.values[i]));
    expect(worst / entry.scale).toBeLessThan(1e-4);
    // The comparison can fail: a 1 % change in L moves the waveform by several times the tolerance.
    const detuned = evaluateResponse(circuitResponseParams({ ...entry, L: entry.L * 1.01 }, entry.eventTime), waveform.time);
    let moved = 0;
    for (let i = 0; i < model.length; i++) moved = Math.max(moved, Math.abs(detuned[i] - waveform.values[i]));
    expect(moved / entry.scale).toBeGreaterThan(5e-4);
  });
});
