// `fit --json` on every sample capture against its output recorded before the use-case layer was built:
// every field is unchanged up to rounding, and the only fields added since are the ringing modes with their order table,
// the transition metrics, the import, the setup checks, and the level before the event (or the flag saying the record
// holds none).
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../main/cli/program';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const GOLDEN_DIR = path.join(ROOT, 'test', 'fixtures', 'fitJson');
/** Fields `fit --json` gained after the golden outputs were recorded. */
const ADDED_FIELDS = ['modes', 'modelOrder', 'transitions', 'import', 'setupChecks'];
/** Added after them too, one or the other: the fitted level before the event, or the flag that the fit saw none. */
const START_FIELDS = ['preLevel', 'startsInResponse'];
/**
 * How far a number may move: the fit's arithmetic in another order (another SVD, a refactor) moves the last
 * digits, up to about 2e-7 relative where a quantity is ill-conditioned (omega_d near critical damping) and
 * 1e-11 absolute for a correlation near zero. Where the solver stops inside its tolerance (chi^2 to 1e-12, a
 * trial Jacobian by forward differences) moves a small level or correlation up to about 3e-6 relative, a
 * millionth of its standard error; a change of method moves far more.
 */
const ROUNDING = 1e-5;
/**
 * The one absolute allowance: a correlation is a pure number no larger than 1, so one of 1e-9 is zero, and where
 * the search stops a refinement that has reached another start's minimum, the solver's stopping point moves it by
 * about that much (1.0e-9 between two otherwise orthogonal parameters of resonant-tank-coil-current). Every other
 * number is compared relative to itself: an absolute allowance of 1e-9 would pass any capacitance in farads.
 */
const CORRELATION_ROUNDING = 1e-8;
const CORRELATIONS = '$.correlation.';
/**
 * Which of two stopping tests is met first at convergence ('chi^2 changed by 7e-14...', 'no step lowers
 * chi^2 any further') depends on those digits too: the message is left out, the status is compared.
 */
const WORDING_OF_CONVERGENCE = '$.message';

/** '' when two JSON values are the same up to ROUNDING, else the first path that differs. */
function firstDifference(actual: unknown, expected: unknown, path = '$'): string {
  if (path === WORDING_OF_CONVERGENCE) return '';
  if (typeof actual === 'number' && typeof expected === 'number') {
    const absolute = path.startsWith(CORRELATIONS) ? CORRELATION_ROUNDING : 0;
    const tolerance = Math.max(absolute, ROUNDING * Math.max(Math.abs(actual), Math.abs(expected)));
    return Math.abs(actual - expected) <= tolerance ? '' : `${path}: ${actual} != ${expected}`;
  }
  if (typeof actual !== 'object' || typeof expected !== 'object' || actual === null || expected === null) {
    return actual === expected ? '' : `${path}: ${JSON.stringify(actual)} != ${JSON.stringify(expected)}`;
  }
  for (const key of new Set([...Object.keys(actual), ...Object.keys(expected)])) {
    const difference = firstDifference((actual as Record<string, unknown>)[key], (expected as Record<string, unknown>)[key], `${path}.${key}`);
    if (difference) return difference;
  }
  return '';
}

interface Golden {
  /** The arguments after `fit`. */
  args: string[];
  output: Record<string, unknown>;
}

async function fitJson(args: string[]): Promise<{ code: number; json: Record<string, unknown>; text: string }> {
  let out = '';
  const code = await runCli(['fit', ...args, '--json'], { out: (t) => (out += t), err: () => {}, cwd: ROOT, interactive: false });
  let text = '';
  await runCli(['fit', ...args], { out: (t) => (text += t), err: () => {}, cwd: ROOT, interactive: false });
  return { code, json: JSON.parse(out) as Record<string, unknown>, text };
}

describe('fit --json on the sample captures, against the recorded outputs', () => {
  const files = readdirSync(GOLDEN_DIR).filter((name) => name.endsWith('.json')).sort();

  it('has one recorded output per sample capture', () => {
    const manifest = JSON.parse(readFileSync(path.join(ROOT, 'sample-captures', 'manifest.json'), 'utf8')) as { captures: { file: string }[] };
    expect(files).toEqual(manifest.captures.map((c) => c.file.replace(/\.csv$/, '.json')).sort());
  });

  for (const name of files) {
    it(`${name}: the same fields and values, plus only the added fields`, async () => {
      const golden = JSON.parse(readFileSync(path.join(GOLDEN_DIR, name), 'utf8')) as Golden;
      const { code, json, text } = await fitJson(golden.args);
      expect(code).toBe(0);
      const added = Object.keys(json).filter((key) => !(key in golden.output));
      expect(added.filter((key) => !START_FIELDS.includes(key))).toEqual(ADDED_FIELDS);
      expect(START_FIELDS.filter((key) => key in json)).toHaveLength(1);
      const kept = Object.fromEntries(Object.entries(json).filter(([key]) => !ADDED_FIELDS.includes(key) && !START_FIELDS.includes(key)));
      expect(firstDifference(kept, golden.output)).toBe('');
      // The added transition metrics reach the text output too: the level method, or why there is no step.
      expect(text).toMatch(/^ {2}transitions {6}(state levels: fitted model|not measured: )/m);
    });
  }
});
