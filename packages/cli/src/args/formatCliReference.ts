import { optionDescription, optionSynopsis } from './describeOption.js';
import { usageLine } from './formatHelp.js';
import type { CommandSpec } from './optionTable.js';
import { helpOption } from './parseCommandLine.js';

function cell(text: string): string {
  return text.replace(/\|/g, '\\|');
}

/**
 * The command reference of docs/cli.md in Markdown, generated from the option tables (the same
 * rows the parser and `--help` use).
 *
 * @remarks
 * One section per command: summary, usage, description, arguments and options tables, examples.
 * The repository writes it into docs/cli.md between the `cli-reference` markers
 * (`pnpm --filter bridgework docs:cli`), and a test fails when the file is out of date.
 *
 * @param commands - The command table.
 * @returns Markdown text (not yet formatted by prettier).
 */
export function formatCliReference(commands: readonly CommandSpec[]): string {
  const out: string[] = [];
  for (const c of commands) {
    out.push(`### \`bridgework ${c.name}\``, '', c.summary, '', '```text', usageLine(c), '```', '');
    for (const paragraph of c.description.split(/\n\s*\n/))
      out.push(paragraph.replace(/\s+/g, ' ').trim(), '');
    if (c.positionals.length > 0) {
      out.push('| argument | description |', '| --- | --- |');
      for (const p of c.positionals) {
        out.push(`| \`<${p.name}>\`${p.required ? '' : ' (optional)'} | ${cell(p.description)} |`);
      }
      out.push('');
    }
    out.push('| option | description |', '| --- | --- |');
    for (const o of [...c.options, helpOption]) {
      out.push(`| \`${optionSynopsis(o).trim()}\` | ${cell(optionDescription(o))} |`);
    }
    out.push('');
    if (c.examples.length > 0) {
      out.push('```sh');
      c.examples.forEach((e, i) => {
        if (i > 0) out.push('');
        out.push(`# ${e.description}`, e.command);
      });
      out.push('```', '');
    }
  }
  return out.join('\n');
}
