import { Worker } from 'node:worker_threads';
import type { BlockDone, BlockJob, LaneSetup } from './blockConversion.js';
import { receiveError, type LaneReply, type LaneRequest } from './laneMessages.js';
import { startSourceWorker } from './sourceWorker.js';

/** A block's conversion as it comes back from a worker (its output is in the job's `out`). */
export type LaneResult = Omit<BlockDone, 'out'>;

/**
 * Worker threads that convert blocks of a recording (see {@link startConversionLanes}).
 */
export interface ConversionLanes {
  /** Worker threads. */
  readonly threads: number;
  /**
   * Sends every worker the run's setup and channel specs; resolves when all have made their
   * channels.
   *
   * @param setup - How each block is converted.
   * @param specs - One channel spec per lane (`Channel.spec` of the built-in channel package).
   */
  setup(setup: LaneSetup, specs: readonly unknown[]): Promise<void>;
  /**
   * Converts a block in worker `thread` (jobs sent to one worker run in the order sent). The
   * job's arrays must be views of `SharedArrayBuffer`s: the worker reads the codes and writes the
   * output in place; neither is touched here until the result comes.
   *
   * @param thread - The worker (0-based).
   * @param job - The block.
   * @returns The result; rejects with the error the block's conversion threw (the same
   *   `BridgeworkError` one thread throws), or when the worker stopped.
   */
  convert(thread: number, job: BlockJob): Promise<LaneResult>;
  /** Stops every worker (pending calls reject). */
  close(): Promise<void>;
}

const here = import.meta.url;
const fromSource = here.endsWith('.ts');

/**
 * Starts one worker: dist/data/conversionWorker.js from the compiled package, the TypeScript
 * module through tsx from the sources (tests).
 */
function startWorker(): Worker {
  if (!fromSource) return new Worker(new URL('./conversionWorker.js', here));
  return startSourceWorker(new URL('./conversionWorker.ts', here));
}

/**
 * Starts `threads` conversion worker threads. They begin loading the channel package at once, so
 * starting them before the channel file is read overlaps their start-up with the main thread's.
 *
 * @remarks
 * Each worker makes the run's channels from their specs ({@link ConversionLanes.setup}) and
 * converts the blocks it is sent with the block runner of the one-thread path
 * (`createBlockRunner`), so every block's values, counts and text are the same bit for bit. Codes
 * and output are in shared memory (`SharedArrayBuffer`: no copies, and no buffer is ever detached,
 * which would slow every typed-array access of the thread that detached it). A worker's error comes back as the error
 * the block threw (a `BridgeworkError` keeps its code and message); a worker that stops (out of
 * memory, a crash) fails every pending call. Call {@link ConversionLanes.close} when done: live
 * workers keep the process running. On SIGINT the process ends with its threads.
 *
 * @param threads - Worker threads (≥ 1).
 * @returns The lanes.
 * @example
 * ```ts
 * const lanes = startConversionLanes(1);
 * try {
 *   await convertRecording({ source, channels, writer, lanes: { pool: lanes, specs } });
 * } finally {
 *   await lanes.close();
 * }
 * ```
 */
export function startConversionLanes(threads: number): ConversionLanes {
  const workers = Array.from({ length: threads }, startWorker);
  /** Per worker, the calls waiting for a reply, in the order sent. */
  const waiting = workers.map(
    () => [] as { resolve: (reply: LaneReply) => void; reject: (error: Error) => void }[],
  );
  let stopped: Error | undefined;
  const failAll = (error: Error): void => {
    stopped ??= error;
    for (const queue of waiting) for (const call of queue.splice(0)) call.reject(stopped);
  };
  workers.forEach((worker, w) => {
    worker.on('message', (reply: LaneReply) => {
      const call = waiting[w]?.shift();
      if (call === undefined) return;
      if (reply.type === 'failed') call.reject(receiveError(reply.error));
      else call.resolve(reply);
    });
    worker.on('error', (error) => {
      failAll(new Error(`a conversion worker thread stopped: ${error.message}`, { cause: error }));
    });
    worker.on('exit', (code) => {
      failAll(new Error(`a conversion worker thread ended (exit code ${code})`));
    });
  });
  const call = (w: number, request: LaneRequest): Promise<LaneReply> =>
    new Promise((resolve, reject) => {
      if (stopped !== undefined) {
        reject(stopped);
        return;
      }
      (waiting[w] as (typeof waiting)[number]).push({ resolve, reject });
      (workers[w] as Worker).postMessage(request);
    });
  return {
    threads,
    async setup(setup, specs) {
      await Promise.all(workers.map((_, w) => call(w, { type: 'setup', setup, specs })));
    },
    async convert(thread, job) {
      const reply = await call(thread, { type: 'block', id: thread, ...job });
      if (reply.type !== 'done')
        throw new Error(`a conversion worker thread replied ${reply.type} to a block`);
      return reply;
    },
    async close() {
      stopped ??= new Error('the conversion worker threads were closed');
      await Promise.all(workers.map((worker) => worker.terminate()));
    },
  };
}
