/**
 * What a published package carries, checked from the sources: the metadata every package.json
 * states (one repository URL, defined in the root package.json, reused everywhere), the files it
 * ships, its engines floor, its README (install line, runnable example with its output, a guide
 * link that works on the registry's page, the safety caution), the LICENSE and the CHANGELOG kept
 * by changesets. The packed tarballs themselves are checked by test/consumer/consumer.test.ts.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  CONVERSION_PATH_BUDGET_GZIP_BYTES,
  CONVERSION_PATH_TARGET_GZIP_BYTES,
} from './consumer/support/bundle.js';
import { readmeExample } from './consumer/support/readmeExamples.js';

const root = fileURLToPath(new URL('..', import.meta.url));
const read = (path: string): string => readFileSync(join(root, path), 'utf8');
const packages = readdirSync(join(root, 'packages')).filter((p) =>
  existsSync(join(root, 'packages', p, 'package.json')),
);

interface Manifest {
  name: string;
  version: string;
  description?: string;
  keywords?: string[];
  homepage?: string;
  bugs?: { url?: string };
  repository?: { type?: string; url?: string; directory?: string };
  license?: string;
  engines?: Record<string, string>;
  bin?: Record<string, string>;
  exports?: Record<string, unknown>;
  files?: string[];
  publishConfig?: Record<string, unknown>;
  dependencies?: Record<string, string>;
  private?: boolean;
}
const manifest = (p: string): Manifest => JSON.parse(read(`packages/${p}/package.json`)) as Manifest;
const rootManifest = JSON.parse(read('package.json')) as Manifest;

/** The repository's web address, from the root package.json (`git+https://…/x.git` → `https://…/x`). */
const repoUrl = (rootManifest.repository?.url ?? '').replace(/^git\+/, '').replace(/\.git$/, '');

/** The catalog of pnpm-workspace.yaml (name → specifier); one `name: spec` per line. */
function catalog(): Record<string, string> {
  const text = read('pnpm-workspace.yaml');
  const block = /^catalog:\n((?:[ ]{2}.*\n)+)/m.exec(text)?.[1] ?? '';
  return Object.fromEntries(
    block
      .trimEnd()
      .split('\n')
      .map((line) => {
        const m = /^\s+'?([^':]+)'?:\s*(\S+)$/.exec(line);
        return [m?.[1] ?? line, m?.[2] ?? ''];
      }),
  );
}

describe('the repository', () => {
  it('defines its web address once, in the root package.json', () => {
    expect(repoUrl).toMatch(/^https:\/\/[^/]+\/[^/]+\/[^/]+$/);
    expect(rootManifest.homepage).toBe(`${repoUrl}#readme`);
    expect(rootManifest.bugs?.url).toBe(`${repoUrl}/issues`);
  });

  it('has an MIT LICENSE, the licence every package declares', () => {
    const license = read('LICENSE');
    expect(license).toMatch(/^MIT License\n\nCopyright \(c\) \d{4} /);
    expect(license).toContain('THE SOFTWARE IS PROVIDED "AS IS", WITHOUT WARRANTY OF ANY KIND');
    expect(rootManifest.license).toBe('MIT');
  });

  it('has an .editorconfig that agrees with prettier', () => {
    const editorconfig = read('.editorconfig');
    const prettier = JSON.parse(read('.prettierrc.json')) as { printWidth: number };
    expect(editorconfig).toMatch(/^root = true$/m);
    expect(editorconfig).toMatch(/^indent_style = space$/m);
    expect(editorconfig).toMatch(/^end_of_line = lf$/m);
    expect(editorconfig).toContain(`max_line_length = ${prettier.printWidth}`);
  });

  it('keeps a valid changesets configuration, and every pending changeset names real packages', () => {
    const config = JSON.parse(read('.changeset/config.json')) as Record<string, unknown>;
    expect(config['baseBranch']).toBe('main');
    expect(config['access']).toBe('public');
    const names = new Set(packages.map((p) => manifest(p).name));
    const pending = readdirSync(join(root, '.changeset')).filter(
      (f) => f.endsWith('.md') && f !== 'README.md',
    );
    for (const file of pending) {
      const front = /^---\n([\s\S]*?)\n---\n+\S/.exec(read(`.changeset/${file}`));
      expect(front, `.changeset/${file}: front matter then a summary`).not.toBeNull();
      for (const line of front![1]!.split('\n')) {
        const m = /^['"]?([^'":]+)['"]?:\s*(patch|minor|major)$/.exec(line.trim());
        expect(m, `.changeset/${file}: "${line}"`).not.toBeNull();
        expect(names, `.changeset/${file}`).toContain(m![1]);
      }
    }
  });

  it('states the browser budget of the conversion path in docs/performance.md as the consumer test checks it', () => {
    const performance = read('docs/performance.md');
    expect(performance).toContain(`**${CONVERSION_PATH_BUDGET_GZIP_BYTES / 1000} kB gzipped**`);
    expect(performance).toContain(`**${CONVERSION_PATH_TARGET_GZIP_BYTES / 1000} kB gzipped**`);
    // The conversion-path rows of both tables are within it.
    const rows = [
      ...performance.matchAll(
        /^\|\s*`?createChannel`? \+ `?convert`?[^|]*\|[^|]*\|\s*([\d.]+)(?: kB)?\s*\|/gm,
      ),
    ];
    expect(rows).toHaveLength(2);
    for (const m of rows)
      expect(Number(m[1]) * 1000, m[0]).toBeLessThanOrEqual(CONVERSION_PATH_BUDGET_GZIP_BYTES);
  });

  it('pins development tools exactly, and gives runtime dependencies caret ranges from the tested version', () => {
    const runtime = new Set(
      packages.flatMap((p) =>
        Object.keys(manifest(p).dependencies ?? {}).filter((d) => !d.startsWith('@bridgework/')),
      ),
    );
    for (const [name, spec] of Object.entries(catalog())) {
      if (runtime.has(name)) expect(spec, name).toMatch(/^\^\d+\.\d+\.\d+$/);
      // An exact version; a pre-release tag is part of it (@duckdb/node-api 1.5.6-r.1).
      else expect(spec, name).toMatch(/^\d+\.\d+\.\d+(-[0-9A-Za-z.]+)?$/);
    }
  });
});

