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
    default: 100_000,
    min: 1_000,
    max: 10_000_000,
    description:
      'Monte Carlo trials per channel, run in batches of at most 10 000 (about 2 s per 100 000 trials here; 8 bytes of memory per trial). JCGM 101 suggests 10⁶ for a 95 % interval correct to one or two significant digits.',
  },
  {
    name: 'seed',
    type: 'integer',
    placeholder: 'n',
    default: 1,
    min: 0,
    max: 4_294_967_295,
    description:
      'Seed of the random streams: batch i runs with seed + i·2³², so the same seed and trials give the same result on every machine.',
  },
  {
    name: 'coverage',
    type: 'number',
    placeholder: 'p',
    unit: 'probability',
    defaultText: "each channel's tolerances.coverageProbability (0.95 unless stated)",
    min: 0.5,
    max: 0.999,
    description: 'Coverage probability of the intervals, for the Monte Carlo and the GUM alike.',
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
    "Propagates the distributions of the inputs of each channel's budget (the reading with its noise, and every stated tolerance: gauge factor, rated output, completion resistors, leads, excitation, reference, gain, offset, gauge temperature, RTD class) through the exact channel model by Monte Carlo simulation (JCGM 101) at the budget point, and prints the estimate, the standard uncertainty and both coverage intervals (probabilistically symmetric and shortest) beside the GUM law-of-propagation result (JCGM 100) and the comparison of JCGM 101 clause 8, which says whether the GUM interval is validated.\n\n" +
    'The trials run in seeded batches, so a progress bar can be shown on a terminal; the intervals are computed over the values of all batches together. The same seed and number of trials give the same result.',
  positionals: uncertaintyArguments,
  options: uncertaintyOptions,
  examples: [
    { command: 'bridgework uncertainty hopper.yaml', description: '100 000 trials per channel.' },
    {
      command: 'bridgework uncertainty hopper.yaml --channel north-cell --trials 1000000',
      description: 'One channel, with the trials JCGM 101 suggests for a 95 % interval.',
    },
    {
      command: 'bridgework uncertainty hopper.yaml --trials 200000 --seed 7 --json',
      description: 'A quicker, repeatable run as JSON.',
    },
  ],
  load: () => import('./runUncertainty.js'),
});
