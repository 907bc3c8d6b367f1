import { defineCommand } from '../../args/optionTable.js';
import { demoArguments, demoOptions } from './demoOptions.js';

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
