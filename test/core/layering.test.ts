// The layers import only what the design allows: core is pure, main/ is layered (io < app < api < faces),
// the faces never import each other, the fit worker stays free of the DOM, and no module imports itself in a circle.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return sources(full);
    return /\.ts$/.test(name) && !/\.d\.ts$/.test(name) ? [full] : [];
  });
}

/** Every module specifier in import/export-from statements (types too) and dynamic imports. */
function importsOf(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const found: string[] = [];
  const pattern = /(?:^|\n)\s*(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|(?:^|\n)\s*import\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const m of text.matchAll(pattern)) found.push(m[1] ?? m[2] ?? m[3]);
  return found;
}

/** Repository-relative path (forward slashes). */
function rel(file: string): string {
  return path.relative(ROOT, file).split(path.sep).join('/');
}

/** The source file a relative specifier names (with .ts or /index.ts added), or null for a package. */
function resolveImport(from: string, spec: string): string | null {
  if (!spec.startsWith('.')) return null;
  const base = path.resolve(path.dirname(from), spec);
  const found = [base, `${base}.ts`, path.join(base, 'index.ts')].find((candidate) => existsSync(candidate) && statSync(candidate).isFile());
  return found ?? base;
}

/** Our modules each file imports, as repository-relative paths. */
function localImports(file: string): string[] {
  return importsOf(file).flatMap((spec) => {
    const target = resolveImport(file, spec);
    return target === null ? [] : [rel(target)];
  });
}

interface Rule {
  layer: string;
  /** Packages (bare specifiers) the layer may use. */
  packages: RegExp;
  /** Top-level folders of ours a relative import may reach. */
  folders: string[];
}

const RULES: Rule[] = [
  { layer: 'core', packages: /^(ml-matrix|ml-levenberg-marquardt|papaparse)$/, folders: ['core'] },
  { layer: 'renderer', packages: /^(plotly\.js-dist)$/, folders: ['renderer', 'core'] },
  { layer: 'main', packages: /^(node:.+|commander|electron|papaparse|ml-matrix|ml-levenberg-marquardt|playwright-core)$/, folders: ['main', 'core'] },
];

/** The zone of a module of main/: its folder, or the root file itself. */
type MainZone = 'io' | 'app' | 'api' | 'web' | 'cli' | 'server' | 'electron' | 'start' | 'version';

/**
 * What each zone of main/ may import besides core/ (and its own zone): files and the log at the bottom,
 * use cases on them, the bench API on those, the faces on top. The version is a constant anyone may read.
 */
const MAIN_TABLE: Record<MainZone, readonly MainZone[]> = {
  io: ['version'],
  app: ['io', 'version'],
  api: ['io', 'app', 'version'],
  web: [],
  cli: ['io', 'app', 'api', 'server', 'web', 'start', 'version'],
  server: ['io', 'app', 'api', 'web', 'version'],
  electron: ['io', 'app', 'api', 'web', 'version'],
  start: [],
  version: [],
};

/** The zone of a repository-relative path under main/, or null when it is not ours to place (a folder not in the table). */
function mainZone(file: string): MainZone | null {
  const parts = file.split('/');
  if (parts[0] !== 'main') return null;
  if (parts.length === 2) return parts[1] === 'start.ts' ? 'start' : parts[1] === 'version.ts' ? 'version' : null;
  return (Object.keys(MAIN_TABLE) as MainZone[]).includes(parts[1] as MainZone) ? (parts[1] as MainZone) : null;
}

/** Offences against the table: an import of main/ from a zone that may not reach it, or a main/ file in no zone. */
function mainTableOffences(table: Record<MainZone, readonly MainZone[]>, graph: Map<string, string[]>): string[] {
  const offences: string[] = [];
  for (const [file, targets] of graph) {
    if (!file.startsWith('main/')) continue;
    const zone = mainZone(file);
    if (zone === null) {
      offences.push(`${file} lies in no zone of the table`);
      continue;
    }
    for (const target of targets) {
      if (!target.startsWith('main/')) continue;
      const to = mainZone(target);
      if (to !== zone && (to === null || !table[zone].includes(to))) offences.push(`${file} (${zone}) imports ${target} (${to ?? 'no zone'})`);
    }
  }
  return offences;
}

