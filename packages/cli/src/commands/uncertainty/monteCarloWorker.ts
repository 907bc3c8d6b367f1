/**
 * The worker thread of `bridgework uncertainty`: rebuilds one channel from its validated spec and
 * runs its budget's Monte Carlo (the channel package's `channelBudget`), posting progress, so the
 * main thread stays free to draw the progress bar and to hear Ctrl-C. The run reads a shared
 * flag as its `signal` after every block of 16 384 trials.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { channelBudget, createChannel } from '@bridgework/channel';
import { isBridgeworkError } from '@bridgework/core';
import type { MonteCarloJob, MonteCarloReply } from './monteCarloJob.js';

const job = workerData as MonteCarloJob;
const flag = new Int32Array(job.stop);
const post = (reply: MonteCarloReply) => parentPort?.postMessage(reply);
try {
  const budget = channelBudget(createChannel(job.spec), {
    ...(job.coverage === undefined ? {} : { coverageProbability: job.coverage }),
    monteCarlo: {
      trials: job.trials,
      seed: job.seed,
      onProgress: (p) => post({ kind: 'progress', trials: p.trials }),
      signal: {
        get aborted() {
          return Atomics.load(flag, 0) !== 0;
        },
      },
    },
  });
  post({ kind: 'done', result: budget.monteCarlo! });
} catch (e) {
  if (isBridgeworkError(e)) {
    const error = {
      code: e.code,
      message: e.message,
      ...(e.param === undefined ? {} : { param: e.param }),
      ...(e.limit === undefined ? {} : { limit: e.limit }),
      issues: e.issues,
    };
    try {
      post({ kind: 'failed', error: e.value === undefined ? error : { ...error, value: e.value } });
    } catch {
      post({ kind: 'failed', error }); // a value that cannot cross threads is left out
    }
  } else post({ kind: 'crashed', message: e instanceof Error ? `${e.name}: ${e.message}` : String(e) });
}
