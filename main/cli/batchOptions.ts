// `batch`'s own options read once: --jobs (threads at once) and --shard K/N (which share of the folder).

import { availableParallelism } from 'node:os';
import { UsageError } from '../../core/inputError';
import type { Shard } from '../app/batchFolder';

/** --jobs N: a whole number >= 1; default: one per core. */
export function parseJobs(text: string | undefined): number {
  if (text === undefined) return availableParallelism();
  const jobs = /^\d+$/.test(text.trim()) ? Number(text.trim()) : NaN;
  if (!Number.isSafeInteger(jobs) || jobs < 1) throw new UsageError(`--jobs: expected a whole number of threads, 1 or more, got '${text}'`, '--jobs');
  return jobs;
}

/** --shard K/N: whole numbers with 1 <= K <= N. */
export function parseShard(text: string | undefined): Shard | null {
  if (text === undefined) return null;
  const match = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const [index, count] = match ? [Number(match[1]), Number(match[2])] : [NaN, NaN];
  if (!Number.isSafeInteger(index) || !Number.isSafeInteger(count) || count < 1 || index < 1 || index > count) {
    throw new UsageError(`--shard: expected K/N with whole numbers 1 <= K <= N (shard K of N, e.g. 2/8), got '${text}'`, '--shard');
  }
  return { index, count };
}
