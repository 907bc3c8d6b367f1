import {
  defineCommand,
  type OptionSpec,
  type ParsedArgs,
  type PositionalSpec,
} from '../../args/optionTable.js';

/** The positional arguments of `bridgework help`. */
export const helpArguments = [
  { name: 'command', required: false, description: 'The command to describe.' },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework help`. */
export const helpOptions = [] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework help`. */
export type HelpArgs = ParsedArgs<typeof helpOptions, typeof helpArguments>;

/** `bridgework help [command]`. */
export const helpCommand = defineCommand({
  name: 'help',
  summary: 'Show the help of bridgework or of one command.',
  description: 'Prints the list of commands, or the options of the named command.',
  positionals: helpArguments,
  options: helpOptions,
  examples: [{ command: 'bridgework help convert', description: 'Show the options of convert.' }],
  load: () => import('./runHelp.js'),
});
