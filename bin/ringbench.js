#!/usr/bin/env node
// Launcher for the command line: builds dist/ on first use (npm ci runs no install scripts) and again whenever a source
// changed since (a pull or an edit would otherwise run the old build), then runs it with its code cache.
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Script } from 'node:vm';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
/** The command line, one CommonJS file (build/build.mjs): V8 takes a code cache for a script, not for an ES module. */
const BUILT = join(ROOT, 'dist', 'cli.cjs');
/**
 * V8's code cache for BUILT: the bytecode of the functions a fit compiled, made by the build (see CACHE_TRAINING).
 * It spares each command parsing and compiling them again (a sample capture's fit 0.45 s -> 0.39 s). Its first line
 * is the build id of the bundle it was made from (BUILT's first line): V8 itself checks only the source's length.
 */
const CODE_CACHE = join(ROOT, 'dist', 'cli.codecache');
/** Set by the build for the one run that makes CODE_CACHE: the build is under way, so none is started. */
const CACHE_TRAINING = 'RINGBENCH_CODE_CACHE_TRAINING';
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

/** The build id on a bundle's or a code cache's first line ('// ringbench build <id>'), or null. */
function buildId(text) {
  return /^\/\/ ringbench build (\S+)\n/.exec(text)?.[1] ?? null;
}

/** The code cache made from the bundle with this build id, or undefined (none, or another build's). */
function readCodeCache(id) {
  try {
    const cache = readFileSync(CODE_CACHE);
    const header = cache.subarray(0, cache.indexOf(10) + 1).toString('latin1');
    return id !== null && buildId(header) === id ? cache.subarray(header.length) : undefined;
  } catch {
    return undefined;
  }
}

/** Write the code cache of `script` (at exit: it then holds every function the command compiled), whole or not at all. */
function writeCodeCache(script, id) {
  const partial = `${CODE_CACHE}.${process.pid}`;
  writeFileSync(partial, Buffer.concat([Buffer.from(`// ringbench build ${id}\n`, 'latin1'), script.createCachedData()]));
  renameSync(partial, CODE_CACHE);
}

/**
 * Runs the bundle as Node runs a CommonJS module, compiled with its code cache when that is this build's. V8
 * refuses a cache another V8 or other flags made (script.cachedDataRejected): the bundle is then compiled as usual.
 */
function runBundle() {
  const source = readFileSync(BUILT, 'utf8');
  const id = buildId(source);
  const training = process.env[CACHE_TRAINING] === '1';
  const wrapped = `(function (exports, require, module, __filename, __dirname) {${source}\n})`;
  const script = new Script(wrapped, { filename: BUILT, cachedData: training ? undefined : readCodeCache(id) });
  if (training && id !== null) process.once('exit', () => writeCodeCache(script, id));
  const module = { exports: {} };
  script.runInThisContext().call(module.exports, module.exports, createRequire(BUILT), module, BUILT, dirname(BUILT));
}

try {
  if (process.env[CACHE_TRAINING] !== '1') await build();
} catch (error) {
  process.stderr.write(`ringbench: could not build the command line (${error.message}); run \`npm ci\` in the repository first\n`);
  process.exit(2);
}
runBundle();
