// One worker of the corpus benchmark: generates and fits every `stride`-th capture from `first`, one JSON outcome line each.
//
// Usage: tsx bench/corpusWorker.ts <seed> <count> <first> <stride> <minSamples> <maxSamples>

import { corpusCapture, corpusSpec } from './corpusCapture';
import { runCorpusCapture } from './corpusRun';

const args = process.argv.slice(2).map(Number);
const [seed, count, first, stride, minSamples, maxSamples] = args;
if (args.length !== 6 || !args.every(Number.isFinite) || stride < 1) {
  process.stderr.write('usage: tsx bench/corpusWorker.ts <seed> <count> <first> <stride> <minSamples> <maxSamples>\n');
  process.exit(2);
}
for (let index = first; index < count; index += stride) {
  const capture = corpusCapture(corpusSpec(index, seed, { minSamples, maxSamples }), seed);
  process.stdout.write(`${JSON.stringify(runCorpusCapture(capture))}\n`);
}