/** Imports of main/cli from outside it: the command line is a face, only its launcher runs it (through dist/). */
function cliImportOffences(graph: Map<string, string[]>): string[] {
  return [...graph].flatMap(([file, targets]) =>
    file.startsWith('main/cli/') ? [] : targets.filter((t) => t.startsWith('main/cli/')).map((t) => `${file} imports ${t}`),
  );
}

/** Imports of core/workflow from the rest of core/: the use cases sit on top of core, nothing below uses them. */
function workflowImportOffences(graph: Map<string, string[]>): string[] {
  return [...graph].flatMap(([file, targets]) =>
    !file.startsWith('core/') || file.startsWith('core/workflow/') ? [] : targets.filter((t) => t.startsWith('core/workflow/')).map((t) => `${file} imports ${t}`),
  );
}

/** The zone of a module of renderer/: the page entry, a folder, or the shared modules at its root. */
type RendererZone = 'entry' | 'root' | 'panels' | 'actions' | 'plot';

/**
 * What each zone of renderer/ may import besides core/ and itself: panels draw the state and call the
 * actions they are handed (types only), actions change the state and ask the plot to draw (types only
 * of the plot's class), the plot draws; the root holds what all share (state, store, worker, bridge).
 * Only the page entry wires them together.
 */
const RENDERER_TABLE: Record<RendererZone, { values: readonly RendererZone[]; types: readonly RendererZone[] }> = {
  entry: { values: ['root', 'panels', 'actions', 'plot'], types: [] },
  root: { values: [], types: [] },
  panels: { values: ['root'], types: ['actions'] },
  actions: { values: ['root'], types: ['plot'] },
  plot: { values: ['root'], types: [] },
};

function rendererZone(file: string): RendererZone | null {
  const parts = file.split('/');
  if (parts[0] !== 'renderer') return null;
  if (parts.length === 2) return parts[1] === 'main.ts' ? 'entry' : 'root';
  return parts[1] === 'panels' || parts[1] === 'actions' || parts[1] === 'plot' ? parts[1] : null;
}

/** Offences against the renderer table; `valueImports` gives the modules a file loads at run time. */
function rendererTableOffences(graph: Map<string, string[]>, valueImports: (file: string) => string[]): string[] {
  const offences: string[] = [];
  for (const [file, targets] of graph) {
    const zone = rendererZone(file);
    if (!file.startsWith('renderer/')) continue;
    if (zone === null) {
      offences.push(`${file} lies in no zone of the table`);
      continue;
    }
    const loaded = new Set(valueImports(file));
    for (const target of targets) {
      const to = rendererZone(target);
      if (!target.startsWith('renderer/') || to === zone) continue;
      const allowed = RENDERER_TABLE[zone];
      const ok = to !== null && (allowed.values.includes(to) || (!loaded.has(target) && allowed.types.includes(to)));
      if (!ok) offences.push(`${file} (${zone}) ${loaded.has(target) ? 'imports' : 'imports types of'} ${target} (${to ?? 'no zone'})`);
    }
  }
  return offences;
}

/** The worker's entry modules: they and every renderer module they reach run without a DOM. */
const WORKER_ENTRIES = ['renderer/worker.ts', 'renderer/workerProtocol.ts'];
const DOM_USE = /(?<![.\w])(document|window)\s*\.|\bHTML\w*Element\b|\b(localStorage|sessionStorage|requestAnimationFrame)\b/;

function usesDom(file: string): boolean {
  const code = readFileSync(path.join(ROOT, file), 'utf8').replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
  return DOM_USE.test(code);
}

/** Renderer modules reached from the worker entries that use the DOM, each with the chain that reaches it. */
function workerDomOffences(graph: Map<string, string[]>, domUser: (file: string) => boolean): string[] {
  const via = new Map<string, string[]>(WORKER_ENTRIES.map((entry) => [entry, [entry]]));
  const queue = [...WORKER_ENTRIES];
  while (queue.length > 0) {
    const file = queue.shift()!;
    for (const target of graph.get(file) ?? []) {
      if (!target.startsWith('renderer/') || via.has(target)) continue;
      via.set(target, [...via.get(file)!, target]);
      queue.push(target);
    }
  }
  return [...via].filter(([file]) => domUser(file)).map(([, chain]) => chain.join(' -> '));
}

