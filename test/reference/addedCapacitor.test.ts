// The added-capacitor method on ngspice-simulated switch-node ringdowns: each capture fitted with
// fitResponse, then L_p and C_p extracted and compared with the netlist values (within 3 %).
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import { extractParasitics, type AddedCapacitorMeasurement } from '../../core/circuit/addedCapacitor';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';
import { quantity } from '../../core/quantity';
import { readFixture, readManifest, type FixtureEntry } from './ngspice/fixtures';

const FIXTURES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), 'ngspice/fixtures');
const present = existsSync(path.join(FIXTURES, 'manifest.json'));
if (!present) console.warn(`addedCapacitor reference: ngspice fixtures missing at ${FIXTURES}; skipped`);

/** Scope-like noise on the simulated waveform: 10 mV rms on a 48 V step (seeded). */
const NOISE_RMS = 0.01;

function fitCapture(entry: FixtureEntry, seed: number): AddedCapacitorMeasurement {
  const w = readFixture(entry);
  const random = createRandom(seed);
  const values = w.values.map((v) => v + NOISE_RMS * random.normal());
  const fit = fitResponse({ time: w.time, values, unit: entry.unit, name: entry.name });
  expect(fit.status).toBe('converged');
  const toHz = 1 / (2 * Math.PI);
  return {
    addedC: entry.addedCapacitor!.added,
    frequency: quantity(fit.omega0.value * toHz, fit.omega0.stderr === null ? null : fit.omega0.stderr * toHz, 'Hz'),
    alpha: fit.alpha,
    sampleInterval: entry.sampleInterval,
  };
}

describe.skipIf(!present)('added-capacitor method on ngspice ringdowns (test/reference/ngspice, buck switch node)', () => {
  const group = present ? readManifest().circuits.filter((c) => c.addedCapacitor?.group === 'switch-node') : [];
  const truth = group[0]?.addedCapacitor?.parasitic ?? NaN;
  const inductance = group[0]?.L ?? NaN;
  const resistance = group[0]?.R ?? NaN;
  let measurements: AddedCapacitorMeasurement[] = [];
  beforeAll(() => {
    measurements = group.map((entry, i) => fitCapture(entry, 100 + i));
  });

  it('has the bare loop and at least two added capacitors', () => {
    expect(group.length).toBeGreaterThanOrEqual(3);
    expect(group.some((c) => c.addedCapacitor!.added === 0)).toBe(true);
  });

  it('recovers L_p and C_p within 3 % from all captures (weighted line)', () => {
    const r = extractParasitics(measurements);
    expect(Math.abs(r.L.value / inductance - 1)).toBeLessThan(0.03);
    expect(Math.abs(r.C.value / truth - 1)).toBeLessThan(0.03);
    // Series loop: R_p = 2 alpha L_p.
    expect(Math.abs(r.R.value / resistance - 1)).toBeLessThan(0.03);
    expect(r.residual!.dof).toBe(measurements.length - 2);
    // Honest uncertainties: the netlist values lie within 4 stated standard uncertainties.
    expect(Math.abs(r.L.value - inductance)).toBeLessThan(4 * r.L.stderr!);
    expect(Math.abs(r.C.value - truth)).toBeLessThan(4 * r.C.stderr!);
  });

  it('recovers L_p and C_p within 3 % from the bare loop and one added capacitor (closed form)', () => {
    const bare = measurements.find((m) => m.addedC === 0)!;
    for (const other of measurements.filter((m) => m.addedC > 0)) {
      const r = extractParasitics([bare, other]);
      expect(Math.abs(r.L.value / inductance - 1)).toBeLessThan(0.03);
      expect(Math.abs(r.C.value / truth - 1)).toBeLessThan(0.03);
    }
  });
});
