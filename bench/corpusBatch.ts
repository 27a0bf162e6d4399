// The batch part of `npm run bench:corpus`: the corpus written as a folder of CSV files, `ringbench batch` over it with
// --jobs at the core count, against a scipy loop over the same files, in turn for several rounds: wall times (median),
// the ratio, and CPU use per core.

import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { corpusCapture, corpusSpec, type CorpusRange } from './corpusCapture';
import { fixed, formatTable, goalLine } from './table';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const MB = 1024 * 1024;
/** The goal: the batch at least this many times faster than the scipy loop over the same files. */
const GOAL_RATIO = 8;

interface Run {
  wallS: number;
  /** User plus system CPU time of the process, its threads and its worker processes, s (null where /proc is not there). */
  cpuS: number | null;
  stdout: string;
}

/** CPU seconds (user + system) used so far by the waited-for child processes of this one, from /proc (Linux). */
function childrenCpuSeconds(): number | null {
  if (!existsSync('/proc/self/stat')) return null;
  const fields = readFileSync('/proc/self/stat', 'utf8').split(') ')[1].split(' ');
  // After the command's name: state is field 3 of stat(5), so cutime (16) and cstime (17) sit at 13 and 14 here.
  const ticks = Number(fields[13]) + Number(fields[14]);
  const perSecond = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
  return ticks / perSecond;
}

function timed(command: string, args: string[]): Run {
  const cpuBefore = childrenCpuSeconds();
  const began = performance.now();
  const child = spawnSync(command, args, { cwd: ROOT, encoding: 'utf8', maxBuffer: 512 * MB });
  const wallS = (performance.now() - began) / 1000;
  const cpuAfter = childrenCpuSeconds();
  if (child.error) throw child.error;
  if (child.status !== 0 && child.status !== 1) throw new Error(`${command} ${args.join(' ')} exited with ${child.status}: ${child.stderr.trim().split('\n').pop()}`);
  return { wallS, cpuS: cpuBefore === null || cpuAfter === null ? null : cpuAfter - cpuBefore, stdout: child.stdout };
}

/** The first `count` captures of the corpus as <index>.csv with <index>.truth.json beside each (kept between runs). */
function writeCorpusFolder(seed: number, count: number, range: CorpusRange): string {
  const folder = path.join(ROOT, 'bench/out', `corpus-batch-${seed}-${count}-${range.minSamples}-${range.maxSamples}`);
  const done = path.join(folder, 'complete');
  if (existsSync(done)) return folder;
  mkdirSync(folder, { recursive: true });
  for (let index = 0; index < count; index++) {
    const capture = corpusCapture(corpusSpec(index, seed, range), seed);
    const name = `c${String(index).padStart(4, '0')}`;
    writeFileSync(path.join(folder, `${name}.csv`), capture.text);
    writeFileSync(path.join(folder, `${name}.truth.json`), JSON.stringify({ ...capture.written, clipping: capture.spec.clipping }));
  }
  writeFileSync(done, '');
  return folder;
}

/** Percent of one core, and of all `cores`. */
function cpuUse(run: Run, cores: number): [string, string] {
  if (run.cpuS === null) return ['-', '-'];
  const ofOne = (100 * run.cpuS) / run.wallS;
  return [`${ofOne.toFixed(0)} %`, `${(ofOne / cores).toFixed(0)} %`];
}

/** The run of median wall time among `runs` (the upper one of the middle two for an even count). */
function medianRun(runs: Run[]): Run {
  return [...runs].sort((x, y) => x.wallS - y.wallS)[Math.floor(runs.length / 2)];
}

/**
 * Both sides `rounds` times in turn, each side's median run reported: one run of each swung the ratio between 4x and 6x
 * on this machine (the scipy loop alone took 21 to 36 s from one run to the next), and taking turns lets a slow spell
 * of the machine fall on both.
 */
export function benchBatch(seed: number, count: number, range: CorpusRange, jobs: number, cores: number, rounds: number): void {
  console.log(`\nBatch against a scipy loop: the first ${count} captures as files, \`ringbench batch --jobs ${jobs}\` (a fresh process, no hints)`);
  console.log(`against numpy.loadtxt + curve_fit per file in one python3 process (bench/corpusScipyLoop.py: a start 1 % off the truth);`);
  console.log(`${rounds} round(s) in turn, the median of each side shown.`);
  const folder = writeCorpusFolder(seed, count, range);
  const build = spawnSync(process.execPath, [path.join(ROOT, 'build/build.mjs')], { encoding: 'utf8' });
  if (build.status !== 0) throw new Error(`npm run build failed: ${build.stderr.trim().split('\n').pop()}`);

  const ourRuns: Run[] = [];
  const scipyRuns: Run[] = [];
  for (let round = 0; round < rounds; round++) {
    ourRuns.push(timed(process.execPath, [path.join(ROOT, 'bin/ringbench.js'), 'batch', folder, '--jobs', String(jobs), '--jsonl']));
    const scipyRun = timed('python3', [path.join(ROOT, 'bench/corpusScipyLoop.py'), folder]);
    scipyRuns.push(scipyRun);
    // Without numpy and scipy the loop only says so: one round of it is enough.
    if (!scipyRun.stdout.trim().startsWith('{')) break;
    console.error(`  round ${round + 1} of ${rounds}: batch ${fixed(ourRuns[round].wallS)} s, scipy loop ${fixed(scipyRun.wallS)} s`);
  }
  const ours = medianRun(ourRuns);
  const scipy = medianRun(scipyRuns);
  const lines = ours.stdout.trimEnd().split('\n').map((line) => JSON.parse(line) as { status: string });
  const converged = lines.filter((l) => l.status === 'converged').length;
  const scipyLine = scipy.stdout.trim();
  const scipyFigures = scipyLine.startsWith('{') ? (JSON.parse(scipyLine) as { fitted: number; failed: number }) : null;
  const spread = (runs: Run[]) => (runs.length > 1 ? `${fixed(Math.min(...runs.map((r) => r.wallS)))}-${fixed(Math.max(...runs.map((r) => r.wallS)))}` : '-');

  const rows = [
    ['ringbench batch', fixed(ours.wallS), spread(ourRuns), fixed(ours.cpuS), ...cpuUse(ours, cores), `${converged} converged of ${lines.length}`],
    scipyFigures
      ? ['scipy loop', fixed(scipy.wallS), spread(scipyRuns), fixed(scipy.cpuS), ...cpuUse(scipy, cores), `${scipyFigures.fitted} fitted, ${scipyFigures.failed} gave up`]
      : ['scipy loop', '-', '-', '-', '-', '-', scipyLine],
  ];
  console.log(formatTable(['', 'wall s', 'range s', 'CPU s (user+sys)', 'CPU use', `per core (${cores})`, 'captures'], rows));
  if (!scipyFigures) return;
  const ratio = scipy.wallS / ours.wallS;
  console.log(`scipy loop / batch wall time (medians): ${ratio.toFixed(1)}x`);
  console.log(goalLine(ratio >= GOAL_RATIO, `batch >= ${GOAL_RATIO}x faster than the scipy loop over the same ${count} files`, `${ratio.toFixed(1)}x`));
}
