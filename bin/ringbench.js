#!/usr/bin/env node
// Launcher for the command line: builds dist/ on first use (npm ci runs no install scripts) and again whenever a source
// changed since (a pull or an edit would otherwise run the old build), then runs it.
import { existsSync, mkdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const BUILT = join(ROOT, 'dist', 'cli.js');
const BUILD_SCRIPT = join(ROOT, 'build', 'build.mjs');
/** Every source folder and file the build was made from, with its mtime and size (written by build/build.mjs). */
const MANIFEST = join(ROOT, 'dist', 'sources.json');
/** Held while one process builds, so that another waits for it instead of reading half-written files. */
const LOCK = join(ROOT, 'dist', '.building');
/** A lock older than this was left by a build that died: taken over. */
const STALE_LOCK_MS = 120_000;
const POLL_MS = 100;

function readManifest() {
  try {
    return JSON.parse(readFileSync(MANIFEST, 'utf8'));
  } catch {
    return null;
  }
}

/**
 * Whether the build is missing or was made from other sources: a file edited in place changes its own mtime, one
 * added or removed its folder's (a stat of each entry; no folder is read). Without the manifest (a first build that
 * failed, or a build older than it) the build is made again when its script is here; an installed copy without its
 * sources is never rebuilt.
 */
function needsBuild() {
  if (!existsSync(BUILT)) return true;
  const manifest = readManifest();
  if (!manifest) return existsSync(BUILD_SCRIPT);
  if (!manifest.folders.every((folder) => existsSync(join(ROOT, folder)))) return false;
  for (const [path, [mtimeMs, size]] of Object.entries(manifest.entries)) {
    // ROOT ends in a separator and the paths use '/', which every platform reads: path.join's normalising of these
    // hundreds of paths cost about as much as their stats. A missing entry is a change, not an error.
    const stats = statSync(ROOT + path, { throwIfNoEntry: false });
    if (stats?.mtimeMs !== mtimeMs || stats.size !== size) return true;
  }
  return false;
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
    await import(pathToFileURL(BUILD_SCRIPT).href);
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