/** Every import circle: for each group of modules that import each other, shortest circles until each member is on one. */
function importCircles(graph: Map<string, string[]>): string[] {
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const groups: string[][] = [];
  let counter = 0;
  const visit = (node: string): void => {
    index.set(node, counter);
    low.set(node, counter++);
    stack.push(node);
    onStack.add(node);
    for (const next of graph.get(node) ?? []) {
      if (!graph.has(next)) continue;
      if (!index.has(next)) {
        visit(next);
        low.set(node, Math.min(low.get(node)!, low.get(next)!));
      } else if (onStack.has(next)) {
        low.set(node, Math.min(low.get(node)!, index.get(next)!));
      }
    }
    if (low.get(node) === index.get(node)) {
      const group: string[] = [];
      let member: string;
      do {
        member = stack.pop()!;
        onStack.delete(member);
        group.push(member);
      } while (member !== node);
      if (group.length > 1 || (graph.get(node) ?? []).includes(node)) groups.push(group.sort());
    }
  };
  for (const node of [...graph.keys()].sort()) if (!index.has(node)) visit(node);
  return groups.flatMap((group) => circlesCovering(graph, group)).sort();
}

/** Shortest circles inside `group`, each from its first member not yet on an earlier one, as chains of paths. */
function circlesCovering(graph: Map<string, string[]>, group: string[]): string[] {
  const members = new Set(group);
  const covered = new Set<string>();
  const circles: string[] = [];
  for (const start of group) {
    if (covered.has(start)) continue;
    const circle = shortestCircle(graph, members, start);
    circle.forEach((member) => covered.add(member));
    circles.push(circle.join(' -> '));
  }
  return circles;
}

/** The shortest circle inside `group` through `start`, breadth-first, as [start, ..., start]. */
function shortestCircle(graph: Map<string, string[]>, group: Set<string>, start: string): string[] {
  const previous = new Map<string, string>();
  const queue = [start];
  while (queue.length > 0) {
    const node = queue.shift()!;
    for (const next of graph.get(node) ?? []) {
      if (!group.has(next)) continue;
      if (next === start) {
        const chain = [node];
        while (chain[0] !== start) chain.unshift(previous.get(chain[0])!);
        return [...chain, start];
      }
      if (!previous.has(next)) {
        previous.set(next, node);
        queue.push(next);
      }
    }
  }
  return [start];
}

/** Our modules in `folders` and what each imports of ours. */
function importGraph(folders: string[]): Map<string, string[]> {
  const graph = new Map<string, string[]>();
  for (const folder of folders) for (const file of sources(path.join(ROOT, folder))) graph.set(rel(file), [...new Set(localImports(file))]);
  return graph;
}

const GRAPH = importGraph(['core', 'main', 'renderer', 'bench']);

describe('layer boundaries', () => {
  for (const rule of RULES) {
    it(`${rule.layer}/ imports only what its layer may`, () => {
      const offences: string[] = [];
      for (const file of sources(path.join(ROOT, rule.layer))) {
        for (const spec of importsOf(file)) {
          const where = path.relative(ROOT, file);
          if (spec.startsWith('.')) {
            const target = path.relative(ROOT, path.resolve(path.dirname(file), spec)).split(path.sep)[0];
            if (!rule.folders.includes(target)) offences.push(`${where} imports ${spec} (${target}/)`);
          } else if (!rule.packages.test(spec)) {
            offences.push(`${where} imports package ${spec}`);
          }
        }
      }
      expect(offences).toEqual([]);
    });
  }

  it('only main/ touches electron', () => {
    const users = ['core', 'renderer'].flatMap((layer) => sources(path.join(ROOT, layer))).filter((f) => importsOf(f).includes('electron'));
    expect(users).toEqual([]);
  });

  it('core/ reaches for no host globals (process, console)', () => {
    const offences = sources(path.join(ROOT, 'core')).flatMap((file) => {
      const code = readFileSync(file, 'utf8').replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
      return [...code.matchAll(/(?<![.\w])(process|console)\s*\./g)].map((m) => `${path.relative(ROOT, file)}: ${m[1]}`);
    });
    expect(offences).toEqual([]);
  });

  it('the rule itself catches a forbidden import', () => {
    const probe = { layer: 'core', packages: RULES[0].packages, folders: RULES[0].folders };
    expect(probe.packages.test('node:fs')).toBe(false);
    expect(probe.packages.test('electron')).toBe(false);
  });
});

