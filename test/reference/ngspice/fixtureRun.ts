// Runs ngspice on the reference circuits into a folder, and compares two such folders (used by generate.ts).

import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { circuitResponseParams, probeUnit } from '../../../sample-captures/circuitResponse';
import { referenceCircuits, type ReferenceCircuit } from './circuits';
import {
  CHECK_TOLERANCE,
  readFixture,
  readManifest,
  relativeDifference,
  type FixtureEntry,
  type FixtureManifest,
  type Waveform,
} from './fixtures';
import { eventTime, probedVector, writeNetlist } from './netlist';

const COLUMN_OF = { 'capacitor-voltage': 'V_C', 'inductor-current': 'I_L', 'resistor-voltage': 'V_R' } as const;

/** Parses `wrdata` output (time and value columns) and checks it lies on the circuit's uniform grid. */
function parseWrdata(text: string, c: ReferenceCircuit): Waveform {
  const rows = text.trim().split('\n');
  if (rows.length !== c.points) throw new Error(`${c.name}: ngspice wrote ${rows.length} rows, expected ${c.points}`);
  const time = new Float64Array(rows.length);
  const values = new Float64Array(rows.length);
  rows.forEach((row, i) => {
    const [t, v] = row.trim().split(/\s+/).map(Number);
    if (Math.abs(t - i * c.sampleInterval) > 1e-9 * c.sampleInterval) {
      throw new Error(`${c.name}: row ${i + 1} at t = ${t}, off the uniform grid`);
    }
    time[i] = t;
    values[i] = v;
  });
  return { time, values };
}

function simulate(c: ReferenceCircuit, netlistFile: string, workDir: string): Waveform {
  const output = `${c.name}.txt`;
  const run = spawnSync('ngspice', ['-b', netlistFile], { cwd: workDir, encoding: 'utf8' });
  if (run.error || run.status !== 0) {
    throw new Error(`${c.name}: ngspice failed (${run.error?.message ?? `exit ${run.status}`}):\n${run.stderr}`);
  }
  return parseWrdata(readFileSync(path.join(workDir, output), 'utf8'), c);
}

function fixtureText(c: ReferenceCircuit, w: Waveform): string {
  const rows = [`Time (s),${COLUMN_OF[c.probe]} (${probeUnit(c.probe)})`];
  for (let i = 0; i < w.time.length; i++) {
    rows.push(`${Number(w.time[i].toPrecision(12))},${Number(w.values[i].toPrecision(10))}`);
  }
  return rows.join('\n') + '\n';
}

function manifestEntry(c: ReferenceCircuit, w: Waveform): FixtureEntry {
  const finalValue = circuitResponseParams(c, 0).yFinal;
  let scale = 0;
  for (const v of w.values) scale = Math.max(scale, Math.abs(v - finalValue));
  const entry: FixtureEntry = {
    name: c.name,
    scenario: c.scenario,
    netlist: `netlists/${c.name}.cir`,
    file: `${c.name}.csv`,
    topology: c.topology,
    R: c.R,
    L: c.L,
    C: c.C,
    source: c.source,
    probe: c.probe,
    vector: probedVector(c),
    unit: probeUnit(c.probe),
    eventTime: eventTime(c),
    sampleInterval: c.sampleInterval,
    points: c.points,
    scale: Number(scale.toPrecision(10)),
    finalValue,
  };
  if (c.addedCapacitor) entry.addedCapacitor = c.addedCapacitor;
  return entry;
}

/** Writes netlists/, fixtures/*.csv and fixtures/manifest.json under `root`. */
export function generateFixtures(root: string, simulator: string): void {
  const workDir = mkdtempSync(path.join(tmpdir(), 'ringbench-ngspice-'));
  mkdirSync(path.join(root, 'netlists'), { recursive: true });
  mkdirSync(path.join(root, 'fixtures'), { recursive: true });
  try {
    const circuits = referenceCircuits.map((c) => {
      const netlistFile = path.join(root, 'netlists', `${c.name}.cir`);
      writeFileSync(netlistFile, writeNetlist(c, `${c.name}.txt`));
      const waveform = simulate(c, netlistFile, workDir);
      writeFileSync(path.join(root, 'fixtures', `${c.name}.csv`), fixtureText(c, waveform));
      return manifestEntry(c, waveform);
    });
    const manifest: FixtureManifest = {
      format: 'ringbench-ngspice-fixtures',
      version: 1,
      simulator,
      notes: [
        'Transient analysis with reltol=1e-7 and an internal step of at most 1/10000 of the fastest period.',
        "Output put on the uniform grid by ngspice's own `linearize` (interpolation between its internal steps).",
        'Steps: PULSE source with an edge of 1e-5 output intervals; eventTime is the middle of the edge.',
        'Natural responses: element initial conditions with uic, starting at t = 0.',
        'inductor-current is the ngspice branch current of L1: loop direction (series), node to ground (parallel).',
      ],
      circuits,
    };
    writeFileSync(path.join(root, 'fixtures', 'manifest.json'), JSON.stringify(manifest, null, 2) + '\n');
  } finally {
    rmSync(workDir, { recursive: true, force: true });
  }
}

/**
 * Compares a fresh run in `fresh` with the files in `committed`: one report line per circuit, and the
 * problems (empty when netlists and manifest agree and every fixture is within CHECK_TOLERANCE of scale).
 */
export function compareRuns(fresh: string, committed: string): { lines: string[]; problems: string[] } {
  const lines: string[] = [];
  const problems: string[] = [];
  const a = readManifest(path.join(fresh, 'fixtures'));
  const b = readManifest(path.join(committed, 'fixtures'));
  const withoutScale = (e: FixtureEntry): string => JSON.stringify({ ...e, scale: 0 });
  if (a.circuits.length !== b.circuits.length) problems.push(`manifest: ${a.circuits.length} circuits, committed ${b.circuits.length}`);
  for (const entry of a.circuits) {
    const old = b.circuits.find((e) => e.name === entry.name);
    if (!old) {
      problems.push(`${entry.name}: not in the committed manifest`);
      continue;
    }
    if (withoutScale(entry) !== withoutScale(old)) problems.push(`${entry.name}: manifest entry differs`);
    const netlist = (root: string): string => readFileSync(path.join(root, entry.netlist), 'utf8');
    if (netlist(fresh) !== netlist(committed)) problems.push(`${entry.name}: netlist differs`);
    const diff = relativeDifference(
      readFixture(entry, path.join(fresh, 'fixtures')),
      readFixture(old, path.join(committed, 'fixtures')),
      old.scale,
    );
    const status = diff <= CHECK_TOLERANCE ? 'ok' : 'MISMATCH';
    lines.push(`${status.padEnd(8)} ${entry.name}: max |difference| = ${diff.toExponential(2)} of scale`);
    if (diff > CHECK_TOLERANCE) problems.push(`${entry.name}: fixture differs by ${diff.toExponential(2)} of scale`);
  }
  return { lines, problems };
}

