import { defineCommand } from '../../args/optionTable.js';
import { helpArguments, helpOptions } from './helpOptions.js';

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
