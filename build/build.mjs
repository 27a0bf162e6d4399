// Builds dist/: the command line, the renderer (browser bench and window, one build), its fit worker,
// and the Electron main process and preload.
import { build, transform } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { copyFileSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

// Paths are taken from the repository root, so the build runs from any working folder.
const root = fileURLToPath(new URL('..', import.meta.url));
const at = (path) => join(root, path);

const common = { bundle: true, sourcemap: true, logLevel: 'warning', absWorkingDir: root };
const PLOTLY = at('node_modules/plotly.js-dist/plotly.js');
/**
 * The command line and batch's workers carry their packages inside the bundle: loading commander and ml-matrix as
 * CommonJS from node_modules (resolution, export scanning, one compile each) took more than a bare node's start-up.
 * Bundled CommonJS still requires Node's built-ins, and the workers' ES module has no `require` of its own: this one
 * is given.
 */
const NODE_REQUIRE = { js: "import { createRequire as createRequireForBundle } from 'node:module'; const require = createRequireForBundle(import.meta.url);" };

/**
 * The command line is one CommonJS file: bin/ringbench.js runs it with V8's code cache, which Node 20 offers for a
 * script and not for an ES module. Its first line names this build, so that the launcher never uses the cache of
 * another (V8 checks only a source's length); the modules that ask for their own URL are given the bundle's.
 */
const BUILD_ID = randomUUID();
const CLI_BANNER = { js: `// ringbench build ${BUILD_ID}\nvar __bundleUrl = require('node:url').pathToFileURL(__filename).href;` };
/** What the build wrote before the command line was one file (the entry and a chunk per command): removed. */
const EARLIER_CLI = /^cli(-[\w-]+)?\.js(\.map)?$/;
/** The fit whose compiled functions make the code cache: a typical command on a bundled sample capture. */
const CACHE_TRAINING = ['fit', at('sample-captures/switch-node-before.csv'), '--topology', 'series', '--known', 'C=390p', '--json'];

/**
 * What the build is made from, as bin/ringbench.js compares it: every folder and file below these, with its mtime and
 * size. Taken before the bundles are, so that a source edited while they build differs from its entry; written last.
 * An earlier build's list stays meanwhile: a command started during the build does not start a second one, and after
 * a build that failed the launcher compares the sources with the last build that succeeded (none: it builds).
 */
const SOURCES = ['core', 'main', 'renderer', 'build'];
/** Pictures in the sources that the build does not read. */
const NOT_BUILT = new Set(['screenshots']);
const MANIFEST = at('dist/sources.json');
const entries = {};
const record = (path) => {
  const { mtimeMs, size } = statSync(at(path));
  entries[path] = [mtimeMs, size];
};
for (const folder of SOURCES) {
  record(folder);
  for (const path of readdirSync(at(folder), { recursive: true })) {
    if (!path.split(sep).some((part) => NOT_BUILT.has(part))) record(`${folder}/${path.split(sep).join('/')}`);
  }
}

await Promise.all([
  build({
    ...common,
    // Each command's module still runs only when its command does (main/cli/program.ts imports it then).
    entryPoints: ['main/cli/index.ts'],
    outfile: 'dist/cli.cjs',
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    banner: CLI_BANNER,
    define: { 'import.meta.url': '__bundleUrl' },
  }),
  build({
    ...common,
    // batch's worker processes run dist/batchWorker.js, found beside the chunk that starts them (main/app/batchWorkerStart.ts).
    entryPoints: { batchWorker: 'main/app/batchWorker.ts' },
    outdir: 'dist',
    platform: 'node',
    format: 'esm',
    target: 'node20',
    banner: NODE_REQUIRE,
  }),
  build({
    ...common,
    entryPoints: { main: 'renderer/main.ts', worker: 'renderer/worker.ts' },
    outdir: 'dist/renderer',
    platform: 'browser',
    format: 'esm',
    target: 'chrome120',
    minify: true,
  }),
  build({
    ...common,
    entryPoints: { main: 'main/electron/main.ts' },
    outdir: 'dist/electron',
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
  }),
  // A sandboxed preload runs as one CommonJS file that may only require 'electron'.
  build({
    ...common,
    entryPoints: { preload: 'main/electron/preload.ts' },
    outfile: 'dist/electron/preload.cjs',
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    external: ['electron'],
  }),
  copyStatic(),
]);
for (const name of readdirSync(at('dist'))) if (EARLIER_CLI.test(name)) rmSync(at(`dist/${name}`));
trainCodeCache();
writeFileSync(MANIFEST, JSON.stringify({ folders: SOURCES, entries }));

/**
 * Makes dist/cli.codecache with one run of the new command line (see bin/ringbench.js). Without a cache the command
 * line only starts slower, so a run that fails leaves a warning and no cache, not a failed build.
 */
function trainCodeCache() {
  rmSync(at('dist/cli.codecache'), { force: true });
  const run = spawnSync(process.execPath, [at('bin/ringbench.js'), ...CACHE_TRAINING], {
    env: { ...process.env, RINGBENCH_CODE_CACHE_TRAINING: '1' },
    stdio: ['ignore', 'ignore', 'pipe'],
    encoding: 'utf8',
  });
  if (run.status !== 0 || !existsSync(at('dist/cli.codecache'))) {
    process.stderr.write(`build: no code cache for the command line (its training run ended with ${run.status}: ${run.stderr.trim().split('\n').pop()}); it starts slower\n`);
  }
}

/** The page, its styles, and plotly as its own script file (minified once, then kept while unchanged). */
async function copyStatic() {
  mkdirSync(at('dist/renderer'), { recursive: true });
  copyFileSync(at('renderer/styles.css'), at('dist/renderer/styles.css'));
  copyFileSync(at('renderer/icon.svg'), at('dist/renderer/icon.svg'));
  const source = readFileSync(PLOTLY, 'utf8');
  const { css, placeholders } = plotlyStyles(source);
  writeFileSync(at('dist/renderer/plotly-base.css'), css);
  writeFileSync(at('dist/renderer/index.html'), readFileSync(at('renderer/index.html'), 'utf8').replace('<!-- plotly styles: written by build/build.mjs -->', placeholders));
  const target = at('dist/renderer/plotly.min.js');
  if (!existsSync(target) || statSync(target).mtimeMs < statSync(PLOTLY).mtimeMs) {
    const { code } = await transform(source, { minify: true, target: 'chrome120' });
    writeFileSync(target, code);
  }
}

/**
 * Plotly injects its base CSS as <style> elements, which the page's CSP (style-src 'self') refuses.
 * Plotly skips that when an element with its style id carries the class 'no-inline-styles', and the
 * bundled map stylesheet is skipped when an element with its id exists. So the rules are written to a
 * stylesheet of our own, and both ids are placed in the page.
 */
function plotlyStyles(source) {
  const marker = source.indexOf('for (selector in rules)');
  const start = source.lastIndexOf('var rules = {', marker);
  if (marker < 0 || start < 0) throw new Error('build: cannot find the style rules in plotly.js (new plotly version?)');
  const literal = source.slice(start + 'var rules = '.length, source.lastIndexOf('};', marker) + 1);
  const rules = new Function(`return (${literal});`)();
  let css = '/* plotly.js base styles (MIT license, Plotly, Inc.), moved out of the script for the CSP */\n';
  for (const selector in rules) {
    const full = selector.replace(/^,/, ' ,').replace(/X/g, '.js-plotly-plot .plotly').replace(/Y/g, '.plotly-notifier');
    css += `${full}{${rules[selector]}}\n`;
  }
  const mapStyle = /maplibre-gl\.css"\(\) \{\s*\(function\(\) \{\s*if \(!document\.getElementById\("([0-9a-f]+)"\)\)/.exec(source);
  if (!mapStyle) throw new Error('build: cannot find the map stylesheet id in plotly.js (new plotly version?)');
  const placeholders = [
    '<link id="plotly.js-style-global" class="no-inline-styles" rel="stylesheet" href="plotly-base.css">',
    `<meta id="${mapStyle[1]}" name="plotly-map-styles" content="not used">`,
  ].join('\n  ');
  return { css, placeholders };
}
