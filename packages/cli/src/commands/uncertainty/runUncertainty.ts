import { createChannel } from '@bridgework/channel';
import { inChannel, loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { readVersion } from '../../internal/readVersion.js';
import { displayUnit } from '../../report/displayUnit.js';
import { reportJson } from '../../report/reportJson.js';
import { batchedMonteCarlo } from '../../uncertainty/batchedMonteCarlo.js';
import {
  formatUncertainty,
  uncertaintyPayload,
  type ChannelUncertainty,
} from '../../uncertainty/formatUncertainty.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import type { UncertaintyArgs } from './uncertaintyCommand.js';

/**
 * The body of `bridgework uncertainty`: for each selected channel, a seeded, batched Monte Carlo
 * run of its budget model ({@link batchedMonteCarlo}) with a progress bar on a terminal, printed
 * beside the GUM result as text or JSON.
 *
 * @remarks
 * `--coverage` replaces the channels' `tolerances.coverageProbability`, so the Monte Carlo
 * intervals and the GUM expanded uncertainty use the same probability.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file or an existing output
 * without `--force`.
 */
export async function run(args: UncertaintyArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const loaded = await loadChannels(
    args.positionals.channelFile,
    options.channel === undefined ? undefined : [options.channel],
  );
  const output = await openResultOutput(context, options.out, options.force);
  try {
    const runs: ChannelUncertainty[] = loaded.channels.map((c) => {
      const channel =
        options.coverage === undefined
          ? c.channel
          : createChannel({
              ...c.spec,
              tolerances: { ...c.spec.tolerances, coverageProbability: options.coverage },
            });
      const bar = context.progressBar({ label: c.name, total: options.trials, unit: 'trials' });
      try {
        const result = inChannel(loaded, c, () =>
          batchedMonteCarlo(channel, {
            trials: options.trials,
            seed: options.seed,
            onProgress: (done) => bar.update(done),
          }),
        );
        return {
          name: c.name,
          quantity: channel.quantity,
          unit: channel.unit,
          display: displayUnit(channel),
          result,
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
