/**
 * `bridgework --help` must start fast, so the executable's static import graph may reach only the
 * parser, the option tables and core: no command body, and none of the channel package (and the
 * packages below it), yaml or playwright.
 * (The start-up time itself is measured by test/bench/cli.bench.ts.)
 */
import { readFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { commands } from '../src/commands/registry.js';

const src = fileURLToPath(new URL('../src/', import.meta.url));

/** Static (non-type) imports and re-exports of a module. */
function staticImports(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const specs: string[] = [];
  const re = /^\s*(?:import|export)\s+(?!type\b)(?:[^'";]*?\sfrom\s+)?['"]([^'"]+)['"]/gm;
  for (const m of text.matchAll(re)) specs.push(m[1] as string);
  return specs;
}

function closure(entry: string): { files: Set<string>; packages: Set<string> } {
  const files = new Set<string>();
  const packages = new Set<string>();
  const visit = (file: string): void => {
    if (files.has(file)) return;
    files.add(file);
    for (const s of staticImports(file)) {
      if (s.startsWith('.')) visit(join(dirname(file), s.replace(/\.js$/, '.ts')));
      else packages.add(s);
    }
  };
  visit(entry);
  return { files, packages };
}

describe('start-up path', () => {
  const { files, packages } = closure(join(src, 'bin.ts'));

  it('imports only node built-ins and @bridgework/core statically', () => {
    for (const p of packages) expect(p.startsWith('node:') || p === '@bridgework/core', p).toBe(true);
  });

  it('loads no command body, no data, unit, channel-file, channel, report, uncertainty or HTML module', () => {
    const loaded = [...files].map((f) => relative(src, f));
    expect(loaded).toContain('commands/registry.ts');
    for (const f of loaded) {
      // data/formatLists.ts holds only the lists of formats (no imports): the convert table uses it.
      if (f === 'data/formatLists.ts') {
        expect(staticImports(join(src, f))).toEqual([]);
        continue;
      }
      expect(f, f).not.toMatch(/^(data|units|channelFile|channels|html|report|uncertainty|files)\//);
      expect(f, f).not.toMatch(/\/run[A-Z]\w*\.ts$/);
    }
  });

  it('the import scanner sees what it should (modules known to import yaml, the channel and firmware packages)', () => {
    expect(closure(join(src, 'channelFile/parseChannelDocument.ts')).packages).toContain('yaml');
    expect(closure(join(src, 'commands/report/runReport.ts')).packages).toContain('@bridgework/channel');
    expect(closure(join(src, 'commands/constants/runConstants.ts')).packages).toContain(
      '@bridgework/firmware',
    );
    expect(closure(join(src, 'commands/uncertainty/runUncertainty.ts')).packages).toContain(
      '@bridgework/channel',
    );
  });

  it('reads a JSON channel file without the yaml package: convert loads yaml only for a YAML file', () => {
    expect(closure(join(src, 'channelFile/jsonChannelDocument.ts')).packages).not.toContain('yaml');
    expect(closure(join(src, 'commands/convert/runConvert.ts')).packages).not.toContain('yaml');
    expect(closure(join(src, 'channelFile/parseChannelDocument.ts')).packages).toContain('yaml');
  });

  it.each(commands.map((c) => [c.name, c] as const))(
    '%s: load() imports a body with run()',
    async (_n, c) => {
      const body = await c.load();
      expect(typeof body.run).toBe('function');
    },
  );
});
