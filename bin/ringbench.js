#!/usr/bin/env node
// Launcher for the built command line (npm install builds dist/ through the prepare script).
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';

const built = fileURLToPath(new URL('../dist/cli.js', import.meta.url));
if (!existsSync(built)) {
  process.stderr.write('ringbench: the command line is not built yet; run `npm run build` in the repository first\n');
  process.exit(2);
}
await import(pathToFileURL(built).href);