describe('the layers inside main/', () => {
  it('each folder of main/ imports only the folders its row of the table allows', () => {
    expect(mainTableOffences(MAIN_TABLE, GRAPH)).toEqual([]);
  });

  it('nothing outside main/cli imports it (the launcher runs the built dist/cli.cjs)', () => {
    expect(cliImportOffences(GRAPH)).toEqual([]);
  });

  it('the table keeps the faces apart and the lower layers below them', () => {
    for (const face of ['cli', 'server', 'electron'] as const) {
      for (const lower of ['io', 'app', 'api', 'web'] as const) expect(MAIN_TABLE[lower]).not.toContain(face);
    }
    expect(MAIN_TABLE.server).not.toContain('electron');
    expect(MAIN_TABLE.electron).not.toContain('server');
  });

  it('the rules catch a forbidden import (probes)', () => {
    const probe = new Map<string, string[]>([
      ['main/server/apiRoute.ts', ['main/electron/channels.ts']],
      ['main/electron/main.ts', ['main/server/benchServer.ts']],
      ['main/io/benchLog.ts', ['main/app/reportFile.ts']],
      ['main/api/logCalls.ts', ['main/cli/commands/fit.ts']],
      ['main/web/staticFiles.ts', ['main/io/fileError.ts']],
      ['main/stray.ts', []],
    ]);
    expect(mainTableOffences(MAIN_TABLE, probe)).toEqual([
      'main/server/apiRoute.ts (server) imports main/electron/channels.ts (electron)',
      'main/electron/main.ts (electron) imports main/server/benchServer.ts (server)',
      'main/io/benchLog.ts (io) imports main/app/reportFile.ts (app)',
      'main/api/logCalls.ts (api) imports main/cli/commands/fit.ts (cli)',
      'main/web/staticFiles.ts (web) imports main/io/fileError.ts (io)',
      'main/stray.ts lies in no zone of the table',
    ]);
    expect(cliImportOffences(new Map([['main/app/reportFile.ts', ['main/cli/options.ts']], ['main/cli/program.ts', ['main/cli/commands/fit.ts']]]))).toEqual([
      'main/app/reportFile.ts imports main/cli/options.ts',
    ]);
  });
});

describe('the layers inside core/ and renderer/', () => {
  it('nothing in core/ imports core/workflow except core/workflow itself', () => {
    expect(workflowImportOffences(GRAPH)).toEqual([]);
  });

  it('the fit worker reaches no renderer module that uses the DOM', () => {
    expect(workerDomOffences(GRAPH, usesDom)).toEqual([]);
  });

  it('each zone of renderer/ imports only what its row of the table allows', () => {
    expect(rendererTableOffences(GRAPH, runtimeImports)).toEqual([]);
  });

  it('the renderer table catches a forbidden import, and a type import where only types may go (probe)', () => {
    const probe = new Map([
      ['renderer/panels/a.ts', ['renderer/actions/index.ts', 'renderer/dom.ts']],
      ['renderer/actions/b.ts', ['renderer/panels/a.ts', 'renderer/plot/fitPlot.ts']],
      ['renderer/store.ts', ['renderer/actions/index.ts']],
    ]);
    const values: Record<string, string[]> = { 'renderer/panels/a.ts': ['renderer/actions/index.ts'], 'renderer/actions/b.ts': ['renderer/panels/a.ts'] };
    expect(rendererTableOffences(probe, (file) => values[file] ?? [])).toEqual([
      'renderer/panels/a.ts (panels) imports renderer/actions/index.ts (actions)',
      'renderer/actions/b.ts (actions) imports renderer/panels/a.ts (panels)',
      'renderer/store.ts (root) imports types of renderer/actions/index.ts (actions)',
    ]);
  });

  it('the core and worker rules catch a forbidden import (probes)', () => {
    expect(workflowImportOffences(new Map([['core/fit/fitSet.ts', ['core/workflow/userValues.ts']], ['core/workflow/a.ts', ['core/workflow/b.ts']]]))).toEqual([
      'core/fit/fitSet.ts imports core/workflow/userValues.ts',
    ]);
    const probe = new Map([
      ['renderer/worker.ts', ['renderer/workerProtocol.ts', 'core/fit/fitResponse.ts']],
      ['renderer/workerProtocol.ts', ['renderer/dom.ts']],
      ['renderer/dom.ts', []],
    ]);
    expect(workerDomOffences(probe, (file) => file === 'renderer/dom.ts')).toEqual(['renderer/workerProtocol.ts -> renderer/dom.ts']);
    expect(usesDom('renderer/dom.ts')).toBe(true);
  });
});

