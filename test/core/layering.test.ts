// The layers import only what the design allows: core is pure, renderer talks to main only through the bridge.
import { readdirSync, readFileSync, statSync } from 'node:fs';
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

/** Every module specifier in import/export-from statements and dynamic imports. */
function importsOf(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const found: string[] = [];
  const pattern = /(?:^|\n)\s*(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|(?:^|\n)\s*import\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const m of text.matchAll(pattern)) found.push(m[1] ?? m[2] ?? m[3]);
  return found;
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
