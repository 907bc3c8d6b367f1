import {
  defineCommand,
  type OptionSpec,
  type ParsedArgs,
  type PositionalSpec,
} from '../../args/optionTable.js';
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

/** `bridgework demo`: the design report of the built-in example. */
export const demoCommand = defineCommand({
  name: 'demo',
  summary: 'Run the design report on the built-in example channel file.',
  description:
    'Runs the design report on the example channel file that ships with bridgework, prints it, and writes its HTML report and C header into a folder, printing where they are. A good first contact: it needs no input.',
  positionals: demoArguments,
  options: demoOptions,
  examples: [
    { command: 'bridgework demo', description: 'Run the demo.' },
    { command: 'bridgework demo --dir demo-out', description: 'Keep its files in ./demo-out.' },
  ],
  load: () => import('./runDemo.js'),
});
