import {
  defineCommand,
  type OptionSpec,
  type ParsedArgs,
  type PositionalSpec,
} from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework uncertainty`. */
export const uncertaintyArguments = [channelFileArgument] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework uncertainty`. */
export const uncertaintyOptions = [
  {
    name: 'trials',
    type: 'integer',
    placeholder: 'n',
    unit: 'trials',
    default: 1_000_000,
    min: 1_000,
    max: 100_000_000,
    description: 'Number of Monte Carlo trials.',
  },
  {
    name: 'seed',
    type: 'integer',
    placeholder: 'n',
    default: 1,
    min: 0,
    max: 4_294_967_295,
    description: 'Seed of the random generator; the same seed gives the same result.',
  },
  {
    name: 'coverage',
    type: 'number',
    placeholder: 'p',
    unit: 'probability',
    default: 0.95,
    min: 0.5,
    max: 0.999,
    description: 'Coverage probability of the interval.',
  },
  channelOption,
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework uncertainty`. */
export type UncertaintyArgs = ParsedArgs<typeof uncertaintyOptions, typeof uncertaintyArguments>;

/** `bridgework uncertainty`: Monte Carlo uncertainty of each channel. */
export const uncertaintyCommand = defineCommand({
  name: 'uncertainty',
  summary: 'Monte Carlo uncertainty of each channel (JCGM 101), beside the GUM result.',
  description:
    'Propagates the distributions of every input of the channel (tolerances, noise, temperatures, lead resistances) through the exact channel model by Monte Carlo simulation (JCGM 101), seeded so that a run can be repeated exactly, and prints the mean, standard uncertainty and shortest coverage interval beside the GUM law-of-propagation result (JCGM 100). A progress bar is shown on a terminal.',
  positionals: uncertaintyArguments,
  options: uncertaintyOptions,
  examples: [
    { command: 'bridgework uncertainty hopper.yaml', description: 'One million trials per channel.' },
    {
      command: 'bridgework uncertainty hopper.yaml --trials 200000 --seed 7 --json',
      description: 'A quicker, repeatable run as JSON.',
    },
  ],
  load: () => import('./runUncertainty.js'),
});
