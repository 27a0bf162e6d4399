// Writes the sample captures, manifest.json and README.md (seeded, deterministic).
//   npx tsx sample-captures/generate.ts [--out <folder>]   (default: this folder)

import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { buildSampleCaptures } from './buildSamples';
import { SAMPLE_DIR } from './sampleManifest';

function main(argv: string[]): void {
  const at = argv.indexOf('--out');
  const dir = at >= 0 && argv[at + 1] ? path.resolve(argv[at + 1]) : SAMPLE_DIR;
  mkdirSync(dir, { recursive: true });
  const files = buildSampleCaptures();
  for (const [name, text] of files) writeFileSync(path.join(dir, name), text);
  console.log(`wrote ${files.size} files to ${dir}`);
}

main(process.argv.slice(2));
