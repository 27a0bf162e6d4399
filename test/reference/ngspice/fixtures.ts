// The ngspice fixture manifest and CSV layout: types, reading, and the comparison used by `--check`.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { StatedCircuit } from '../../../sample-captures/circuitResponse';

export const NGSPICE_DIR = path.dirname(fileURLToPath(import.meta.url));
export const FIXTURES_DIR = path.join(NGSPICE_DIR, 'fixtures');

/** Fixture values may differ from a rerun by this fraction of the circuit's scale (see README.md). */
export const CHECK_TOLERANCE = 1e-6;

export interface FixtureEntry extends StatedCircuit {
  name: string;
  scenario: string;
  /** Paths relative to test/reference/ngspice/. */
  netlist: string;
  file: string;
  /** C is the total capacitance across the probed node (parasitic + added for the added-capacitor set). */
  addedCapacitor?: { group: string; parasitic: number; added: number };
  /** ngspice vector written to the fixture. */
  vector: string;
  unit: 'V' | 'A';
  /** Event time for the closed form, s (middle of the source edge, or 0 for initial conditions). */
  eventTime: number;
  sampleInterval: number;
  points: number;
  /** max |y - yFinal| of the waveform: the step, the initial value or the peak excursion; checks are relative to it. */
  scale: number;
  /** Final value the probed quantity settles to. */
  finalValue: number;
}

export interface FixtureManifest {
  format: 'ringbench-ngspice-fixtures';
  version: 1;
  /** `ngspice --version` banner line of the build that wrote the fixtures. */
  simulator: string;
  notes: string[];
  circuits: FixtureEntry[];
}

export interface Waveform {
  time: Float64Array;
  values: Float64Array;
}

export function readManifest(dir = FIXTURES_DIR): FixtureManifest {
  return JSON.parse(readFileSync(path.join(dir, 'manifest.json'), 'utf8')) as FixtureManifest;
}

/** A fixture CSV: one header line, then `time,value` rows. */
export function parseFixture(text: string, where: string): Waveform {
  const lines = text.trim().split('\n').slice(1);
  const time = new Float64Array(lines.length);
  const values = new Float64Array(lines.length);
  lines.forEach((line, i) => {
    const [t, v] = line.split(',').map(Number);
    if (!Number.isFinite(t) || !Number.isFinite(v)) throw new Error(`${where}: line ${i + 2}: bad row '${line}'`);
    time[i] = t;
    values[i] = v;
  });
  return { time, values };
}

export function readFixture(entry: FixtureEntry, dir = FIXTURES_DIR): Waveform {
  const file = path.join(dir, entry.file);
  return parseFixture(readFileSync(file, 'utf8'), file);
}

/** Largest |a - b| over the samples relative to scale, or Infinity when the time axes differ. */
export function relativeDifference(a: Waveform, b: Waveform, scale: number): number {
  if (a.time.length !== b.time.length) return Infinity;
  let worst = 0;
  for (let i = 0; i < a.time.length; i++) {
    if (Math.abs(a.time[i] - b.time[i]) > 1e-9 * Math.abs(a.time[a.time.length - 1])) return Infinity;
    worst = Math.max(worst, Math.abs(a.values[i] - b.values[i]) / scale);
  }
  return worst;
}
