/**
 * Repository rules that a reviewer would otherwise check by hand: the README's Quick start, the
 * package layout, the dependency direction, and the generated error-code tables.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { errorTable, normalizedTable } from './support/errorTable.js';

const root = fileURLToPath(new URL('..', import.meta.url));
const read = (path: string): string => readFileSync(join(root, path), 'utf8');
const packages = readdirSync(join(root, 'packages')).filter((p) =>
  existsSync(join(root, 'packages', p, 'package.json')),
);

interface PackageJson {
  name: string;
  type?: string;
  sideEffects?: boolean;
  private?: boolean;
  packageManager?: string;
  exports?: Record<string, Record<string, string>>;
  dependencies?: Record<string, string>;
  devDependencies?: Record<string, string>;
}
const pkg = (p: string): PackageJson => JSON.parse(read(`packages/${p}/package.json`)) as PackageJson;

function sourceFiles(dir: string): string[] {
  return readdirSync(join(root, dir), { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? sourceFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [],
  );
}

describe('README', () => {
  const readme = read('README.md');
  it('has a Quick start heading followed by one code block of exactly two commands', () => {
    const m = /^## Quick start\n+```[a-z]*\n([\s\S]*?)```/m.exec(readme);
    expect(m).not.toBeNull();
    const lines = m![1]!.trimEnd().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/&& pnpm demo$/);
    expect(lines[1]).toMatch(/pnpm test$/);
    // Each line stands on its own on a fresh machine: it installs pnpm and the workspace first.
    for (const line of lines) expect(line).toMatch(/^npm install -g pnpm@12\.4\.2 && pnpm install && /);
  });

  it('states the safety caution', () => {
    expect(readme).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    expect(readme).toMatch(/legal-metrology/);
  });

  it('lists every package in its table', () => {
    for (const p of packages)
      expect(readme).toContain(p === 'cli' ? '`bridgework` (cli)' : `@bridgework/${p}`);
  });
});

describe('workspace', () => {
  const rootPkg = JSON.parse(read('package.json')) as PackageJson;

  it('pins pnpm and is a private ESM workspace', () => {
    expect(rootPkg.packageManager).toBe('pnpm@12.4.2');
    expect(rootPkg.private).toBe(true);
    expect(rootPkg.type).toBe('module');
  });

  it('CI installs on a clean Debian machine every program the tests run, and pnpm at the pinned version', () => {
    const ci = read('.ci/run');
    const apt = /^APT_PACKAGES=\(([^)]*)\)/m.exec(ci);
    expect(apt, '.ci/run: APT_PACKAGES=( … )').not.toBeNull();
    const listed = apt![1]!.split(/\s+/).filter((w) => w !== '' && !w.startsWith('#'));
    // chromium (browser tests), pdftotext (printed report), host and Arm C compilers with their C
    // libraries (firmware headers), the PostgreSQL server (SQL tests), tar (consumer test).
    for (const p of [
      'chromium',
      'poppler-utils',
      'gcc',
      'libc6-dev',
      'gcc-arm-none-eabi',
      'libnewlib-arm-none-eabi',
      'postgresql',
      'tar',
    ])
      expect(listed, `.ci/run installs ${p}`).toContain(p);
    expect(ci).toMatch(/^need_apt "\$\{APT_PACKAGES\[@\]\}"$/m); // unconditionally
    expect(ci).toContain(`PNPM_VERSION=${rootPkg.packageManager!.replace('pnpm@', '')}`);
  });

  it.each(packages)('package %s is ESM, side-effect free, exports source/types/default', (p) => {
    const j = pkg(p);
    expect(j.name).toBe(p === 'cli' ? 'bridgework' : `@bridgework/${p}`);
    expect(j.type).toBe('module');
    expect(j.sideEffects).toBe(false);
    const dot = j.exports?.['.'];
    expect(Object.keys(dot ?? {})).toEqual(['@bridgework/source', 'types', 'default']);
    expect(dot?.['@bridgework/source']).toBe('./src/index.ts');
    expect(rootPkg.devDependencies?.[j.name]).toBe('workspace:*');
    expect(existsSync(join(root, 'packages', p, 'test'))).toBe(true);
  });

  // The direction of the dependencies is checked against DEVELOPERS.md by architecture.test.ts.
  it.each(packages)('package %s references exactly its workspace dependencies in tsconfig.json', (p) => {
    const deps = Object.keys(pkg(p).dependencies ?? {}).filter((d) => d.startsWith('@bridgework/'));
    const tsconfig = JSON.parse(read(`packages/${p}/tsconfig.json`)) as { references?: { path: string }[] };
    const refs = (tsconfig.references ?? []).map((r) => r.path.replace('../', ''));
    expect(refs.sort()).toEqual(deps.map((d) => d.replace('@bridgework/', '')).sort());
  });

  it.each(packages)('package %s has a hand-written index without export *', (p) => {
    const index = read(`packages/${p}/src/index.ts`);
    expect(index).not.toMatch(/export \*/);
  });

  it.each(packages.filter((p) => p !== 'cli'))(
    'library package %s imports nothing from node: outside src/node/',
    (p) => {
      // A package may ship a Node-only subpath export from src/node/ (e.g. worker threads).
      const nodeOnly = join('packages', p, 'src', 'node') + sep;
      for (const f of sourceFiles(`packages/${p}/src`).filter((f) => !f.startsWith(nodeOnly))) {
        expect(read(f), f).not.toMatch(/from ['"]node:|require\(['"]node:/);
      }
    },
  );
});

describe('docs', () => {
  it('hold the error-code table exactly as the core package defines it', () => {
    for (const file of ['docs/errors.md', 'DEVELOPERS.md']) {
      expect(normalizedTable(read(file)), `${file}: run pnpm run docs:codes`).toEqual(
        normalizedTable(errorTable()),
      );
    }
  });

  it('draw the arm-numbering diagram as inline SVG with every arm and node', () => {
    const conventions = read('docs/conventions.md');
    const svg = /<svg[\s\S]*?<\/svg>/.exec(conventions)?.[0] ?? '';
    for (const label of ['R1', 'R2', 'R3', 'R4', 'E+', 'E−', 'S+', 'S−']) expect(svg).toContain(`>${label}<`);
  });

  it('carry the safety caution', () => {
    expect(read('docs/safety.md')).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
  });
});
