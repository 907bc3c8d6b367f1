import { channelBudget } from '@bridgework/channel';
import type { MonteCarloResult } from '@bridgework/uncertainty';
import { inChannel, loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { readVersion } from '../../internal/readVersion.js';
import { reportJson } from '../../report/reportJson.js';
import {
  formatUncertainty,
  uncertaintyPayload,
  type ChannelUncertainty,
} from '../../uncertainty/formatUncertainty.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import type { UncertaintyArgs } from './uncertaintyCommand.js';

/**
 * The body of `bridgework uncertainty`: for each selected channel, the channel package's Monte
 * Carlo evaluation of its budget (`channelBudget(channel, { monteCarlo: { trials, seed,
 * onProgress } })`, JCGM 101) with a progress bar on a terminal, printed beside the GUM result as
 * text or JSON.
 *
 * @remarks
 * `--coverage` is the budget's `coverageProbability` (it replaces the channels'
 * `tolerances.coverageProbability`), so the Monte Carlo intervals and the GUM expanded
 * uncertainty use the same probability.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file or an existing output
 * without `--force`; `model-not-finite` (with the channel's file and path) when a trial's inputs
 * make the channel's map fail.
 */
export async function run(args: UncertaintyArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const loaded = await loadChannels(
    args.positionals.channelFile,
    options.channel === undefined ? undefined : [options.channel],
    context.channels,
  );
  const output = await openResultOutput(context, options.out, options.force);
  try {
    const runs: ChannelUncertainty[] = loaded.channels.map((c) => {
      const bar = context.progressBar({ label: c.name, total: options.trials, unit: 'trials' });
      try {
        const budget = inChannel(loaded, c, () =>
          channelBudget(c.channel, {
            monteCarlo: {
              trials: options.trials,
              seed: options.seed,
              onProgress: (progress) => bar.update(progress.trials),
            },
            ...(options.coverage === undefined ? {} : { coverageProbability: options.coverage }),
          }),
        );
        return {
          name: c.name,
          quantity: c.channel.quantity,
          unit: c.channel.unit,
          display: c.channel.display,
          budget,
          result: budget.monteCarlo as MonteCarloResult,
        };
      } finally {
        bar.finish();
      }
    });
    await output.write(
      options.json
        ? reportJson(uncertaintyPayload(loaded.file.file, runs), {
            generator: `bridgework ${await readVersion()}`,
          })
        : formatUncertainty(loaded.file.file, runs, output.style),
    );
    await output.commit('the Monte Carlo results');
    return exitCodes.ok;
  } finally {
    await output.abort();
  }
}
