// The command line against a quick scipy script on one file, each a fresh process timed from outside, in turn; medians and their ratio.

import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { truthPath } from './speedCapture';
import { BLOCK_MEANS_TARGET } from '../core/fit/fitSet';

const HERE = path.dirname(fileURLToPath(import.meta.url));
/** Block means the scipy script fits: as many points as the fit's own decimation keeps of a long record. */
const SCIPY_BLOCKS = BLOCK_MEANS_TARGET;
/** The goal: the command line in at most half the script's time. */
export const PIPELINE_GOAL = 0.5;

export interface PipelineTimes {
  /** Median wall times over the rounds, s. */
  cliS: number;
  scipyS: number;
  rounds: number;
}

function wallSeconds(command: string, args: string[]): number {
  const start = performance.now();
  const child = spawnSync(command, args, { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  const seconds = (performance.now() - start) / 1000;
  if (child.error || child.status !== 0) throw new Error(`${path.basename(args[0])} failed (exit ${child.status}): ${child.error?.message ?? child.stderr.trim().split('\n').pop()}`);
  if (child.stdout.startsWith('skipped:')) throw new Error(child.stdout.trim());
  return seconds;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/**
 * `node bin/ringbench.js fit FILE --topology series --known C=470n --json` and the scipy script, alternately
 * `rounds` times (so a busy spell slows both); null with the reason when python3, numpy or scipy is missing.
 */
export function timePipelines(file: string, rounds: number): PipelineTimes | string {
  const bin = path.join(HERE, '..', 'bin', 'ringbench.js');
  const cli = [bin, 'fit', file, '--topology', 'series', '--known', 'C=470n', '--json'];
  const script = [path.join(HERE, 'scipyBlockMeans.py'), file, truthPath(file), String(SCIPY_BLOCKS)];
  const ours: number[] = [];
  const theirs: number[] = [];
  try {
    for (let r = 0; r < rounds; r++) {
      ours.push(wallSeconds(process.execPath, cli));
      theirs.push(wallSeconds('python3', script));
    }
  } catch (error) {
    return `skipped: the command line against scipy (${(error as Error).message})`;
  }
  return { cliS: median(ours), scipyS: median(theirs), rounds };
}
