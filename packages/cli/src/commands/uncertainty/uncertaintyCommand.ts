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
    max: 50_000_000,
    description:
      'Monte Carlo trials per channel. The default is the 10⁶ that JCGM 101 (7.2.2) suggests for a 95 % interval correct to one or two significant digits. A run holds about 10 bytes per trial (10 MB for 10⁶). Measured here (built packages, Node 20, shared 2-core machine): 10⁶ trials of a demo channel take 0.13–0.49 s of processor time, 0.6–2.1 s of wall time under heavy load.',
  },
  {
    name: 'seed',
    type: 'integer',
    placeholder: 'n',
    default: 1,
    min: 0,
    max: Number.MAX_SAFE_INTEGER,
    description:
      'Seed of the random streams: the same seed and trials give the same result on every machine.',
  },
  {
    name: 'coverage',
    type: 'number',
    placeholder: 'p',
    unit: 'probability',
    defaultText: "each channel's tolerances.coverageProbability (0.95 unless stated)",
    min: 0.5,
    max: 0.9999,
    description:
      "Coverage probability of the intervals, for the Monte Carlo and the GUM alike (the budget's coverageProbability).",
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
    "Propagates the distributions of the inputs of each channel's budget (the reading with its noise, and every stated tolerance: gauge factor, rated output, completion resistors, leads, excitation, reference, gain, offset, sensor temperature, and the sensor kind's own, such as an RTD's class or a thermistor's tolerances) through the exact channel model by Monte Carlo simulation (JCGM 101) at the budget point, and prints the estimate, the standard uncertainty and both coverage intervals (probabilistically symmetric and shortest) beside the GUM law-of-propagation result (JCGM 100) and the comparison of JCGM 101 clause 8, which says whether the GUM interval is validated.\n\n" +
    "The run is the channel package's Monte Carlo of the budget (channelBudget with monteCarlo), which evaluates the channel's parametric model per trial without rebuilding it, in a worker thread; a progress bar is shown on a terminal, and Ctrl-C stops the run within a block of 16 384 trials, writing nothing. The same seed and number of trials give the same result.",
  positionals: uncertaintyArguments,
  options: uncertaintyOptions,
  examples: [
    {
      command: 'bridgework uncertainty hopper.yaml',
      description: '10⁶ trials per channel, as JCGM 101 suggests for a 95 % interval.',
    },
    {
      command: 'bridgework uncertainty hopper.yaml --channel north-cell --coverage 0.99',
      description: 'One channel, with 99 % intervals.',
    },
    {
      command: 'bridgework uncertainty hopper.yaml --trials 200000 --seed 7 --json',
      description: 'A quicker, repeatable run as JSON.',
    },
  ],
  load: () => import('./runUncertainty.js'),
});
