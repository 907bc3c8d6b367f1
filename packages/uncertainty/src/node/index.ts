/// <reference types="node" />
/**
 * Node-only parallel runner for `monteCarlo` of `@bridgework/uncertainty`: the same procedure
 * and kernel on worker threads, with bit-identical results.
 *
 * @module
 */
import { createRequire } from 'node:module';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { BridgeworkError, checkInteger, checkOptions, formatValue } from '@bridgework/core';
import type { BlockReply, BlockRequest } from '../internal/driver.js';
import { runProcedure } from '../internal/driver.js';
import type { EnginePlan } from '../internal/engine.js';
import {
  coveredCount,
  intervalsFromSortedParts,
  sampleIntervalsInPlace,
  type SampleIntervals,
} from '../internal/select.js';
import {
  checkMonteCarloModel,
  gumFor,
  monteCarloOptionKeys,
  monteCarloResult,
  prepareMonteCarlo,
  throwIfAborted,
  type AbortSignalLike,
  type MonteCarloOptions,
  type MonteCarloResult,
  type ProgressReporter,
} from '../monteCarlo.js';
import type { Propagation } from '../propagate.js';
import type { MeasurementModel } from '../types.js';
import { intervalRoutes } from './counters.js';
import { loadModelExport } from './loadModel.js';
import { CONTROL, type TransferredError, type WorkerMessage, type WorkerReply } from './protocol.js';

/** Where the workers find the model: a module, the name of what it exports, and an optional argument. */
export interface ModelReference {
  /**
   * The module's URL (a `file:` URL or anything `import()` accepts), e.g. `new URL('./model.js', import.meta.url)`.
   * Typed by the one property read (`href`), so the declarations need no DOM or Node globals.
   */
  readonly module:
    | string
    | {
        /** The URL as text, as a `URL` object has it. */
        readonly href: string;
      };
  /**
   * The export's name. Default `'model'`. Without `argument` the export is the model: a function
   * of the inputs by name, or a `PositionalModel` object (from `@bridgework/uncertainty`); with
   * `argument`, a function that makes such a model from it.
   */
  readonly exportName?: string;
  /**
   * When given, the export is a factory: each worker (and the main thread, for the GUM
   * comparison) calls it once with a structured clone of `argument` and runs the model it
   * returns — so a model built from data (a channel specification, calibration coefficients)
   * runs on the workers without a module of its own.
   */
  readonly argument?: unknown;
}

/** Options of {@link createMonteCarloPool}. */
export interface MonteCarloPoolOptions {
  /** The model module: functions cannot be sent to a thread, so each worker imports it. */
  readonly model: ModelReference;
  /** Number of worker threads (integer in [1, 256]). Default `os.availableParallelism()`. */
  readonly workers?: number;
}

/** The options of one pooled run: those of `monteCarlo` without the model (the pool has it). */
export type PooledMonteCarloOptions = Omit<MonteCarloOptions, 'model'>;

/** A pool of worker threads that run Monte Carlo evaluations of one model (see {@link createMonteCarloPool}). */
export interface MonteCarloPool {
  /** Number of worker threads. */
  readonly workers: number;
  /**
   * Runs `monteCarlo` with the pool's model on the workers; runs queue one after another.
   *
   * @param options - As `monteCarlo`, without `model`.
   * @returns The same result as `monteCarlo` in one thread, bit for bit.
   * @throws {@link @bridgework/core!BridgeworkError} as `monteCarlo` (the same error, for the
   *   same failing trial, as one thread); `closed` after {@link MonteCarloPool.close}; and, once
   *   `signal` is aborted, its reason (the signal is read every 10 ms while the workers draw, and
   *   when a queued run's turn comes).
   */
  run(options: PooledMonteCarloOptions): Promise<MonteCarloResult>;
  /** Terminates the workers; a run in progress and later runs fail with `closed`. */
  close(): Promise<void>;
}

/** Options of {@link monteCarloInWorkers}. */
export interface MonteCarloInWorkersOptions extends PooledMonteCarloOptions {
  /** The model module. */
  readonly model: ModelReference;
  /** Number of worker threads (integer in [1, 256]). Default `os.availableParallelism()`. */
  readonly workers?: number;
}

const here = import.meta.url;
const fromSource = here.endsWith('.ts');
/** Shared buffers up to this size are kept by a pool between runs, in bytes. */
const KEEP_BYTES = 64 * 2 ** 20;
/** How often a pooled run reads the shared trial counter for `onProgress`, in ms. */
const PROGRESS_MILLIS = 50;
/** How often a pooled run reads its `signal` while the workers draw, in ms. */
const SIGNAL_MILLIS = 10;

