// `npm run bench:cli-split`: where the fit command's time goes on the 10^6-sample capture (start-up, import, event search, fit, after the fit, output), from CPU profiles of fresh processes.
//
// Usage: tsx bench/cliSplit.ts [--runs 5] [--bin bin/ringbench.js] [--samples 1e6] [--seed 1]

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { writeSpeedCapture } from './speedCapture';
import { fixed, formatTable, sizeLabel } from './table';

const HERE = path.dirname(fileURLToPath(import.meta.url));
const OUT = path.join(HERE, 'out');

/**
 * The phases, each named by the functions that open it in the bundle; a sample belongs to the innermost one on
 * its stack (the event search and the fit run inside measureCapture, which runs inside the command line).
 */
const PHASE_OF: Record<string, string> = {
  loadCaptureFor: 'import',
  loadCapture: 'import',
  findEventTrain: 'event search',
  fitResponse: 'fit',
  measureCapture: 'after the fit',
  runCli: 'options and output',
  '(garbage collector)': 'garbage collection',
};
/** Everything outside those functions: node's own start, reading and compiling the bundle. */
const START_UP = 'start-up';
const PHASES = [START_UP, 'import', 'event search', 'fit', 'after the fit', 'options and output', 'garbage collection'];
/** The profiler's own entries for time without JavaScript running. */
const NOT_CPU = new Set(['(idle)']);

interface ProfileNode {
  id: number;
  callFrame: { functionName: string };
  children?: number[];
}

interface CpuProfile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}

/** esbuild renames a function whose name is taken twice in the bundle by adding digits: fitResponse2. */
function phaseOfName(name: string): string | undefined {
  return PHASE_OF[name] ?? PHASE_OF[name.replace(/\d+$/, '')];
}

/** Milliseconds of samples in each phase of one profile. */
function splitProfile(profile: CpuProfile): Map<string, number> {
  const parent = new Map<number, number>();
  for (const node of profile.nodes) for (const child of node.children ?? []) parent.set(child, node.id);
  const byId = new Map(profile.nodes.map((node) => [node.id, node]));
  const phaseCache = new Map<number, string | null>();
  const phaseOf = (id: number): string | null => {
    const known = phaseCache.get(id);
    if (known !== undefined) return known;
    const name = byId.get(id)?.callFrame.functionName ?? '';
    const up = parent.get(id);
    const phase = NOT_CPU.has(name) ? null : (phaseOfName(name) ?? (up === undefined ? START_UP : phaseOf(up)));
    phaseCache.set(id, phase);
    return phase;
  };
  const ms = new Map<string, number>();
  profile.samples.forEach((id, k) => {
    const phase = phaseOf(id);
    if (phase !== null) ms.set(phase, (ms.get(phase) ?? 0) + (profile.timeDeltas[k + 1] ?? 0) / 1000);
  });
  return ms;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** One fresh process of the fit command, profiled or not: its wall time, s, and the profile's split when profiled. */
function runFit(bin: string, file: string, profileDir: string | null): { wallS: number; split: Map<string, number> | null } {
  const profiling = profileDir ? ['--cpu-prof', `--cpu-prof-dir=${profileDir}`] : [];
  const start = performance.now();
  const child = spawnSync(process.execPath, [...profiling, bin, 'fit', file, '--topology', 'series', '--known', 'C=470n', '--json'], {
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  const wallS = (performance.now() - start) / 1000;
  if (child.status !== 0) throw new Error(`the fit command failed (exit ${child.status}): ${child.stderr.trim().split('\n').pop()}`);
  if (!profileDir) return { wallS, split: null };
  const [name] = readdirSync(profileDir).filter((f) => f.endsWith('.cpuprofile'));
  const split = splitProfile(JSON.parse(readFileSync(path.join(profileDir, name), 'utf8')) as CpuProfile);
  rmSync(path.join(profileDir, name));
  return { wallS, split };
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      runs: { type: 'string', default: '5' },
      bin: { type: 'string', default: path.join(HERE, '..', 'bin', 'ringbench.js') },
      samples: { type: 'string', default: '1e6' },
      seed: { type: 'string', default: '1' },
    },
  });
  const runs = Math.max(1, Number(values.runs) || 1);
  const samples = Number(values.samples);
  const seed = Number(values.seed);
  if (!Number.isInteger(samples) || samples < 100) throw new Error(`--samples: '${values.samples}' is not a whole number of at least 100`);
  if (!Number.isInteger(seed)) throw new Error(`--seed: '${values.seed}' is not an integer`);
  const bin = path.resolve(values.bin as string);
  const file = path.join(OUT, `speed-${sizeLabel(samples)}.csv`);
  writeSpeedCapture(file, samples, seed);
  // Once untimed: the launcher builds dist/ when it is missing, and the file reaches the page cache.
  runFit(bin, file, null);

  const profileDir = mkdtempSync(path.join(tmpdir(), 'ringbench-cli-split-'));
  const walls: number[] = [];
  const splits: Map<string, number>[] = [];
  try {
    // Plain and profiled runs in turn, so that a busy spell on the machine touches both.
    for (let r = 0; r < runs; r++) {
      walls.push(runFit(bin, file, null).wallS);
      splits.push(runFit(bin, file, profileDir).split as Map<string, number>);
    }
  } finally {
    rmSync(profileDir, { recursive: true, force: true });
  }
  const totals = splits.map((split) => [...split.values()].reduce((a, b) => a + b, 0));
  const wallS = median(walls);
  console.log(`\n\`${path.relative(process.cwd(), bin)} fit ${path.relative(process.cwd(), file)} --topology series --known C=470n --json\`, ${runs} run(s) of each kind`);
  console.log(`wall time without the profiler: median ${fixed(wallS)} s (${walls.map((w) => w.toFixed(2)).join(', ')})`);
  console.log(
    formatTable(
      ['phase', 'profiled ms, median', 'share %', 'of the plain wall, s'],
      PHASES.map((phase) => {
        const shares = splits.map((split, k) => (split.get(phase) ?? 0) / totals[k]);
        return [phase, fixed(median(splits.map((split) => split.get(phase) ?? 0))), fixed(100 * median(shares)), fixed(wallS * median(shares))];
      }),
    ),
  );
  console.log(
    'The profiler samples the main thread over wall time (a busy machine stretches every phase) and costs time itself, so the last column spreads the plain wall time by the median shares.',
  );
  console.log(
    "start-up: node's own start and loading the bundle; options and output: the command line's parsing, settings, JSON and writing; after the fit: components, transition metrics, cautions and the other checks of measureCapture.",
  );
}

main().catch((error) => {
  process.stderr.write(`cliSplit: ${(error as Error).message}\n`);
  process.exit(1);
});
