// Starts a batch worker thread: the built script beside the bundled command line (dist/batchWorker.js), or,
// when running from source (tests, tsx), the TypeScript module loaded through tsx's loader.

import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { BatchSettings } from './batchFile';

/** esbuild bundles this module into dist/cli.js, whose folder also holds the worker's own bundle. */
const FROM_SOURCE = import.meta.url.endsWith('.ts');

export function startBatchWorker(batch: BatchSettings): Worker {
  const script = new URL(FROM_SOURCE ? './batchWorker.ts' : './batchWorker.js', import.meta.url);
  if (!existsSync(fileURLToPath(script))) {
    throw new Error(`the batch worker '${fileURLToPath(script)}' is missing: run \`npm run build\` in the repository`);
  }
  if (!FROM_SOURCE) return new Worker(script, { workerData: batch });
  // tsx is a development dependency, present wherever the sources are run directly.
  const loader = createRequire(import.meta.url).resolve('tsx/esm/api');
  const boot = `require(${JSON.stringify(loader)}).register(); import(${JSON.stringify(script.href)});`;
  return new Worker(boot, { eval: true, workerData: batch });
}
