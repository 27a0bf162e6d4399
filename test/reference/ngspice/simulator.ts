// Finds the ngspice build on PATH, for the generator and for the tests that need it.

import { spawnSync } from 'node:child_process';

/** The banner naming the ngspice build (e.g. 'ngspice-39'), or null when ngspice is not on PATH. */
export function findNgspice(): string | null {
  const run = spawnSync('ngspice', ['--version'], { encoding: 'utf8' });
  if (run.error || run.status !== 0) return null;
  const line = run.stdout.split('\n').find((l) => /ngspice-\d+/.test(l));
  return line ? line.replace(/^\**\s*/, '').split(':')[0].trim() : 'ngspice';
}
