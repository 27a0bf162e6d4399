// `npm run bench`: import and fit time, peak memory and accuracy on seeded captures of 10^4..10^7 samples, against the floor and a scipy pipeline.
//
// Usage: tsx bench/speed.ts [--sizes 1e4,1e5,1e6,1e7] [--seed 1] [--repeats 3] [--cpu-prof]

import { spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { cpus } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { writeSpeedCapture, truthPath, type SpeedTruth } from './speedCapture';
import type { SpeedRunResult } from './speedRun';
import { fixed, formatTable, goalLine, machineLine, sizeLabel } from './table';

const HERE = path.dirname(fileURLToPath(import.meta.url));
const OUT = path.join(HERE, 'out');
const MB = 1024 * 1024;
/** At and above this size the capture is streamed in chunks instead of read whole. */
const STREAM_FROM = 1e7;

interface ScipyResult {
  loadS: number;
  fitS: number;
  alpha: number;
  omegaD: number;
  peakMB: number;
}

interface Row {
  truth: SpeedTruth;
  ours: SpeedRunResult;
  scipy: ScipyResult | null;
}

function runOurs(file: string, samples: number, repeats: number, profile: boolean): SpeedRunResult {
  const mode = samples >= STREAM_FROM ? 'stream' : 'whole';
  const profiling = profile ? ['--cpu-prof', `--cpu-prof-dir=${path.join(OUT, 'profiles')}`] : [];
  const child = spawnSync(
    process.execPath,
    [...process.execArgv, ...profiling, path.join(HERE, 'speedRun.ts'), file, mode, String(samples >= STREAM_FROM ? 1 : repeats)],
    { encoding: 'utf8', maxBuffer: 16 * MB },
  );
  if (child.status !== 0) throw new Error(`speedRun failed on ${file}: ${child.stderr || child.error}`);
  return JSON.parse(child.stdout.trim().split('\n').pop() as string) as SpeedRunResult;
}

/** The scipy baseline, or the one 'skipped: ...' line saying why it did not run. */
function runScipy(file: string): ScipyResult | string {
  const child = spawnSync('python3', [path.join(HERE, 'scipyBaseline.py'), file, truthPath(file)], { encoding: 'utf8', maxBuffer: 16 * MB });
  if (child.error) return `skipped: python3 could not be started (${child.error.message})`;
  const last = child.stdout.trim().split('\n').pop() ?? '';
  if (last.startsWith('skipped:')) return last;
  if (child.status !== 0) return `skipped: the scipy baseline failed (${child.stderr.trim().split('\n').pop()})`;
  return JSON.parse(last) as ScipyResult;
}

function ppm(estimate: number | null, truth: number): number | null {
  return estimate === null ? null : ((estimate - truth) / truth) * 1e6;
}

/** Signed error in ppm and in our own standard errors. */
function errorCell(estimate: number | null, stderr: number | null, truth: number): string {
  const e = ppm(estimate, truth);
  if (e === null || estimate === null) return '-';
  const sigmas = stderr ? ` (${((estimate - truth) / stderr).toFixed(1)} se)` : '';
  return `${e.toFixed(0)}${sigmas}`;
}

/** Our estimate is as good as scipy's: its error exceeds scipy's by at most half our standard error. */
function asAccurate(ours: number | null, oursStderr: number | null, theirs: number, truth: number): boolean {
  if (ours === null) return false;
  return Math.abs(ours - truth) <= Math.abs(theirs - truth) + 0.5 * (oursStderr ?? Infinity);
}

function printTables(rows: Row[]): void {
  console.log('\nImport and memory (import, floor and split loop: fastest of the repeats; fit and end to end: first run in a fresh process)');
  console.log(
    formatTable(
      ['size', 'file MB', 'import s', 'floor s', 'import/floor', 'split s', 'import/split', 'fit s', 'end-to-end s', 'peak MB', 'growth MB/file MB'],
      rows.map(({ truth, ours }) => {
        const fileMB = truth.bytes / MB;
        return [
          sizeLabel(truth.samples) + (ours.mode === 'stream' ? ' (streamed)' : ''),
          fixed(fileMB),
          fixed(ours.bestImportS),
          fixed(ours.floorS),
          fixed(ours.bestImportS / ours.floorS),
          fixed(ours.splitS),
          ours.splitS ? fixed(ours.bestImportS / ours.splitS) : '-',
          fixed(ours.fitS),
          fixed(ours.endToEndS),
          fixed(ours.peakMB),
          fixed((ours.peakMB - ours.idleMB) / fileMB),
        ];
      }),
    ),
  );
  console.log('growth = peak resident set after the first import and fit minus the idle process before it (the runtime itself holds about 80 MB)');

  console.log('\nFit against numpy.loadtxt + scipy.optimize.curve_fit (start: the truth perturbed by 1 %), errors vs the truth in ppm');
  console.log(
    formatTable(
      ['size', 'our fit s', 'scipy load s', 'scipy fit s', 'fit ours/scipy', 'pipeline ours/scipy', 'omega_d ours', 'omega_d scipy', 'alpha ours', 'alpha scipy', 'our decimation'],
      rows.map(({ truth, ours, scipy }) => [
        sizeLabel(truth.samples),
        fixed(ours.fitS),
        fixed(scipy?.loadS),
        fixed(scipy?.fitS),
        scipy ? fixed(ours.fitS / scipy.fitS) : '-',
        scipy ? fixed(ours.endToEndS / (scipy.loadS + scipy.fitS)) : '-',
        errorCell(ours.omegaD, ours.omegaDStderr, truth.omegaD),
        scipy ? fixed(ppm(scipy.omegaD, truth.omegaD), 2) : '-',
        errorCell(ours.alpha, ours.alphaStderr, truth.params.alpha),
        scipy ? fixed(ppm(scipy.alpha, truth.params.alpha), 2) : '-',
        ours.decimation ? `${/means of (\d+)/.exec(ours.decimation)?.[1] ?? '?'}x` : 'none',
      ]),
    ),
  );
  for (const { truth, ours } of rows) {
    if (ours.status !== 'converged' || ours.warnings.length > 0) {
      console.log(`${sizeLabel(truth.samples)}: status ${ours.status}; warnings: ${ours.warnings.join(' | ') || 'none'}`);
    }
  }
}

function printGoals(rows: Row[]): void {
  console.log('\nGoals');
  const whole = rows.filter((r) => r.ours.mode === 'whole');
  const million = rows.find((r) => r.truth.samples === 1e6);
  if (million) {
    console.log(goalLine(million.ours.endToEndS < 1.5, '10^6 samples imported and fitted end to end in < 1.5 s', `${fixed(million.ours.endToEndS)} s`));
  }
  for (const { truth, ours } of whole) {
    const ratio = ours.bestImportS / ours.floorS;
    console.log(goalLine(ratio <= 3, `${sizeLabel(truth.samples)}: import within 3x of the floor`, `${fixed(ratio)}x`));
    if (ours.splitS) {
      const split = ours.bestImportS / ours.splitS;
      console.log(goalLine(split <= 3, `${sizeLabel(truth.samples)}: import within 3x of the split-and-Number loop`, `${fixed(split)}x`));
    }
  }
  for (const { truth, ours, scipy } of rows) {
    if (!scipy) continue;
    const speedup = scipy.fitS / ours.fitS;
    const accurate =
      asAccurate(ours.omegaD, ours.omegaDStderr, scipy.omegaD, truth.omegaD) && asAccurate(ours.alpha, ours.alphaStderr, scipy.alpha, truth.params.alpha);
    console.log(
      goalLine(
        speedup >= 10 && accurate,
        `${sizeLabel(truth.samples)}: fit >= 10x faster than curve_fit with equal or better accuracy (error at most scipy's + 0.5 se)`,
        `${fixed(speedup)}x faster, accuracy ${accurate ? 'equal or better' : 'worse'}`,
      ),
    );
  }
  for (const { truth, ours } of whole.filter((r) => r.truth.samples >= 1e6)) {
    const ratio = (ours.peakMB - ours.idleMB) / (truth.bytes / MB);
    console.log(goalLine(ratio < 10, `${sizeLabel(truth.samples)}: peak memory growth < 10x the file size`, `${fixed(ratio)}x (peak ${fixed(ours.peakMB)} MB)`));
  }
  for (const { truth, ours } of rows.filter((r) => r.ours.mode === 'stream')) {
    const label = sizeLabel(truth.samples);
    console.log(goalLine(ours.importS < 15, `${label}: streamed import in < 15 s`, `${fixed(ours.importS)} s`));
    console.log(goalLine(ours.peakMB < 1536, `${label}: peak memory (import and fit) < 1.5 GB`, `${fixed(ours.peakMB)} MB`));
  }
}

function main(): void {
  const { values } = parseArgs({
    options: {
      sizes: { type: 'string', default: '1e4,1e5,1e6,1e7' },
      seed: { type: 'string', default: '1' },
      repeats: { type: 'string', default: '3' },
      'cpu-prof': { type: 'boolean', default: false },
    },
  });
  const sizes = values.sizes.split(',').map((s) => Number(s.trim()));
  const bad = sizes.find((n) => !Number.isInteger(n) || n < 100);
  if (bad !== undefined) throw new Error(`--sizes: '${values.sizes}' must be a comma-separated list of sample counts >= 100, e.g. 1e4,1e5`);
  const seed = Number(values.seed);
  if (!Number.isInteger(seed)) throw new Error(`--seed: '${values.seed}' is not an integer`);
  const repeats = Math.max(1, Number(values.repeats) || 1);
  mkdirSync(OUT, { recursive: true });

  console.log(`Ringbench speed benchmark: ${machineLine(cpus(), process.version, new Date())}`);
  console.log('Captures: 12 V step into an LC input filter, zeta 0.05, 200 kHz ring, 40 ring periods, 8-bit, noise 0.1 V rms (seeded)');
  const rows: Row[] = [];
  let scipyNote: string | null = null;
  for (const samples of sizes) {
    const file = path.join(OUT, `speed-${sizeLabel(samples)}.csv`);
    const truth = writeSpeedCapture(file, samples, seed);
    const ours = runOurs(file, samples, repeats, values['cpu-prof']);
    const scipy: ScipyResult | string = scipyNote === null ? runScipy(file) : scipyNote;
    if (typeof scipy === 'string') scipyNote = scipy;
    rows.push({ truth, ours, scipy: typeof scipy === 'string' ? null : scipy });
    console.error(`  ${sizeLabel(samples)} done (end to end ${fixed(ours.endToEndS)} s)`);
  }
  if (scipyNote) console.log(scipyNote);
  printTables(rows);
  printGoals(rows);
  if (values['cpu-prof']) console.log(`\nCPU profiles of our runs: ${path.join(OUT, 'profiles')}`);
}

main();