/**
 * Starts one worker. From the compiled package this is dist/node/worker.js. From the TypeScript
 * sources (development, tests) Node 20 does not apply `--import` loaders to workers, so a tiny
 * bootstrap registers tsx's ESM hooks first, with the `@bridgework/source` condition.
 */
function startWorker(): Worker {
  if (!fromSource) return new Worker(new URL('./worker.js', here));
  const tsx = dirname(createRequire(here).resolve('tsx/package.json'));
  const api = pathToFileURL(join(tsx, 'dist', 'esm', 'api', 'index.mjs')).href;
  const target = new URL('./worker.ts', here).href;
  const code = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); });`;
  return new Worker(code, { eval: true, execArgv: ['--conditions=@bridgework/source'] });
}

function moduleHref(reference: Record<string, unknown>): string {
  const m = reference['module'];
  if (typeof m === 'object' && m !== null && typeof (m as { href?: unknown }).href === 'string') {
    const href = (m as { href: string }).href;
    if (href.length > 0) return href;
  }
  if (typeof m === 'string' && m.length > 0) return m;
  throw new BridgeworkError(
    'wrong-type',
    `\`model.module\` must be a URL or a module specifier; got ${formatValue(m)}`,
    {
      param: 'model.module',
      value: m,
    },
  );
}

/** The error a worker reported, as the main thread throws it (the same code, fields and message). */
function toError(reply: TransferredError): Error {
  const cause =
    reply.cause === undefined
      ? undefined
      : Object.assign(new Error(reply.cause.message), { name: reply.cause.name });
  if (reply.code === undefined) {
    return new BridgeworkError('model-failed', `a worker thread failed: ${reply.message}`, {
      param: 'model',
      ...(cause === undefined ? {} : { cause }),
    });
  }
  return new BridgeworkError(reply.code, reply.message, {
    ...(reply.param === undefined ? {} : { param: reply.param }),
    ...(reply.value === undefined ? {} : { value: reply.value }),
    ...(reply.limit === undefined ? {} : { limit: reply.limit }),
    ...(cause === undefined ? {} : { cause }),
  });
}

/** The error to throw from several workers' replies: the earliest failing trial, as one thread meets it. */
function firstFailure(replies: readonly WorkerReply[]): TransferredError | undefined {
  let first: TransferredError | undefined;
  for (const r of replies) {
    if (r.type !== 'error') continue;
    if (first === undefined) first = r;
    else if (r.trial !== undefined && (first.trial === undefined || r.trial < first.trial)) first = r;
  }
  return first;
}

function workerStopped(detail: string): BridgeworkError {
  return new BridgeworkError(
    'model-failed',
    `a Monte Carlo worker thread stopped (${detail}); the model may exhaust memory or end the thread`,
    { param: 'model' },
  );
}

/**
 * Starts worker threads that run Monte Carlo evaluations of one model.
 *
 * @remarks
 * Each worker imports the model module once (and, with `model.argument`, makes the model from
 * it). A run uses the procedure of `monteCarlo` unchanged: the main thread checks the options and
 * plans the seeding blocks; the workers claim blocks from a shared counter and write model
 * values and block statistics into shared memory, and in a fixed run collect the
 * coverage-interval tails of their blocks (thresholds from block 0), copy them into two combined
 * arrays after their last block and, once all have, sort the lower and the upper one on two
 * workers at once; the main thread merges the block statistics in block order and reads the
 * intervals from the two sorted tails. The shared buffers are kept
 * between runs while each is at most 64 MB, until `close()`. Every block's values depend only on the seed
 * and the block's index (see `monteCarlo`), so the result is bit-identical to `monteCarlo` in one
 * thread, whatever the number of workers. When the model fails, blocks after the failing one are
 * no longer started and the error of the earliest failing trial is thrown — the one a single
 * thread meets. The GUM comparison runs on the main thread, which imports the model too.
 *
 * When running from the TypeScript sources (the `@bridgework/source` condition), workers are
 * started with the tsx loader and that condition. Idle workers do not keep the process alive.
 *
 * @param options - The model module and the number of workers.
 * @returns The pool; call `close()` when done.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for a bad module reference or an
 *   export that is not a model (or not a factory, with `argument`); `io-error` when the module
 *   cannot be found; `model-failed` when it fails to load or the factory throws; `not-integer`,
 *   `out-of-range` for a bad worker count; `unknown-option`, `missing-option` for the options' keys.
 * @example
 * ```ts
 * // model.js: export const model = ({ a, b }) => a * b;
 * const pool = await createMonteCarloPool({ model: { module: new URL('./model.js', import.meta.url) }, workers: 2 });
 * const result = await pool.run({ inputs: { a: { value: 2, standardUncertainty: 0.1 }, b: { value: 3, standardUncertainty: 0.2 } } });
 * await pool.close();
 * ```
 */
