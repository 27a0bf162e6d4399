// The command line as an engineer scripts it: fit, check and parasitics on the sample captures, and bad input.
import { mkdtempSync, readFileSync, writeFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const SAMPLES = path.join(ROOT, 'sample-captures');

const run = (args: string[], cwd = ROOT) => runCliIn(cwd, args);

interface ManifestEntry {
  file: string;
  topology: 'series' | 'parallel';
  R: number;
  L: number;
  C: number;
  channel: string;
  known: { name: 'R' | 'L' | 'C'; option: string };
}
const manifest: { captures: ManifestEntry[] } = JSON.parse(readFileSync(path.join(SAMPLES, 'manifest.json'), 'utf8'));

describe('ringbench fit on the sample captures', () => {
  for (const entry of manifest.captures) {
    it(`${entry.file}: recovers the stated R, L, C within the uncertainty it reports`, async () => {
      const { code, out, err } = await run([
        'fit',
        path.join('sample-captures', entry.file),
        '--topology',
        entry.topology,
        '--known',
        entry.known.option,
        '--column',
        entry.channel,
        '--json',
      ]);
      expect(err).toBe('');
      expect(code).toBe(0);
      const lines = out.trim().split('\n');
      expect(lines).toHaveLength(1);
      const result = JSON.parse(lines[0]);
      for (const key of ['file', 'regime', 'alpha', 'omega0', 'zeta', 'Q', 'finalValue', 't0', 'components', 'rmsResidual', 'samplesUsed', 'warnings']) {
        expect(result).toHaveProperty(key);
      }
      for (const name of ['R', 'L', 'C'] as const) {
        const q = result.components[name];
        if (name === entry.known.name) continue;
        expect(q.stderr).toBeGreaterThan(0);
        // Within three of its own standard errors of the value the capture was made from.
        expect(Math.abs(q.value - entry[name])).toBeLessThan(3 * q.stderr);
      }
    });
  }

  it('prints a readable table with units and uncertainties', async () => {
    const { code, out } = await run(['fit', 'sample-captures/input-filter-step.csv', '--topology', 'series', '--known', 'C=47u']);
    expect(code).toBe(0);
    expect(out).toMatch(/alpha\s+\S+ ks\^-1 ± /);
    expect(out).toMatch(/L\s+6\.\d+ µH ± /);
    expect(out).toMatch(/cautions/);
  });
});

describe('ringbench fit refuses bad input with one line and exit code 2', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-cli-'));
  const junk = path.join(dir, 'junk.csv');
  writeFileSync(junk, 'Time (s),CH1 (V)\n0,1\n1e-9,2\nabc,def\n' + Array.from({ length: 30 }, (_, i) => `${(i + 3) * 1e-9},${i}`).join('\n'));
  const cases: [string, string[], RegExp][] = [
    ['a file that is not a capture', ['fit', junk], /line 4/],
    ['a missing file', ['fit', path.join(dir, 'nope.csv')], /no such file/],
    ['an unknown option', ['fit', 'sample-captures/input-filter-step.csv', '--frobnicate'], /unknown option/],
    ['--known of zero', ['fit', 'sample-captures/input-filter-step.csv', '--topology', 'series', '--known', 'C=0'], /positive/],
    ['a negative --known', ['fit', 'sample-captures/input-filter-step.csv', '--topology', 'series', '--known', 'C=-47u'], /--known/],
    ['a --known that is not a number', ['fit', 'sample-captures/input-filter-step.csv', '--topology', 'series', '--known', 'C=lots'], /--known/],
    ['--known without --topology', ['fit', 'sample-captures/input-filter-step.csv', '--known', 'C=47u'], /--topology/],
  ];
  for (const [what, args, pattern] of cases) {
    it(what, async () => {
      const { code, out, err } = await run(args);
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err).toMatch(pattern);
    });
  }
  it('writes nothing beside the input', () => {
    expect(readdirSync(dir).sort()).toEqual(['junk.csv']);
  });
  it('the installed command exits 2 as well', () => {
    const result = spawnSync(process.execPath, [path.join(ROOT, 'bin/ringbench.js'), 'fit', path.join(dir, 'nope.csv')], { encoding: 'utf8' });
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/^ringbench: cannot read .*no such file\n$/);
  });
});

describe('ringbench check and parasitics', () => {
  it('check passes the board built as designed (exit 0)', async () => {
    const { code, out } = await run(['check', 'sample-captures/input-filter-step.csv', '--design', 'sample-captures/designs/input-filter-step.json', '--json']);
    expect(code).toBe(0);
    expect(JSON.parse(out).verdict.pass).toBe(true);
  });
  it('check fails a board whose choke is 40 % off its design (exit 3) and names L', async () => {
    const design = JSON.parse(readFileSync(path.join(SAMPLES, 'designs/input-filter-step.json'), 'utf8'));
    design.components.L.value = 6.8e-6 * 1.4;
    design.components.L.tolerance = 0.1;
    const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-check-'));
    writeFileSync(path.join(dir, 'board.json'), JSON.stringify(design));
    const { code, out } = await run(['check', path.join(SAMPLES, 'input-filter-step.csv'), '--design', path.join(dir, 'board.json'), '--json']);
    expect(code).toBe(3);
    const result = JSON.parse(out);
    expect(result.verdict.pass).toBe(false);
    expect(result.verdict.likelyCause.component).toBe('L');
  });
  it('check refuses a design file with a bad field (exit 2, the field named)', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-check-'));
    writeFileSync(path.join(dir, 'board.json'), '{"format":"ringbench-design","version":1,"name":"x","topology":"series","components":{"R":{"value":-1}}}');
    const { code, err } = await run(['check', 'sample-captures/input-filter-step.csv', '--design', path.join(dir, 'board.json')]);
    expect(code).toBe(2);
    expect(err).toMatch(/^ringbench: \S+board\.json: design /);
  });
  it('parasitics recovers the switch-node loop and suggests a snubber', async () => {
    const files = ['switch-node-before.csv', 'switch-node-after-470p.csv', 'switch-node-after-1n.csv'].map((f) => path.join('sample-captures', f));
    const { code, out } = await run(['parasitics', ...files, '--added', 'C=470p,1n', '--added-tolerance', '0', '--voltage', '48', '--switching-frequency', '250k', '--json']);
    expect(code).toBe(0);
    const r = JSON.parse(out);
    const stated = manifest.captures.find((c) => c.file === 'switch-node-before.csv')!;
    expect(Math.abs(r.L.value - stated.L)).toBeLessThan(3 * r.L.stderr + 0.01 * stated.L);
    expect(Math.abs(r.C.value - stated.C)).toBeLessThan(3 * r.C.stderr + 0.01 * stated.C);
    expect(r.captures).toHaveLength(3);
    expect(r.snubber.R.value).toBeCloseTo(Math.sqrt(r.L.value / r.C.value), 6);
    expect(r.snubber.powerAt.power).toBeGreaterThan(0);
  });
  it('parasitics refuses a count of added values that does not match the captures', async () => {
    const { code, err } = await run(['parasitics', 'sample-captures/switch-node-before.csv', 'sample-captures/switch-node-after-470p.csv', '--added', 'C=470p,1n', '--added-tolerance', '0']);
    expect(code).toBe(2);
    expect(err).toMatch(/--added/);
  });
});
