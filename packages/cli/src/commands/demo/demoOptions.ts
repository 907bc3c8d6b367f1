/**
 * The option table of `bridgework demo` (apart from the command, so that its body imports these
 * types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { forceOption } from '../sharedOptions.js';
/** The positional arguments of `bridgework demo`. */
export const demoArguments = [] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework demo`. */
export const demoOptions = [
  {
    name: 'dir',
    type: 'string',
    placeholder: 'folder',
    defaultText: 'a new folder in the system temporary folder',
    description: 'Write the HTML report and the header into this folder.',
  },
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework demo`. */
export type DemoArgs = ParsedArgs<typeof demoOptions, typeof demoArguments>;
