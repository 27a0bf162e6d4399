// Finds the application folder (the one holding package.json, dist/ and sample-captures/).

import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { FileError } from './fileError';

/** Walk up from `start` (a file URL or folder) to the folder whose package.json names ringbench. */
export function findProjectRoot(start: string): string {
  let folder = start.startsWith('file:') ? dirname(fileURLToPath(start)) : start;
  for (;;) {
    const manifest = join(folder, 'package.json');
    if (existsSync(manifest)) {
      try {
        if ((JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'ringbench') return folder;
      } catch {
        // not ours; keep walking
      }
    }
    const parent = dirname(folder);
    if (parent === folder) throw new FileError(`cannot find the ringbench folder above '${start}'`);
    folder = parent;
  }
}

/** The built renderer, or a message saying how to build it. */
export function rendererDirOf(projectRoot: string): string {
  const dir = join(projectRoot, 'dist', 'renderer');
  if (!existsSync(join(dir, 'index.html'))) throw new FileError(`the bench is not built yet: run \`npm run build\` in ${projectRoot}`);
  return dir;
}
