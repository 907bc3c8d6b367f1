import { SAFETY_CAUTION } from '../caution.js';
import { wrapText } from '../internal/wrapText.js';
import { optionDescription, optionSynopsis } from './describeOption.js';
import type { CommandSpec } from './optionTable.js';
import { helpOption } from './parseCommandLine.js';

/** Options of {@link formatCommandHelp} and {@link formatProgramHelp}. */
export interface HelpFormatOptions {
  /** Line width in characters. Default 80. */
  readonly width?: number;
}

const program = 'bridgework';

/** Two-column layout: names on the left, wrapped descriptions on the right. */
function columns(rows: readonly (readonly [string, string])[], width: number): string[] {
  const left = Math.min(Math.max(...rows.map(([l]) => l.length)) + 2, 30);
  const out: string[] = [];
  for (const [name, text] of rows) {
    const wrapped = wrapText(text, width, ' '.repeat(2 + left));
    const first = `  ${name}`;
    if (first.length + 2 <= 2 + left && wrapped.length > 0) {
      out.push(first.padEnd(2 + left) + (wrapped[0] as string).trimStart(), ...wrapped.slice(1));
    } else {
      out.push(first, ...wrapped);
    }
  }
  return out;
}

/**
 * The usage line of a command: `bridgework convert [options] <channel-file> <codes-file>`.
 *
 * @param spec - The command.
 * @returns The usage line (without the `Usage:` prefix).
 */
export function usageLine(spec: Pick<CommandSpec, 'name' | 'positionals'>): string {
  const args = spec.positionals.map((p) => (p.required ? `<${p.name}>` : `[<${p.name}>]`));
  return [program, spec.name, '[options]', ...args].join(' ');
}

/**
 * The `--help` text of one command, generated from its option table.
 *
 * @param spec - The command.
 * @param options - `width` of the text.
 * @returns The help text, ending with a newline.
 * @example
 * ```ts
 * formatCommandHelp(convertCommand).split('\n')[0]; // 'bridgework convert: codes to engineering units...'
 * ```
 */
export function formatCommandHelp(spec: CommandSpec, options: HelpFormatOptions = {}): string {
  const width = options.width ?? 80;
  const lines: string[] = [
    ...wrapText(`${program} ${spec.name}: ${spec.summary}`, width),
    '',
    `Usage: ${usageLine(spec)}`,
  ];
  for (const paragraph of spec.description.split(/\n\s*\n/)) lines.push('', ...wrapText(paragraph, width));
  if (spec.positionals.length > 0) {
    lines.push('', 'Arguments:');
    lines.push(
      ...columns(
        spec.positionals.map((p) => [`<${p.name}>`, p.description] as const),
        width,
      ),
    );
  }
  lines.push('', 'Options:');
  lines.push(
    ...columns(
      [...spec.options, helpOption].map((o) => [optionSynopsis(o), optionDescription(o)] as const),
      width,
    ),
  );
  if (spec.examples.length > 0) {
    lines.push('', 'Examples:');
    for (const e of spec.examples) lines.push(...wrapText(e.description, width, '  '), `    ${e.command}`);
  }
  return `${lines.join('\n')}\n`;
}

/**
 * The top-level help (`bridgework --help`): what the tool is, its commands and the exit codes.
 *
 * @param commands - The command table.
 * @param options - `width` of the text.
 * @returns The help text, ending with a newline.
 */
export function formatProgramHelp(commands: readonly CommandSpec[], options: HelpFormatOptions = {}): string {
  const width = options.width ?? 80;
  const lines = [
    `${program}: strain-gauge and sensor-bridge channels from a channel file`,
    '',
    `Usage: ${program} <command> [options] [arguments]`,
    `       ${program} help <command>`,
    '',
    'Commands:',
    ...columns(
      commands.map((c) => [c.name, c.summary] as const),
      width,
    ),
    '',
    'Options:',
    ...columns(
      [
        ['-h, --help', 'Show this help, or a command’s help after its name.'],
        ['-V, --version', 'Print the version and exit.'],
      ],
      width,
    ),
    '',
    'Exit codes: 0 ok; 1 bad input (usage, file, validation); 2 a design check failed.',
    'Colours appear only on a terminal and never when NO_COLOR is set.',
    '',
    ...wrapText(SAFETY_CAUTION, width),
  ];
  return `${lines.join('\n')}\n`;
}
