// `fit --json` on every sample capture against its output recorded before the use-case layer was built:
// every field is unchanged, and the only fields added since are the transition metrics.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../main/cli/program';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const GOLDEN_DIR = path.join(ROOT, 'test', 'fixtures', 'fitJson');
/** Fields `fit --json` gained after the golden outputs were recorded. */
const ADDED_FIELDS = ['transitions', 'import'];

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
      expect(added).toEqual(ADDED_FIELDS);
      const kept = Object.fromEntries(Object.entries(json).filter(([key]) => !ADDED_FIELDS.includes(key)));
      expect(kept).toEqual(golden.output);
      // The added transition metrics reach the text output too: the level method, or why there is no step.
      expect(text).toMatch(/^ {2}transitions {6}(state levels: fitted model|not measured: )/m);
    });
  }
});
