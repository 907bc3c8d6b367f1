import { channelBudget } from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import type { MonteCarloResult } from '@bridgework/uncertainty';
import { inChannel, loadChannels, type LoadedChannel } from '../../channels/loadChannels.js';
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
import { monteCarloInWorker } from './monteCarloJob.js';
import type { UncertaintyArgs } from './uncertaintyCommand.js';

/**
 * The body of `bridgework uncertainty`: for each selected channel, the channel package's Monte
 * Carlo evaluation of its budget (`channelBudget(channel, { monteCarlo: { trials, seed,
 * onProgress, signal } })`, JCGM 101) with a progress bar on a terminal, printed beside the GUM
 * result as text or JSON.
 *
 * @remarks
 * `--coverage` is the budget's `coverageProbability` (it replaces the channels'
 * `tolerances.coverageProbability`), so the Monte Carlo intervals and the GUM expanded
 * uncertainty use the same probability.
 *
 * The trials run in a worker thread (the channel rebuilt there from its validated spec: the same
 * result bit for bit), so this thread keeps its event loop: the bar moves, and Ctrl-C (SIGINT)
 * sets the run's `signal`, which stops it within one block of 16 384 trials; nothing is written,
 * a pending output file is removed, and the process ends by SIGINT as interrupted programs do.
 * Channels of a kit handed in by a test (`context.channels`) run in this thread.
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
  const stop = new SharedArrayBuffer(4);
  const stopFlag = new Int32Array(stop);
  let interrupted = false;
  const onInterrupt = () => {
    interrupted = true;
    Atomics.store(stopFlag, 0, 1);
  };
  process.on('SIGINT', onInterrupt);
  const coverage = options.coverage === undefined ? {} : { coverageProbability: options.coverage };
  /** One channel's Monte Carlo: in a worker for the built-in kinds, here for a test's kit. */
  const monteCarloOf = async (c: LoadedChannel, onProgress: (trials: number) => void) => {
    if (context.channels !== undefined) {
      return inChannel(loaded, c, () =>
        channelBudget(c.channel, {
          ...coverage,
          monteCarlo: {
            trials: options.trials,
            seed: options.seed,
            onProgress: (p) => onProgress(p.trials),
            signal: {
              get aborted() {
                return Atomics.load(stopFlag, 0) !== 0;
              },
            },
          },
        }),
      ).monteCarlo as MonteCarloResult;
    }
    try {
      return await monteCarloInWorker(
        { spec: c.spec, trials: options.trials, seed: options.seed, coverage: options.coverage, stop },
        onProgress,
      );
    } catch (e) {
      return inChannel(loaded, c, () => {
        throw e;
      });
    }
  };
  try {
    const runs: ChannelUncertainty[] = [];
    for (const c of loaded.channels) {
      // The budget without its Monte Carlo (quick), here: the lines and checks the text shows.
      const budget = inChannel(loaded, c, () => channelBudget(c.channel, coverage));
      const bar = context.progressBar({ label: c.name, total: options.trials, unit: 'trials' });
      let result: MonteCarloResult;
      try {
        result = await monteCarloOf(c, (trials) => bar.update(trials));
      } finally {
        bar.finish();
      }
      runs.push({
        name: c.name,
        quantity: c.channel.quantity,
        unit: c.channel.unit,
        display: c.channel.display,
        budget: { ...budget, monteCarlo: result },
        result,
      });
    }
    await output.write(
      options.json
        ? reportJson(uncertaintyPayload(loaded.file.file, runs), {
            generator: `bridgework ${await readVersion()}`,
          })
        : formatUncertainty(loaded.file.file, runs, output.style),
    );
    await output.commit('the Monte Carlo results');
    return exitCodes.ok;
  } catch (e) {
    if (interrupted)
      throw new BridgeworkError(
        'closed',
        'interrupted (SIGINT): the Monte Carlo run was stopped; nothing was written',
        { cause: e },
      );
    throw e;
  } finally {
    process.off('SIGINT', onInterrupt);
    await output.abort();
    // Interrupted: end as interrupted programs do, by the signal itself (exit status 130 in a shell).
    if (interrupted) process.kill(process.pid, 'SIGINT');
  }
}
