import { defineCommand } from '../../args/optionTable.js';
import { uncertaintyArguments, uncertaintyOptions } from './uncertaintyOptions.js';

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
