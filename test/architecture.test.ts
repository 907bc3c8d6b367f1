/**
 * The house checks itself (issue 13, item 9): the dependency table of DEVELOPERS.md matches every
 * package.json and the imports of every package's sources, and no package has a file-level import
 * cycle in its `src/`.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { cyclesOf, importGraph, relativeImports, typeScriptFiles } from './support/importGraph.js';

const root = fileURLToPath(new URL('..', import.meta.url));
const read = (path: string): string => readFileSync(join(root, path), 'utf8');
const packages = readdirSync(join(root, 'packages')).filter((p) =>
  existsSync(join(root, 'packages', p, 'package.json')),
);
/** npm name → folder name (`@bridgework/bridge` → `bridge`, `bridgework` → `cli`). */
const folderOf = new Map(
  packages.map((p) => [(JSON.parse(read(`packages/${p}/package.json`)) as { name: string }).name, p]),
);

/** The dependency table of DEVELOPERS.md: folder → the workspace packages it depends on. */
function documentedDependencies(): Map<string, string[]> {
  const text = read('DEVELOPERS.md');
  const block = /<!-- package-dependencies:start[^>]*-->([\s\S]*?)<!-- package-dependencies:end -->/.exec(
    text,
  );
  if (block === null) throw new Error('DEVELOPERS.md has no package-dependencies block');
  const rows = block[1]!
    .split('\n')
    .filter((line) => /^\|\s*[a-z]+\s*\|/.test(line) && !/^\|\s*package\s*\|/.test(line));
  return new Map(
    rows.map((line) => {
      const [name, deps] = line
        .split('|')
        .slice(1, 3)
        .map((c) => c.trim()) as [string, string];
      return [name, deps === '—' ? [] : deps.split(',').map((d) => d.trim())];
    }),
  );
}