describe.each(packages)('package %s', (p) => {
  const j = manifest(p);
  const dir = `packages/${p}`;

  it('states where it comes from: repository with directory, homepage, bugs, keywords, licence', () => {
    expect(j.description?.length ?? 0).toBeGreaterThan(20);
    expect(j.keywords?.length ?? 0).toBeGreaterThanOrEqual(3);
    expect(j.repository).toEqual({ type: 'git', url: rootManifest.repository?.url, directory: dir });
    expect(j.homepage).toBe(`${repoUrl}/tree/main/${dir}#readme`);
    expect(j.bugs).toEqual({ url: `${repoUrl}/issues` });
    expect(j.license).toBe('MIT');
    expect(j.private).toBeUndefined();
  });

  it('states the Node floor where require() of ESM works (20.19, 22.12)', () => {
    expect(j.engines).toEqual({ node: '^20.19.0 || >=22.12.0' });
    expect(rootManifest.engines).toEqual(j.engines);
  });

  it('ships dist without the build-info file, sources without tests, and its CHANGELOG', () => {
    const files = j.files ?? [];
    expect(files).toContain('dist');
    expect(files).toContain('!dist/.tsbuildinfo');
    expect(files).toContain('CHANGELOG.md');
    expect(files.filter((f) => /test|spec|bench|fixture/.test(f) && !f.startsWith('!'))).toEqual([]);
    if (files.includes('src')) expect(files).toContain('!src/**/*.test.ts');
    // The build info stays inside dist (a deleted dist is then rebuilt by tsc -b).
    const tsconfig = JSON.parse(read(`${dir}/tsconfig.json`)) as { compilerOptions: Record<string, string> };
    expect(tsconfig.compilerOptions['tsBuildInfoFile']).toBe('dist/.tsbuildinfo');
  });

  it('exports ./package.json, and declares bin paths as npm writes them', () => {
    expect(j.exports?.['./package.json']).toBe('./package.json');
    for (const path of Object.values(j.bin ?? {})) expect(path).toMatch(/^dist\/[\w/.-]+\.js$/);
    if (j.name.startsWith('@')) expect(j.publishConfig).toEqual({ access: 'public' });
  });

  it('depends on sibling packages by caret range and on third-party packages through the catalog', () => {
    for (const [name, spec] of Object.entries(j.dependencies ?? {})) {
      expect(spec, name).toBe(name.startsWith('@bridgework/') ? 'workspace:^' : 'catalog:');
    }
  });

  it('keeps a CHANGELOG whose newest entry is the package version', () => {
    const changelog = read(`${dir}/CHANGELOG.md`);
    expect(changelog.split('\n')[0]).toBe(`# ${j.name}`);
    expect(/^## (\S+)$/m.exec(changelog)?.[1]).toBe(j.version);
  });

  describe('README', () => {
    const readme = read(`${dir}/README.md`);

    it('says what it is for, how to install it, and shows a runnable example with its output', () => {
      expect(readme.split('\n')[0]).toBe(p === 'cli' ? '# bridgework (command-line tool)' : `# ${j.name}`);
      expect(readme).toMatch(new RegExp(`^npm install (--global )?${j.name.replace('/', '\\/')}$`, 'm'));
      const example = readmeExample(readme);
      expect(example.output.length).toBeGreaterThan(0);
      if (p === 'cli') expect(example.commands.length).toBeGreaterThan(0);
      else expect(example.code).toMatch(new RegExp(`from '${j.name}'`));
    });

    it('links only by absolute URL, and its links into the repository name files that exist', () => {
      const links = [...readme.matchAll(/\]\(([^)]+)\)/g)].map((m) => m[1]!);
      expect(links.length).toBeGreaterThan(0);
      for (const link of links) {
        expect(link, 'a relative link breaks on the registry page').toMatch(/^https:\/\//);
        if (!link.startsWith(repoUrl)) continue;
        const path = /^\/(?:blob|tree)\/main\/([^#]*)/.exec(link.slice(repoUrl.length))?.[1];
        if (path !== undefined) expect(existsSync(join(root, path)), link).toBe(true);
        else expect(link).toMatch(new RegExp(`^${repoUrl}#readme$`));
      }
      expect(links.some((l) => l.startsWith(`${repoUrl}/blob/main/docs/`))).toBe(true);
    });

    it('carries the safety caution', () => {
      expect(readme).toMatch(/support, and do not replace,\s+qualified\s+engineering\s+judgement/);
      expect(readme).toMatch(/legal-metrology/);
    });
  });
});
