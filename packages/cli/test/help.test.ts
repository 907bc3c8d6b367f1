import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { optionDescription, optionSynopsis } from '../src/args/describeOption.js';
import { formatCommandHelp, formatProgramHelp } from '../src/args/formatHelp.js';
import { parseCommandLine } from '../src/args/parseCommandLine.js';
import { commands } from '../src/commands/registry.js';

const flat = (text: string): string => text.replace(/\s+/g, ' ');

describe('help generated from the option tables', () => {
  it('lists every command in the program help, with the exit codes and the caution', () => {
    const help = formatProgramHelp(commands);
    for (const c of commands) expect(help).toMatch(new RegExp(`^  ${c.name} +\\S`, 'm'));
    expect(help).toContain(
      'Exit codes: 0 ok; 1 bad input (usage, file, validation); 2 a design check failed.',
    );
    expect(flat(help)).toContain('Results support, and do not replace, qualified engineering judgement');
  });

  it.each(commands.map((c) => [c.name, c] as const))('%s: every table row appears in --help', (_name, c) => {
    const help = formatCommandHelp(c);
    expect(
      flat(help).startsWith(`bridgework ${c.name}: ${c.summary} Usage: bridgework ${c.name} [options]`),
    ).toBe(true);
    for (const o of c.options) {
      expect(help).toContain(optionSynopsis(o));
      // The description (with unit, range and default) appears, wrapped.
      expect(flat(help)).toContain(flat(optionDescription(o)));
    }
    for (const p of c.positionals) expect(help).toContain(`<${p.name}>`);
    expect(help).toContain('-h, --help');
  });

  it.each(commands.map((c) => [c.name, c] as const))(
    '%s: lines fit in 80 columns (examples aside)',
    (_name, c) => {
      const lines = formatCommandHelp(c).split('\n');
      const examples = lines.indexOf('Examples:');
      for (const line of examples < 0 ? lines : lines.slice(0, examples))
        expect(line.length).toBeLessThanOrEqual(80);
    },
  );

  it.each(commands.map((c) => [c.name, c] as const))(
    '%s: the parser accepts exactly the documented options',
    (_name, c) => {
      const args = c.positionals.filter((p) => p.required).map((p) => `${p.name}.txt`);
      for (const o of c.options) {
        const value =
          o.type === 'boolean'
            ? []
            : [
                o.type === 'choice'
                  ? (o.choices?.[0] as string)
                  : o.type === 'number' || o.type === 'integer'
                    ? String(o.default ?? o.min ?? 1)
                    : 'x',
              ];
        expect(() => parseCommandLine(c, [...args, `--${o.name}`, ...value])).not.toThrow();
        if (o.short !== undefined)
          expect(() => parseCommandLine(c, [...args, `-${o.short}`, ...value])).not.toThrow();
      }
    },
  );

  it('gives every option a description and every command a unique name and unique short aliases', () => {
    expect(new Set(commands.map((c) => c.name)).size).toBe(commands.length);
    for (const c of commands) {
      const shorts = c.options.flatMap((o) => (o.short === undefined ? [] : [o.short]));
      expect(new Set([...shorts, 'h']).size, c.name).toBe(shorts.length + 1);
      expect(new Set(c.options.map((o) => o.name)).size, c.name).toBe(c.options.length);
      for (const o of c.options) {
        expect(o.description.length, `${c.name} --${o.name}`).toBeGreaterThan(10);
        expect(o.name).toMatch(/^[a-z][a-z0-9-]*$/);
        if (o.type === 'choice') expect(o.choices?.length).toBeGreaterThan(1);
        if (o.default !== undefined && o.type !== 'string') {
          // A default must itself pass the table's own checks.
          expect(() =>
            parseCommandLine(c, [
              ...c.positionals.filter((p) => p.required).map(() => 'x'),
              `--${o.name}=${o.default}`,
            ]),
          ).not.toThrow();
        }
      }
    }
  });

  it('documents commands in docs/cli.md with the same option synopses', () => {
    const docs = readFileSync(new URL('../../../docs/cli.md', import.meta.url), 'utf8');
    for (const c of commands) {
      expect(docs).toContain(`### \`bridgework ${c.name}\``);
      for (const o of c.options) expect(docs).toContain(`\`${optionSynopsis(o).trim()}\``);
    }
  });
});
