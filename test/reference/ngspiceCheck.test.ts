// The committed ngspice fixtures are what ngspice writes today (`generate.ts --check`), and the
// comparison behind the check catches a fixture that has drifted.

import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { CHECK_TOLERANCE, NGSPICE_DIR, readManifest } from './ngspice/fixtures';
import { compareRuns } from './ngspice/fixtureRun';
import { findNgspice } from './ngspice/simulator';

const REPO_ROOT = path.resolve(NGSPICE_DIR, '../../..');
const simulator = findNgspice();
if (!simulator) console.warn('ngspice is not on PATH: skipping the `generate.ts --check` test (CI installs ngspice).');

describe.skipIf(!simulator)('ngspice fixtures regenerate (ngspice on PATH)', () => {
  it('generate.ts --check exits 0', () => {
    const run = spawnSync('npx', ['tsx', 'test/reference/ngspice/generate.ts', '--check'], { cwd: REPO_ROOT, encoding: 'utf8' });
    expect(run.status, `${run.stdout}\n${run.stderr}`).toBe(0);
    expect(run.stdout).toContain('check passed');
  }, 180_000);
});

describe('fixture comparison', () => {
  let copy = '';
  afterEach(() => rmSync(copy, { recursive: true, force: true }));

  /** A copy of the committed netlists and fixtures with one fixture value moved by `shift` of its scale. */
  function drifted(shift: number): string {
    copy = mkdtempSync(path.join(tmpdir(), 'ringbench-ngspice-drift-'));
    cpSync(path.join(NGSPICE_DIR, 'netlists'), path.join(copy, 'netlists'), { recursive: true });
    cpSync(path.join(NGSPICE_DIR, 'fixtures'), path.join(copy, 'fixtures'), { recursive: true });
    const entry = readManifest().circuits[0];
    const file = path.join(copy, 'fixtures', entry.file);
    const lines = readFileSync(file, 'utf8').split('\n');
    const [t, v] = lines[500].split(',');
    lines[500] = `${t},${Number(v) + shift * entry.scale}`;
    writeFileSync(file, lines.join('\n'));
    return copy;
  }

  it('accepts identical files and rejects a value moved by 10x the tolerance', () => {
    expect(compareRuns(drifted(0), NGSPICE_DIR).problems).toEqual([]);
    rmSync(copy, { recursive: true, force: true });
    const problems = compareRuns(drifted(10 * CHECK_TOLERANCE), NGSPICE_DIR).problems;
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(/series-step-underdamped: fixture differs/);
  });
});