/** The workspace packages a package's sources import (from any file under src/). */
function importedPackages(p: string): string[] {
  const found = new Set<string>();
  for (const file of typeScriptFiles(join(root, 'packages', p, 'src'))) {
    const text = readFileSync(file, 'utf8').replace(/\/\*[\s\S]*?\*\//g, '');
    for (const m of text.matchAll(
      /(?:\bfrom\s*|\bimport\s*\(\s*)['"](@bridgework\/[a-z-]+|bridgework)(?:\/[^'"]*)?['"]/g,
    )) {
      const folder = folderOf.get(m[1]!);
      if (folder !== undefined && folder !== p) found.add(folder);
    }
  }
  return [...found].sort();
}

function declaredPackages(p: string): string[] {
  const json = JSON.parse(read(`packages/${p}/package.json`)) as { dependencies?: Record<string, string> };
  return Object.keys(json.dependencies ?? {})
    .map((d) => folderOf.get(d))
    .filter((d): d is string => d !== undefined)
    .sort();
}

describe('the dependency table of DEVELOPERS.md', () => {
  const table = documentedDependencies();

  it('lists every package once, each depending only on packages listed above it', () => {
    expect([...table.keys()].sort()).toEqual([...packages].sort());
    const order = [...table.keys()];
    for (const [p, deps] of table) {
      for (const d of deps) {
        expect(order.indexOf(d), `${p} → ${d} points up the table`).toBeLessThan(order.indexOf(p));
      }
    }
  });

  it.each(packages)("matches %s's package.json dependencies", (p) => {
    expect(declaredPackages(p)).toEqual([...(table.get(p) ?? [])].sort());
  });

  it.each(packages)('matches the packages that %s/src imports', (p) => {
    expect(importedPackages(p)).toEqual([...(table.get(p) ?? [])].sort());
  });

  it('knows the arrows a reader looks for: chain → bridge, compensation → bridge', () => {
    expect(table.get('chain')).toContain('bridge');
    expect(table.get('compensation')).toContain('bridge');
    expect(table.get('bridge')).toEqual(['core']);
  });
});

/**
 * Cycles allowed meanwhile, per package (none today). An entry must be removed when its cycle is
 * gone (the test fails until it is).
 */
const knownCycles: Readonly<Record<string, readonly (readonly string[])[]>> = {};

describe('file-level import cycles inside each package', () => {
  it('the cycle finder finds a two-file cycle, a self-import and type-only edges', () => {
    const graph = new Map([
      ['a.ts', ['b.ts']],
      ['b.ts', ['a.ts', 'c.ts']],
      ['c.ts', []],
      ['d.ts', ['d.ts']],
    ]);
    expect(cyclesOf(graph)).toEqual([['a.ts', 'b.ts'], ['d.ts']]);
  });

  it('reads every kind of relative import edge, and none quoted in a comment', () => {
    const text = [
      "import { a } from './a.js';",
      "import type { B } from '../b.js';",
      "export { c } from './c.js';",
      "export type { D } from './d.js';",
      "import './side-effect.js';",
      "const e = await import('./e.js');",
      "import { f } from '@bridgework/core';",
      '/** import { g } from "./g.js" */',
      "// import { h } from './h.js';",
    ].join('\n');
    expect(relativeImports(text)).toEqual([
      './a.js',
      '../b.js',
      './c.js',
      './d.js',
      './side-effect.js',
      './e.js',
    ]);
  });

  it.each(packages)('%s/src has no import cycle other than the known ones', (p) => {
    const cycles = cyclesOf(importGraph(join(root, 'packages', p, 'src')));
    const known = (knownCycles[p] ?? []).map((c) => [...c].sort());
    expect(cycles, `${p}: a cycle appeared, or a known one is gone (remove it from knownCycles)`).toEqual(
      known,
    );
  });
});

/** The files a package entry reaches through relative imports (static and dynamic), itself included. */
function reachable(graph: Map<string, string[]>, entry: string): Set<string> {
  const seen = new Set<string>();
  const queue = [entry];
  while (queue.length > 0) {
    const file = queue.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    queue.push(...(graph.get(file) ?? []));
  }
  return seen;
}

describe('subpath exports (issue 19 item 4: opt-in code stays off the default bundle)', () => {
  type ExportTarget = { '@bridgework/source'?: string; types?: string; default?: string } | string;
  const channelExports = (
    JSON.parse(read('packages/channel/package.json')) as { exports: Record<string, ExportTarget> }
  ).exports;

  it.each(packages)('%s: every subpath of `exports` names a source entry, its types and its build', (p) => {
    const json = JSON.parse(read(`packages/${p}/package.json`)) as { exports?: Record<string, ExportTarget> };
    for (const [subpath, target] of Object.entries(json.exports ?? {})) {
      if (typeof target === 'string') {
        expect(subpath, `${p}: a plain-string export is only ./package.json`).toBe('./package.json');
        continue;
      }
      const source = target['@bridgework/source'];
      expect(source, `${p} ${subpath}`).toMatch(/^\.\/src\/[\w/]+\.ts$/);
      expect(existsSync(join(root, 'packages', p, source!)), `${p} ${subpath} → ${source}`).toBe(true);
      const built = source!.replace(/^\.\/src\//, './dist/').replace(/\.ts$/, '');
      expect([target.types, target.default]).toEqual([`${built}.d.ts`, `${built}.js`]);
    }
  });

  it('@bridgework/channel/rtd-polynomial: the main entry never reaches the polynomial modules', () => {
    expect(channelExports['./rtd-polynomial']).toMatchObject({
      '@bridgework/source': './src/rtdPolynomialConverter.ts',
    });
    const graph = importGraph(join(root, 'packages', 'channel', 'src'));
    const fromMain = reachable(graph, 'index.ts');
    const fromSubpath = reachable(graph, 'rtdPolynomialConverter.ts');
    // Not vacuous: the subpath reaches the polynomial and the channel's internals it converts with.
    expect(fromSubpath).toContain(join('convert', 'rtdPolynomial.ts'));
    expect(fromSubpath).toContain(join('convert', 'curveKernels.ts'));
    expect(fromMain).toContain(join('convert', 'curveKernels.ts'));
    expect(fromMain.has(join('convert', 'rtdPolynomial.ts'))).toBe(false);
    expect(fromMain.has('rtdPolynomialConverter.ts')).toBe(false);
  });
});
