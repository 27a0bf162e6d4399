// Runs ngspice on every reference circuit and writes the netlists, the fixtures and their manifest;
// `--check` runs it again into a temporary folder and compares with the committed files.
//
//   npx tsx test/reference/ngspice/generate.ts           rewrite netlists/, fixtures/
//   npx tsx test/reference/ngspice/generate.ts --check   exit 0 when a fresh run matches, 1 when not, 2 without ngspice

import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { referenceCircuits } from './circuits';
import { CHECK_TOLERANCE, NGSPICE_DIR } from './fixtures';
import { compareRuns, generateFixtures } from './fixtureRun';
import { findNgspice } from './simulator';

function main(argv: string[]): number {
  const simulator = findNgspice();
  if (!simulator) {
    console.error('ngspice is not on PATH: install it (Debian: apt-get install ngspice) to generate or check fixtures.');
    return 2;
  }
  if (!argv.includes('--check')) {
    generateFixtures(NGSPICE_DIR, simulator);
    console.log(`wrote ${referenceCircuits.length} netlists and fixtures with ${simulator}`);
    return 0;
  }
  const fresh = mkdtempSync(path.join(tmpdir(), 'ringbench-ngspice-check-'));
  try {
    generateFixtures(fresh, simulator);
    const { lines, problems } = compareRuns(fresh, NGSPICE_DIR);
    for (const line of lines) console.log(line);
    for (const p of problems) console.error(p);
    console.log(problems.length === 0 ? `check passed (tolerance ${CHECK_TOLERANCE} of scale)` : 'check FAILED');
    return problems.length === 0 ? 0 : 1;
  } finally {
    rmSync(fresh, { recursive: true, force: true });
  }
}

process.exitCode = main(process.argv.slice(2));
