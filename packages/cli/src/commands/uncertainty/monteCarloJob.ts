/**
 * One channel's budget Monte Carlo in a worker thread (`monteCarloWorker.ts`), for
 * `bridgework uncertainty`: the main thread keeps its event loop, so the progress bar moves and
 * Ctrl-C is heard during a long run; the run stops at the next block of 16 384 trials when the
 * shared stop flag is set. The result is the one `channelBudget` gives in this thread, bit for bit
 * (the same code on the same validated spec).
 */
import { Worker } from 'node:worker_threads';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { BridgeworkError, type ErrorCode, type SpecIssue } from '@bridgework/core';
import type { ChannelSpec } from '@bridgework/channel';
import type { MonteCarloResult } from '@bridgework/uncertainty';

/** What the worker is given (structured-cloned). */
export interface MonteCarloJob {
  /** The channel's validated spec (`Channel.spec`). */
  readonly spec: ChannelSpec;
  /** Trials. */
  readonly trials: number;
  /** Seed. */
  readonly seed: number;
  /** The budget's coverage probability, when the command line sets it. */
  readonly coverage: number | undefined;
  /** One Int32: non-zero stops the run (read as the Monte Carlo's `signal`). */
  readonly stop: SharedArrayBuffer;
}

/** What the worker posts back. */
export type MonteCarloReply =
  | { readonly kind: 'progress'; readonly trials: number }
  | { readonly kind: 'done'; readonly result: MonteCarloResult }
  | {
      readonly kind: 'failed';
      readonly error: {
        readonly code: ErrorCode;
        readonly message: string;
        readonly param?: string;
        readonly value?: unknown;
        readonly limit?: number | string | readonly (number | string)[];
        readonly issues: readonly SpecIssue[];
      };
    }
  | { readonly kind: 'crashed'; readonly message: string };

const here = import.meta.url;

/**
 * Starts the worker: dist/commands/uncertainty/monteCarloWorker.js from the built package; from
 * the TypeScript sources (tests) a bootstrap registers tsx's hooks first, with the
 * `@bridgework/source` condition (Node 20 applies no `--import` loader to workers).
 */
function startWorker(job: MonteCarloJob): Worker {
  if (!here.endsWith('.ts')) return new Worker(new URL('./monteCarloWorker.js', here), { workerData: job });
  const tsx = dirname(createRequire(here).resolve('tsx/package.json'));
  const api = pathToFileURL(join(tsx, 'dist', 'esm', 'api', 'index.mjs')).href;
  const target = new URL('./monteCarloWorker.ts', here).href;
  const code = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); });`;
  return new Worker(code, { eval: true, workerData: job, execArgv: ['--conditions=@bridgework/source'] });
}

/**
 * Runs the job in a worker thread and resolves with the Monte Carlo result.
 *
 * @param job - The spec, trials, seed, coverage and stop flag.
 * @param onProgress - Called with the trials done, from this thread's event loop.
 * @returns The result; rejects with the channel package's error (its code, message, field and
 *   issues), `closed` when stopped by the flag.
 */
export function monteCarloInWorker(
  job: MonteCarloJob,
  onProgress: (trials: number) => void,
): Promise<MonteCarloResult> {
  return new Promise((resolve, reject) => {
    const worker = startWorker(job);
    let settled = false;
    const settle = (f: () => void) => {
      if (settled) return;
      settled = true;
      f();
      void worker.terminate();
    };
    worker.on('message', (reply: MonteCarloReply) => {
      if (reply.kind === 'progress') onProgress(reply.trials);
      else if (reply.kind === 'done') settle(() => resolve(reply.result));
      else if (reply.kind === 'failed') {
        const { code, message, ...fields } = reply.error;
        settle(() => reject(new BridgeworkError(code, message, fields)));
      } else
        settle(() =>
          reject(new BridgeworkError('model-failed', `the Monte Carlo worker failed: ${reply.message}`)),
        );
    });
    worker.on('error', (e) =>
      settle(() =>
        reject(
          new BridgeworkError('model-failed', `the Monte Carlo worker failed: ${e.message}`, { cause: e }),
        ),
      ),
    );
    worker.on('exit', (code) =>
      settle(() =>
        reject(
          new BridgeworkError(
            'model-failed',
            `the Monte Carlo worker ended (exit code ${code}) without a result`,
          ),
        ),
      ),
    );
  });
}
