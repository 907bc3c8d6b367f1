/**
 * The file-level import graph of a package's sources, for the repository's cycle check: every
 * relative `import`, `import type`, `export … from` and dynamic `import()` of each `.ts` file.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';

/** Every `.ts` file under a folder, as absolute paths. */
export function typeScriptFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? typeScriptFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [],
  );
}

// `from '…'` of import/export declarations (type-only included) and `import('…')` expressions.
const SPECIFIER = /(?:\bfrom\s*|\bimport\s*\(\s*|^\s*import\s+)['"]([^'"]+)['"]/gm;

/** The relative specifiers a source text imports or re-exports. */
export function relativeImports(text: string): string[] {
  // Comments may quote imports (TSDoc examples): drop them first.
  const code = text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
  return [...code.matchAll(SPECIFIER)].map((m) => m[1] as string).filter((s) => s.startsWith('.'));
}

/** Resolves a relative specifier (`./x.js`, `./dir`) to the `.ts` file it names. */
export function resolveSpecifier(fromFile: string, specifier: string): string | undefined {
  const base = resolve(dirname(fromFile), specifier);
  for (const candidate of [base.replace(/\.js$/, '.ts'), `${base}.ts`, join(base, 'index.ts')]) {
    if (existsSync(candidate)) return candidate;
  }
  return undefined;
}

/** The graph: each file (relative to `root`) with the files it imports. */
export function importGraph(root: string): Map<string, string[]> {
  const graph = new Map<string, string[]>();
  for (const file of typeScriptFiles(root)) {
    const targets = relativeImports(readFileSync(file, 'utf8'))
      .map((s) => resolveSpecifier(file, s))
      .filter((t): t is string => t !== undefined)
      .map((t) => relative(root, t));
    graph.set(relative(root, file), [...new Set(targets)]);
  }
  return graph;
}

/**
 * The cycles of a graph: its strongly connected components of more than one file (or a file that
 * imports itself), each sorted, by Tarjan's algorithm.
 */
export function cyclesOf(graph: Map<string, string[]>): string[][] {
  let counter = 0;
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const out: string[][] = [];
  function visit(v: string): void {
    index.set(v, counter);
    low.set(v, counter);
    counter++;
    stack.push(v);
    onStack.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) {
        low.set(v, Math.min(low.get(v)!, index.get(w)!));
      }
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1 || (graph.get(v) ?? []).includes(v)) out.push(component.sort());
    }
  }
  for (const v of [...graph.keys()].sort()) if (!index.has(v)) visit(v);
  return out.sort((a, b) => a.join().localeCompare(b.join()));
}