export async function createMonteCarloPool(options: MonteCarloPoolOptions): Promise<MonteCarloPool> {
  const o = checkOptions('options', options, { known: ['model', 'workers'], required: ['model'] });
  const reference = checkOptions('model', o['model'], {
    known: ['module', 'exportName', 'argument'],
    required: ['module'],
  });
  const href = moduleHref(reference);
  const exportName = reference['exportName'] === undefined ? 'model' : reference['exportName'];
  if (typeof exportName !== 'string') {
    throw new BridgeworkError(
      'wrong-type',
      `\`model.exportName\` must be a string; got ${formatValue(exportName)}`,
      {
        param: 'model.exportName',
        value: exportName,
      },
    );
  }
  const hasArgument = 'argument' in reference && reference['argument'] !== undefined;
  let argument: unknown;
  if (hasArgument) {
    try {
      argument = structuredClone(reference['argument']);
    } catch (error) {
      throw new BridgeworkError(
        'wrong-type',
        `\`model.argument\` must be data that can be sent to a thread (structured-cloneable: no functions); got ${formatValue(reference['argument'])}`,
        { param: 'model.argument', value: reference['argument'], cause: error },
      );
    }
  }
  const count =
    o['workers'] === undefined
      ? availableParallelism()
      : checkInteger('workers', o['workers'], { min: 1, max: 256 });
  const mainModel = await loadModelExport(href, exportName, hasArgument, argument);
  const workers = Array.from({ length: count }, startWorker);
  let closed = false;
  const closedError = (): BridgeworkError =>
    new BridgeworkError(
      'closed',
      'the Monte Carlo pool is closed (`close()` was called; a run in progress is stopped): create a new pool',
      {
        param: 'pool',
      },
    );
  let broken: BridgeworkError | undefined;
  const call = (worker: Worker, message: WorkerMessage): Promise<WorkerReply> =>
    new Promise((resolve, reject) => {
      const settle = (): void => {
        worker.off('message', onMessage);
        worker.off('error', onError);
        worker.off('exit', onExit);
      };
      const onMessage = (reply: WorkerReply): void => {
        settle();
        resolve(reply);
      };
      const onError = (error: Error): void => {
        settle();
        broken = workerStopped(`${error.name}: ${error.message}`);
        reject(broken);
      };
      const onExit = (code: number): void => {
        settle();
        // Terminated by close() during a run: the run ends as any use after close().
        broken = closed ? closedError() : workerStopped(`exit code ${code}`);
        reject(broken);
      };
      if (broken !== undefined) {
        reject(broken);
        return;
      }
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.on('exit', onExit);
      worker.postMessage(message);
    });
  try {
    const loaded = await Promise.all(
      workers.map((w) => call(w, { type: 'load', module: href, exportName, hasArgument, argument })),
    );
    const bad = firstFailure(loaded);
    if (bad !== undefined) throw toError(bad);
  } catch (error) {
    await Promise.all(workers.map((w) => w.terminate()));
    throw error;
  }
  for (const w of workers) w.unref();

  /** Sends one message to every worker and waits for all replies; the earliest failure is thrown. */
  async function broadcast(messages: readonly WorkerMessage[]): Promise<WorkerReply[]> {
    for (const w of workers) w.ref();
    try {
      const replies = await Promise.all(workers.map((w, i) => call(w, messages[i] as WorkerMessage)));
      const bad = firstFailure(replies);
      if (bad !== undefined) throw toError(bad);
      return replies;
    } finally {
      for (const w of workers) w.unref();
    }
  }

  /**
   * Shared buffers kept between runs (up to 64 MB each): fresh memory costs a page fault per 4 KB
   * page when first written, which under load was measured at 80 ms for 8 MB here. A run never
   * hands them out: the driver copies what it keeps (the values of `returnValues`, of adaptive
   * sequences) before the next run.
   */
  const kept = new Map<string, SharedArrayBuffer>();
  function shared(key: string, bytes: number): SharedArrayBuffer {
    const have = kept.get(key);
    if (have !== undefined && have.byteLength >= bytes) return have;
    const fresh = new SharedArrayBuffer(Math.max(bytes, 8));
    if (bytes <= KEEP_BYTES) kept.set(key, fresh);
    else kept.delete(key);
    return fresh;
  }

  /** The sorted tails the workers collected for the values of the last fixed run, if any. */
  let collected: { values: Float64Array; lows: Float64Array[]; highs: Float64Array[] } | undefined;

  /**
   * Runs the blocks of a request on every worker (they claim blocks from a shared counter). For a
   * fixed run the workers also collect the coverage-interval tails of their blocks, with
   * thresholds from block 0, and sort them combined (one side per worker), so the intervals need
   * no second pass over the values and no merge on this thread.
   */
  async function runBlocks(
    plan: EnginePlan,
    request: BlockRequest,
    progress: ProgressReporter,
    coverage: number | undefined,
    signal: AbortSignalLike | undefined,
  ): Promise<BlockReply> {
    const values = shared('values', 8 * request.trials);
    const stats = shared('stats', 16 * request.blockCount);
    const control = shared('control', 4 * CONTROL.length);
    const slots = new Int32Array(control, 0, CONTROL.length);
    slots.fill(0);
    slots[CONTROL.failed] = request.blockCount;
    const m = request.trials;
    const candidates = coverage === undefined ? 0 : m - coveredCount(coverage, m);
    // Thresholds come from block 0's values (thresholdsFromSample): a side holds at most
    // M − q + 2.5 % of M + 1024 values overall; each worker gets room for its share, twice over.
    const wantTails = coverage !== undefined && m >= 16 * 8192 && candidates < m / 2;
    const room = Math.ceil((candidates + 0.025 * m + 1024) * Math.min(1, 2 / workers.length));
    const thresholds = shared('thresholds', 24);
    const buffers = workers.map((_, w) =>
      wantTails ? { low: shared(`low${w}`, 8 * room), high: shared(`high${w}`, 8 * room) } : undefined,
    );
    // The combined tails: every worker copies its own in; worker 0 sorts the lower, worker 1 the
    // upper (a single worker both), in parallel, so this thread walks two sorted arrays.
    const combined = Math.min(m, room * workers.length);
    const allLow = wantTails ? shared('allLow', 8 * combined) : undefined;
    const allHigh = wantTails ? shared('allHigh', 8 * combined) : undefined;
    const sorts = (w: number): 0 | 1 | 2 | 3 => (workers.length === 1 ? 3 : w === 0 ? 1 : w === 1 ? 2 : 0);
    const messages: WorkerMessage[] = buffers.map((b, w) => ({
      type: 'run',
      plan,
      ...request,
      values,
      stats,
      control,
      tails:
        b === undefined
          ? undefined
          : {
              trials: m,
              candidates,
              thresholds,
              low: b.low,
              high: b.high,
              allLow: allLow as SharedArrayBuffer,
              allHigh: allHigh as SharedArrayBuffer,
              workers: workers.length,
              sorts: sorts(w),
            },
    }));
    // A throw from onProgress or an aborted signal abandons the run: no further block is started.
    let stopError: { error: unknown } | undefined;
    const stop = (error: unknown): void => {
      stopError = { error };
      Atomics.store(slots, CONTROL.failed, -1);
    };
    let reported = -1;
    const poll = (): void => {
      const done = Atomics.load(slots, CONTROL.done);
      if (done === reported || stopError !== undefined) return;
      reported = done;
      try {
        progress.report(request.trialsBefore + done, request);
      } catch (error) {
        stop(error);
      }
    };
    const watch = (): void => {
      if (stopError !== undefined) return;
      try {
        throwIfAborted(signal);
      } catch (error) {
        stop(error);
      }
    };
    const timer = progress.active ? setInterval(poll, PROGRESS_MILLIS) : undefined;
    const watcher = signal === undefined ? undefined : setInterval(watch, SIGNAL_MILLIS);
    let replies: WorkerReply[];
    try {
      replies = await broadcast(messages);
    } catch (error) {
      // A worker failed or stopped: the others stop claiming blocks and waiting for it.
      Atomics.store(slots, CONTROL.failed, -1);
      throw error;
    } finally {
      if (timer !== undefined) clearInterval(timer);
      if (watcher !== undefined) clearInterval(watcher);
    }
    if (progress.active) poll();
    if (stopError !== undefined) throw stopError.error;
    const result = new Float64Array(values, 0, m);
    collected = undefined;
    const sorted = replies.every((r, w) => r.type === 'done' && (r.tails || sorts(w) === 0));
    if (wantTails && sorted && Atomics.load(slots, CONTROL.tailsLost) === 0) {
      collected = {
        values: result,
        lows: [new Float64Array(allLow as SharedArrayBuffer, 0, Atomics.load(slots, CONTROL.lowFill))],
        highs: [new Float64Array(allHigh as SharedArrayBuffer, 0, Atomics.load(slots, CONTROL.highFill))],
      };
    }
    return { values: result, stats: new Float64Array(stats, 0, 2 * request.blockCount) };
  }

  /**
   * The coverage intervals: from the tails the workers collected when these are the values of
   * the last fixed run (any split of the values gives the same order statistics), else — and
   * whenever the collected tails fall short — by `sampleIntervalsInPlace` on this thread.
   */
  function intervals(values: Float64Array, coverage: number): SampleIntervals {
    const tails = collected;
    collected = undefined;
    if (tails !== undefined && tails.values === values) {
      const r = intervalsFromSortedParts(tails.lows, tails.highs, coverage, values.length);
      if (r !== undefined) {
        intervalRoutes.fromWorkers++;
        return r;
      }
    }
    intervalRoutes.onMainThread++;
    return sampleIntervalsInPlace(values, coverage);
  }

  let queue: Promise<unknown> = Promise.resolve();
  return {
    workers: count,
    run(runOptions) {
      if (closed) return Promise.reject(closedError());
      const job = queue.then(async () => {
        if (closed) throw closedError();
        const ro = checkOptions('options', runOptions, {
          known: monteCarloOptionKeys.filter((k) => k !== 'model'),
          required: ['inputs'],
        });
        const setup = prepareMonteCarlo(ro);
        checkMonteCarloModel(mainModel, setup.plan.names, ro);
        throwIfAborted(setup.signal);
        // Adaptive runs take two sequences per worker at a time (a sequence is a block or two).
        const procedure = runProcedure({ ...setup.settings, lookahead: 2 * count });
        let gum: Propagation | undefined;
        let gumError: { error: unknown } | undefined;
        let gumDone = false;
        let step = procedure.next();
        while (!step.done) {
          const request = step.value;
          if (request.kind === 'intervals') {
            step = procedure.next(intervals(request.values, request.coverage));
            continue;
          }
          const pending = runBlocks(
            setup.plan,
            request,
            setup.progress,
            setup.settings.adaptive === undefined ? setup.coverage : undefined,
            setup.signal,
          );
          if (!gumDone) {
            // The law of propagation runs on this thread while the workers draw the trials. A
            // failure of it is thrown only after the trials, as one thread meets them in that order.
            gumDone = true;
            try {
              gum = gumFor(setup, ro, mainModel as MeasurementModel);
            } catch (error) {
              gumError = { error };
            }
          }
          const reply = await pending;
          throwIfAborted(setup.signal); // an adaptive run stops between its requests too
          step = procedure.next(reply);
        }
        if (gumError !== undefined) throw gumError.error;
        return monteCarloResult(setup, step.value, gum);
      });
      queue = job.catch(() => undefined);
      return job;
    },
    async close() {
      closed = true;
      kept.clear();
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

/**
 * Runs one Monte Carlo evaluation on worker threads and stops them: {@link createMonteCarloPool},
 * one `run`, `close`.
 *
 * @remarks
 * Same procedure, results and errors as `monteCarlo` (bit-identical for the same seed, whatever
 * `workers`); starting threads costs tens of milliseconds, so for repeated runs keep a pool.
 *
 * @param options - As `monteCarlo`, with `model` a module reference, plus `workers`.
 * @returns The Monte Carlo result.
 * @throws {@link @bridgework/core!BridgeworkError} as `monteCarlo` and {@link createMonteCarloPool}.
 * @example
 * ```ts
 * const r = await monteCarloInWorkers({
 *   model: { module: new URL('./model.js', import.meta.url), exportName: 'model' },
 *   inputs: { a: { value: 2, standardUncertainty: 0.1 }, b: { value: 3, standardUncertainty: 0.2 } },
 *   trials: 1e6,
 *   workers: 2,
 * });
 * ```
 */
export async function monteCarloInWorkers(options: MonteCarloInWorkersOptions): Promise<MonteCarloResult> {
  const o = checkOptions('options', options, {
    known: [...monteCarloOptionKeys, 'workers'],
    required: ['model', 'inputs'],
  });
  const { model, workers, ...rest } = o;
  const pool = await createMonteCarloPool({
    model: model as ModelReference,
    ...(workers === undefined ? {} : { workers: workers as number }),
  });
  try {
    return await pool.run(rest as PooledMonteCarloOptions);
  } finally {
    await pool.close();
  }
}
