/**
 * The option table of `bridgework help` (apart from the command, so that its body imports these
 * types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
/** The positional arguments of `bridgework help`. */
export const helpArguments = [
  { name: 'command', required: false, description: 'The command to describe.' },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework help`. */
export const helpOptions = [] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework help`. */
export type HelpArgs = ParsedArgs<typeof helpOptions, typeof helpArguments>;
