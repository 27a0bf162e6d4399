// `npm run bench`: import and fit time, peak memory and accuracy on seeded captures of 10^4..10^7 samples, against the floor and a scipy pipeline.
//
// Usage: tsx bench/speed.ts [--sizes 1e4,1e5,1e6,1e7] [--seed 1] [--repeats 3] [--rounds 5] [--cpu-prof]

import { spawnSync } from 'node:child_process';
import { build } from 'esbuild';
import { existsSync, mkdirSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { writeSpeedCapture, truthPath, type SpeedTruth } from './speedCapture';
import type { SpeedRunResult } from './speedRun';
import { fixed, formatTable, goalLine, machineLine, sizeLabel } from './table';
import { EXTRA_CA_CERTS, PIPELINE_GOAL, timePipelines } from './cliVersusScipy';

const HERE = path.dirname(fileURLToPath(import.meta.url));
const OUT = path.join(HERE, 'out');
const MB = 1024 * 1024;
/** At and above this size the capture is streamed in chunks instead of read whole. */
const STREAM_FROM = 1e7;
const TIME = '/usr/bin/time';

interface ScipyResult {
  loadS: number;
  fitS: number;
  alpha: number;
  omegaD: number;
  peakMB: number;
  /** Wall time of the whole python3 process (interpreter and imports included), s. */
  wallS: number;
}

interface Row {
  truth: SpeedTruth;
  ours: SpeedRunResult;
  /** `node bin/ringbench.js fit FILE --json`: wall time (process start included), s, and peak resident set, MB. */
  cli: { wallS: number; peakMB: number | null };
  scipy: ScipyResult | null;
}

/** The measuring script bundled as the command line is (dist/cli.cjs), so that no TypeScript loader runs in the timed process. */
async function bundleRunner(): Promise<string> {
  const outfile = path.join(OUT, 'speedRun.mjs');
  await build({ entryPoints: [path.join(HERE, 'speedRun.ts')], outfile, bundle: true, platform: 'node', format: 'esm', target: 'node20', packages: 'external', logLevel: 'warning' });
  return outfile;
}

function runOurs(runner: string, file: string, samples: number, repeats: number, profile: boolean): SpeedRunResult {
  const mode = samples >= STREAM_FROM ? 'stream' : 'whole';
  const profiling = profile ? ['--cpu-prof', `--cpu-prof-dir=${path.join(OUT, 'profiles')}`] : [];
  const child = spawnSync(process.execPath, [...profiling, runner, file, mode, String(samples >= STREAM_FROM ? 1 : repeats)], {
    encoding: 'utf8',
    maxBuffer: 16 * MB,
  });
  if (child.status !== 0) throw new Error(`speedRun failed on ${file}: ${child.stderr || child.error}`);
  return JSON.parse(child.stdout.trim().split('\n').pop() as string) as SpeedRunResult;
}

/** The scipy baseline, or the one 'skipped: ...' line saying why it did not run. */
function runScipy(file: string): ScipyResult | string {
  const start = performance.now();
  const child = spawnSync('python3', [path.join(HERE, 'scipyBaseline.py'), file, truthPath(file)], { encoding: 'utf8', maxBuffer: 16 * MB });
  if (child.error) return `skipped: python3 could not be started (${child.error.message})`;
  const last = child.stdout.trim().split('\n').pop() ?? '';
  if (last.startsWith('skipped:')) return last;
  if (child.status !== 0) return `skipped: the scipy baseline failed (${child.stderr.trim().split('\n').pop()})`;
  return { ...(JSON.parse(last) as Omit<ScipyResult, 'wallS'>), wallS: (performance.now() - start) / 1000 };
}

/**
 * The installed command on the file, timed from outside (once beforehand with --version, so that a missing dist/ is
 * built untimed); its peak memory too where /usr/bin/time is at hand.
 */
function runCli(file: string): { wallS: number; peakMB: number | null } {
  const bin = path.join(HERE, '..', 'bin', 'ringbench.js');
  spawnSync(process.execPath, [bin, '--version'], { encoding: 'utf8' });
  const timer = existsSync(TIME) ? [TIME, '-f', 'peak-kb %M'] : [];
  const [command, ...args] = [...timer, process.execPath, bin, 'fit', file, '--json'];
  const start = performance.now();
  const child = spawnSync(command, args, { encoding: 'utf8', maxBuffer: 16 * MB });
  const wallS = (performance.now() - start) / 1000;
  if (child.status !== 0) throw new Error(`ringbench fit failed on ${file} (exit ${child.status}): ${child.stderr}`);
  const kb = /peak-kb (\d+)/.exec(child.stderr)?.[1];
  return { wallS, peakMB: kb ? Number(kb) / 1024 : null };
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
  console.log('\nImport, fit and memory in one process, as the fit command runs them (first: the first run in a fresh process; best: fastest of the repeats)');
  console.log(
    formatTable(
      ['size', 'file MB', 'import s best', 'floor s', 'import/floor', 'split s', 'import/split', 'import s first', 'fit s first', 'end-to-end s', 'peak MB', 'growth/file', 'CLI wall s', 'CLI peak MB'],
      rows.map(({ truth, ours, cli }) => {
        const fileMB = truth.bytes / MB;
        return [
          sizeLabel(truth.samples) + (ours.mode === 'stream' ? ' (streamed)' : ''),
          fixed(fileMB),
          fixed(ours.bestImportS),
          fixed(ours.floorS),
          fixed(ours.bestImportS / ours.floorS),
          fixed(ours.splitS),
          ours.splitS ? fixed(ours.bestImportS / ours.splitS) : '-',
          fixed(ours.importS),
          fixed(ours.fitS),
          fixed(ours.endToEndS),
          fixed(ours.peakMB),
          fixed((ours.peakMB - ours.idleMB) / fileMB),
          fixed(cli.wallS),
          fixed(cli.peakMB),
        ];
      }),
    ),
  );
  console.log(
    'floor: a bare byte loop that turns the file into numbers; split: read the text, split lines and cells, Number/parseFloat; end to end = import + fit, first run;',
  );
  console.log(
    'growth/file = (peak resident set - idle process) / file size; CLI: `node bin/ringbench.js fit FILE --json` timed from outside (it reads the file whole).',
  );

  console.log('\nFit against numpy.loadtxt + scipy.optimize.curve_fit (start: the truth perturbed by 1 %, timed inside Python); errors vs the truth in ppm');
  console.log(
    formatTable(
      ['size', 'our fit s first', 'our fit s best', 'scipy load s', 'scipy fit s', 'python wall s', 'fit ours/scipy', 'pipeline ours/scipy', 'omega_d ours', 'omega_d scipy', 'alpha ours', 'alpha scipy', 'our decimation'],
      rows.map(({ truth, ours, scipy }) => [
        sizeLabel(truth.samples),
        fixed(ours.fitS),
        fixed(ours.bestFitS),
        fixed(scipy?.loadS),
        fixed(scipy?.fitS),
        fixed(scipy?.wallS),
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
  console.log('ratios use first runs on both sides; our errors carry their value in our own standard errors (se).');
  for (const { truth, ours } of rows) {
    if (ours.status !== 'converged' || ours.warnings.length > 0) {
      console.log(`${sizeLabel(truth.samples)}: status ${ours.status} (${ours.message}); warnings: ${ours.warnings.join(' | ') || 'none'}`);
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

/** Size at which the command line is timed against the quick scipy script. */
const PIPELINE_SIZE = 1e6;

/** The 10^6 file end to end in fresh processes: the command line against loadtxt + block means + curve_fit. */
function printPipelines(sizes: number[], rounds: number): void {
  if (!sizes.includes(PIPELINE_SIZE)) return;
  const times = timePipelines(path.join(OUT, `speed-${sizeLabel(PIPELINE_SIZE)}.csv`), Math.max(1, rounds || 1));
  console.log(`\nEnd to end in a fresh process, ${sizeLabel(PIPELINE_SIZE)} samples: \`ringbench fit FILE --topology series --known C=470n --json\` against python3 bench/scipyBlockMeans.py (numpy.loadtxt, block means, curve_fit)`);
  if (typeof times === 'string') {
    console.log(times);
    return;
  }
  const ratio = times.cliS / times.scipyS;
  console.log(`median of ${times.rounds} in turn: ours ${fixed(times.cliS)} s, scipy ${fixed(times.scipyS)} s, ratio ${fixed(ratio)}x`);
  if (times.cliWithoutCaS === null) {
    console.log(goalLine(ratio <= PIPELINE_GOAL, `${sizeLabel(PIPELINE_SIZE)}: command line end to end within ${PIPELINE_GOAL}x of the scipy script`, `${fixed(ratio)}x`));
    return;
  }
  // Both are printed: the machine as it is set, and the same command started as on a machine without the setting.
  const cleanRatio = times.cliWithoutCaS / times.scipyS;
  console.log(`ours without ${EXTRA_CA_CERTS} (set on this machine: Node reads those certificates at every start): ${fixed(times.cliWithoutCaS)} s, ratio ${fixed(cleanRatio)}x`);
  console.log(goalLine(ratio <= PIPELINE_GOAL, `${sizeLabel(PIPELINE_SIZE)}: command line end to end within ${PIPELINE_GOAL}x of the scipy script, as this machine is set`, `${fixed(ratio)}x`));
  console.log(goalLine(cleanRatio <= PIPELINE_GOAL, `${sizeLabel(PIPELINE_SIZE)}: the same without ${EXTRA_CA_CERTS}`, `${fixed(cleanRatio)}x`));
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      sizes: { type: 'string', default: '1e4,1e5,1e6,1e7' },
      seed: { type: 'string', default: '1' },
      repeats: { type: 'string', default: '3' },
      'cpu-prof': { type: 'boolean', default: false },
      rounds: { type: 'string', default: '5' },
    },
  });
  const sizes = values.sizes.split(',').map((s) => Number(s.trim()));
  const bad = sizes.find((n) => !Number.isInteger(n) || n < 100);
  if (bad !== undefined) throw new Error(`--sizes: '${values.sizes}' must be a comma-separated list of sample counts >= 100, e.g. 1e4,1e5`);
  const seed = Number(values.seed);
  if (!Number.isInteger(seed)) throw new Error(`--seed: '${values.seed}' is not an integer`);
  const repeats = Math.max(1, Number(values.repeats) || 1);
  mkdirSync(OUT, { recursive: true });
  const runner = await bundleRunner();

  console.log(`Ringbench speed benchmark: ${machineLine(cpus(), process.version, new Date())}`);
  console.log(`Load average at start: ${loadavg().map((x) => x.toFixed(2)).join(', ')} (timings on a busy machine run slow)`);
  console.log('Captures: 12 V step into an LC input filter, zeta 0.05, 200 kHz ring, 40 ring periods, 8-bit, noise 0.1 V rms (seeded)');
  const rows: Row[] = [];
  let scipyNote: string | null = null;
  for (const samples of sizes) {
    const file = path.join(OUT, `speed-${sizeLabel(samples)}.csv`);
    const truth = writeSpeedCapture(file, samples, seed);
    const ours = runOurs(runner, file, samples, repeats, values['cpu-prof']);
    const scipy: ScipyResult | string = scipyNote === null ? runScipy(file) : scipyNote;
    if (typeof scipy === 'string') scipyNote = scipy;
    const cli = runCli(file);
    rows.push({ truth, ours, cli, scipy: typeof scipy === 'string' ? null : scipy });
    console.error(`  ${sizeLabel(samples)} done (end to end ${fixed(ours.endToEndS)} s)`);
  }
  if (scipyNote) console.log(scipyNote);
  printTables(rows);
  printGoals(rows);
  printPipelines(sizes, Number(values.rounds));
  if (values['cpu-prof']) console.log(`\nCPU profiles of our runs: ${path.join(OUT, 'profiles')}`);
}

await main();