describe('import circles', () => {
  it('core/, main/ and renderer/ import in no circle (types and re-exports count)', () => {
    const circles = importCircles(new Map([...GRAPH].filter(([file]) => !file.startsWith('bench/'))));
    expect(circles, `import circles:\n${circles.join('\n')}`).toEqual([]);
  });

  it('the circle finder catches a circle and prints it as a chain (probe)', () => {
    const probe = new Map([
      ['a.ts', ['b.ts']],
      ['b.ts', ['c.ts', 'd.ts']],
      ['c.ts', ['a.ts']],
      ['d.ts', []],
      ['e.ts', ['e.ts']],
      ['f.ts', ['g.ts']],
      ['g.ts', ['f.ts', 'h.ts']],
      ['h.ts', ['g.ts']],
    ]);
    expect(importCircles(probe)).toEqual(['a.ts -> b.ts -> c.ts -> a.ts', 'e.ts -> e.ts', 'f.ts -> g.ts -> f.ts', 'h.ts -> g.ts -> h.ts']);
  });
});

/** Our modules each file loads at run time: value imports only (`import type` and `export type` are erased). */
function runtimeImports(file: string): string[] {
  const text = readFileSync(path.join(ROOT, file), 'utf8');
  const pattern = /(?:^|\n)\s*(?:import|export)\s(?!type\s)[^'"]*?from\s*['"](\.[^'"]+)['"]|(?:^|\n)\s*import\s*['"](\.[^'"]+)['"]|import\(\s*['"](\.[^'"]+)['"]\s*\)/g;
  return [...text.matchAll(pattern)]
    .map((m) => rel(resolveImport(path.join(ROOT, file), m[1] ?? m[2] ?? m[3]) as string))
    .filter((target) => existsSync(path.join(ROOT, target)));
}

/** Every module `entry` loads at run time, itself included. */
function loadedBy(entry: string, imports: (file: string) => string[]): Set<string> {
  const seen = new Set<string>();
  const stack = [entry];
  while (stack.length) {
    const file = stack.pop() as string;
    if (seen.has(file)) continue;
    seen.add(file);
    stack.push(...imports(file));
  }
  return seen;
}

describe('start-up weight of the shells', () => {
  // The window fits in its worker; the Electron main process and the bench server only read and write
  // files, so loading the fitting code there would only slow their start.
  for (const entry of ['main/electron/main.ts', 'main/server/serveBench.ts']) {
    it(`${entry} loads no fitting code`, () => {
      const fitting = [...loadedBy(entry, runtimeImports)].filter((file) => file.startsWith('core/fit/'));
      expect(fitting).toEqual([]);
    });
  }

  it('the walk follows value imports and skips type imports (probe)', () => {
    const probe = new Map([
      ['a.ts', ['b.ts']],
      ['b.ts', ['c.ts']],
      ['c.ts', []],
    ]);
    expect([...loadedBy('a.ts', (file) => probe.get(file) ?? [])].sort()).toEqual(['a.ts', 'b.ts', 'c.ts']);
    // preload.ts: `import type { ApiMethod } from '../api/apiMethods'` beside value imports of channels.ts.
    const preload = runtimeImports('main/electron/preload.ts');
    expect(preload).toContain('main/electron/channels.ts');
    expect(preload).not.toContain('main/api/apiMethods.ts');
  });
});
