#!/usr/bin/env node
// Launcher for the command line: builds dist/ on first use (npm ci runs no install scripts) and again whenever a source
// is newer than it (a pull or an edit would otherwise run the old build), then runs it.
import { existsSync, mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const BUILT = join(ROOT, 'dist', 'cli.js');
/** The folders the bundle is built from; an installed copy without them is never rebuilt. */
const SOURCES = ['core', 'main', 'renderer', 'build'];
/** Pictures in the sources that the build does not read. */
const NOT_BUILT = new Set(['screenshots']);
/** Held while one process builds, so that another waits for it instead of reading half-written files. */
const LOCK = join(ROOT, 'dist', '.building');
/** A lock older than this was left by a build that died: taken over. */
const STALE_LOCK_MS = 120_000;
const POLL_MS = 100;

/** Whether any file below `dir` was changed after `time` (ms). */
function changedAfter(dir, time) {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (NOT_BUILT.has(entry.name)) continue;
    const path = join(dir, entry.name);
    const stats = statSync(path);
    if (stats.isDirectory() ? changedAfter(path, time) : stats.mtimeMs > time) return true;
  }
  return false;
}

function needsBuild() {
  if (!existsSync(BUILT)) return true;
  if (!SOURCES.every((dir) => existsSync(join(ROOT, dir)))) return false;
  const builtAt = statSync(BUILT).mtimeMs;
  return SOURCES.some((dir) => changedAfter(join(ROOT, dir), builtAt));
}

const sleep = (ms) => new Promise((done) => setTimeout(done, ms));

/** Wait while another process builds (a lock older than STALE_LOCK_MS is a dead build's, and is taken away). */
async function waitForOtherBuild() {
  while (existsSync(LOCK)) {
    const heldFor = Date.now() - (statSync(LOCK, { throwIfNoEntry: false })?.mtimeMs ?? Date.now());
    if (heldFor > STALE_LOCK_MS) rmSync(LOCK, { recursive: true, force: true });
    else await sleep(POLL_MS);
  }
}

/** Build under the lock, unless another process's build, waited for, leaves nothing to do. */
async function build() {
  for (;;) {
    await waitForOtherBuild();
    if (!needsBuild()) return;
    try {
      mkdirSync(join(ROOT, 'dist'), { recursive: true });
      mkdirSync(LOCK);
      break;
    } catch {
      // Another process took the lock first: wait for its build.
    }
  }
  try {
    await import(pathToFileURL(join(ROOT, 'build', 'build.mjs')).href);
  } finally {
    rmSync(LOCK, { recursive: true, force: true });
  }
}

try {
  await build();
} catch (error) {
  process.stderr.write(`ringbench: could not build the command line (${error.message}); run \`npm ci\` in the repository first\n`);
  process.exit(2);
}
await import(pathToFileURL(BUILT).href);
