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

/**
 * Makes Node read the CA certificates in the file it names as it starts, before any script runs (set on machines
 * behind a proxy that re-signs TLS, as this sandbox's is; no laptop has it by default): 65 ms of each start here.
 */
export const EXTRA_CA_CERTS = 'NODE_EXTRA_CA_CERTS';

export interface PipelineTimes {
  /** Median wall times over the rounds, s. */
  cliS: number;
  /** The command line without EXTRA_CA_CERTS, where it is set; else null. */
  cliWithoutCaS: number | null;
  scipyS: number;
  rounds: number;
}

function wallSeconds(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): number {
  const start = performance.now();
  const child = spawnSync(command, args, { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024, env });
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
 * `rounds` times (so a busy spell slows both), the command line also without EXTRA_CA_CERTS where it is set;
 * the reason instead when python3, numpy or scipy is missing.
 */
export function timePipelines(file: string, rounds: number): PipelineTimes | string {
  const bin = path.join(HERE, '..', 'bin', 'ringbench.js');
  const cli = [bin, 'fit', file, '--topology', 'series', '--known', 'C=470n', '--json'];
  const script = [path.join(HERE, 'scipyBlockMeans.py'), file, truthPath(file), String(SCIPY_BLOCKS)];
  const withoutCa = process.env[EXTRA_CA_CERTS] === undefined ? null : { ...process.env, [EXTRA_CA_CERTS]: undefined };
  const ours: number[] = [];
  const oursWithoutCa: number[] = [];
  const theirs: number[] = [];
  try {
    for (let r = 0; r < rounds; r++) {
      ours.push(wallSeconds(process.execPath, cli));
      if (withoutCa) oursWithoutCa.push(wallSeconds(process.execPath, cli, withoutCa));
      theirs.push(wallSeconds('python3', script));
    }
  } catch (error) {
    return `skipped: the command line against scipy (${(error as Error).message})`;
  }
  return { cliS: median(ours), cliWithoutCaS: withoutCa ? median(oursWithoutCa) : null, scipyS: median(theirs), rounds };
}
