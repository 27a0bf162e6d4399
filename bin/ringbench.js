#!/usr/bin/env node
// Launcher for the command line: builds dist/ on first use (npm ci runs no install scripts), then runs it.
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';

const built = fileURLToPath(new URL('../dist/cli.js', import.meta.url));
if (!existsSync(built)) {
  try {
    await import(pathToFileURL(fileURLToPath(new URL('../build/build.mjs', import.meta.url))).href);
  } catch (error) {
    process.stderr.write(`ringbench: could not build the command line (${error.message}); run \`npm ci\` in the repository first\n`);
    process.exit(2);
  }
}
await import(pathToFileURL(built).href);
