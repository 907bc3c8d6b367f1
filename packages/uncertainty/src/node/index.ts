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
import { BridgeworkError, checkInteger, checkObject, formatValue } from '@bridgework/core';
import type { BlockReply, BlockRequest } from '../internal/driver.js';
import { runProcedure } from '../internal/driver.js';
import type { EnginePlan } from '../internal/engine.js';
import {
  coveredCount,
  intervalsBySelection,
  intervalsFromSortedParts,
  sampleIntervalsInPlace,
  tailThresholds,
  type SampleIntervals,
} from '../internal/select.js';
import {
  gumFor,
  monteCarloResult,
  prepareMonteCarlo,
  type MonteCarloOptions,
  type MonteCarloResult,
} from '../monteCarlo.js';
import type { Propagation } from '../propagate.js';
import type { MeasurementModel } from '../types.js';
import type { WorkerMessage, WorkerReply } from './protocol.js';

/** Where the workers find the model: a module and the name of the function it exports. */
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
  /** The exported function's name. Default `'model'`. */
  readonly exportName?: string;
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
   */
  run(options: PooledMonteCarloOptions): Promise<MonteCarloResult>;
  /** Terminates the workers. */
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

function toError(reply: Extract<WorkerReply, { type: 'error' }>): Error {
  if (reply.code === undefined) return new Error(reply.message);
  return new BridgeworkError(reply.code, reply.message, {
    ...(reply.param === undefined ? {} : { param: reply.param }),
    ...(reply.value === undefined ? {} : { value: reply.value }),
  });
}

/**
 * Starts worker threads that run Monte Carlo evaluations of one model.
 *
 * @remarks
 * Each worker imports the model module once. A run uses the procedure of `monteCarlo` unchanged:
 * the main thread checks the options and plans the seeding blocks; the workers claim blocks from
 * a shared counter and write model values and block statistics into shared memory; the main
 * thread merges the block statistics in block order and selects the coverage intervals. Every
 * block's values depend only on the seed and the block's index (see `monteCarlo`), so the result
 * is bit-identical to `monteCarlo` in one thread, whatever the number of workers. The GUM
 * comparison runs on the main thread, which imports the model too.
 *
 * When running from the TypeScript sources (the `@bridgework/source` condition), workers are
 * started with the tsx loader and that condition. Idle workers do not keep the process alive.
 *
 * @param options - The model module and the number of workers.
 * @returns The pool; call `close()` when done.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for a bad module reference or an
 *   export that is not a function; `not-integer`, `out-of-range` for a bad worker count.
 * @example
 * ```ts
 * // model.js: export const model = ({ a, b }) => a * b;
 * const pool = await createMonteCarloPool({ model: { module: new URL('./model.js', import.meta.url) }, workers: 2 });
 * const result = await pool.run({ inputs: { a: { value: 2, standardUncertainty: 0.1 }, b: { value: 3, standardUncertainty: 0.2 } } });
 * await pool.close();
 * ```
 */
export async function createMonteCarloPool(options: MonteCarloPoolOptions): Promise<MonteCarloPool> {
  const o = checkObject('options', options);
  const reference = checkObject('model', o['model']);
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
  const count =
    o['workers'] === undefined
      ? availableParallelism()
      : checkInteger('workers', o['workers'], { min: 1, max: 256 });
  const imported = (await import(href)) as Record<string, unknown>;
  const mainModel = imported[exportName];
  if (typeof mainModel !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`model.exportName\` must name a function exported by ${href}; '${exportName}' is ${typeof mainModel}`,
      {
        param: 'model.exportName',
        value: exportName,
      },
    );
  }
  const workers = Array.from({ length: count }, startWorker);
  const call = (worker: Worker, message: WorkerMessage): Promise<WorkerReply> =>
    new Promise((resolve, reject) => {
      const onMessage = (reply: WorkerReply): void => {
        worker.off('error', onError);
        resolve(reply);
      };
      const onError = (error: Error): void => {
        worker.off('message', onMessage);
        reject(error);
      };
      worker.once('message', onMessage);
      worker.once('error', onError);
      worker.postMessage(message);
    });
  try {
    const loaded = await Promise.all(workers.map((w) => call(w, { type: 'load', module: href, exportName })));
    const bad = loaded.find((r): r is Extract<WorkerReply, { type: 'error' }> => r.type === 'error');
    if (bad !== undefined) throw toError(bad);
  } catch (error) {
    await Promise.all(workers.map((w) => w.terminate()));
    throw error;
  }
  for (const w of workers) w.unref();

  /** Sends one message to every worker and waits for all replies; the first error is thrown. */
  async function broadcast(messages: readonly WorkerMessage[], onError?: () => void): Promise<WorkerReply[]> {
    for (const w of workers) w.ref();
    try {
      const replies = await Promise.all(
        workers.map((w, i) =>
          call(w, messages[i] as WorkerMessage).then((reply) => {
            if (reply.type === 'error') onError?.();
            return reply;
          }),
        ),
      );
      const bad = replies.find((r): r is Extract<WorkerReply, { type: 'error' }> => r.type === 'error');
      if (bad !== undefined) throw toError(bad);
      return replies;
    } finally {
      for (const w of workers) w.unref();
    }
  }

  /** Starts the blocks of a request on every worker (they claim blocks from a shared counter). */
  function startBlocks(plan: EnginePlan, request: BlockRequest): Promise<BlockReply> {
    const values = new SharedArrayBuffer(8 * request.trials);
    const stats = new SharedArrayBuffer(16 * request.blockCount);
    const counter = new SharedArrayBuffer(4);
    const message: WorkerMessage = { type: 'run', plan, ...request, values, stats, counter };
    // A failed block stops the others from claiming more.
    const stop = (): void => void Atomics.store(new Int32Array(counter), 0, request.blockCount);
    return broadcast(
      workers.map(() => message),
      stop,
    ).then(() => ({ values: new Float64Array(values), stats: new Float64Array(stats) }));
  }

  /**
   * The coverage intervals with the tails extracted and sorted in parallel: each worker scans a
   * contiguous range and sorts what it found (stably); the parts, merged stably in range order,
   * are exactly what one scan in index order and one stable sort give, so the result equals
   * `sampleIntervalsInPlace` bit for bit (including its fallback decisions).
   */
  async function intervals(values: Float64Array, coverage: number): Promise<SampleIntervals> {
    const m = values.length;
    const candidates = m - coveredCount(coverage, m);
    const t =
      values.buffer instanceof SharedArrayBuffer && candidates < m / 2
        ? tailThresholds(values, candidates)
        : undefined;
    if (t === undefined) return sampleIntervalsInPlace(values, coverage);
    const parts = workers.map((_, w) => ({
      from: Math.floor((w * m) / workers.length),
      to: Math.floor(((w + 1) * m) / workers.length),
      low: new SharedArrayBuffer(8 * t.capacity),
      high: new SharedArrayBuffer(8 * t.capacity),
    }));
    const replies = await broadcast(
      parts.map((p) => ({
        type: 'tails',
        values: values.buffer as SharedArrayBuffer,
        from: p.from,
        to: p.to,
        thresholds: t,
        low: p.low,
        high: p.high,
      })),
    );
    const counts = replies.map((r) => (r.type === 'tails' ? r : { low: -1, high: -1 }));
    const total = (side: 'low' | 'high'): number => counts.reduce((a, c) => a + c[side], 0);
    if (counts.every((c) => c.low >= 0)) {
      const side = (which: 'low' | 'high'): Float64Array[] =>
        parts.map(
          (p, w) => new Float64Array(p[which], 0, (counts[w] as { low: number; high: number })[which]),
        );
      const r = intervalsFromSortedParts(side('low'), side('high'), t.capacity, coverage, m);
      if (r !== undefined) return r;
    }
    return intervalsBySelection(values, coverage);
  }

  let queue: Promise<unknown> = Promise.resolve();
  let closed = false;
  return {
    workers: count,
    run(runOptions) {
      const job = queue.then(async () => {
        if (closed) throw new Error('the Monte Carlo pool is closed');
        const ro = { ...checkObject('options', runOptions), model: mainModel };
        const setup = prepareMonteCarlo(ro);
        const procedure = runProcedure(setup.settings);
        let gum: Propagation | undefined;
        let gumDone = false;
        let step = procedure.next();
        while (!step.done) {
          const request = step.value;
          if (request.kind === 'intervals') {
            step = procedure.next(await intervals(request.values, request.coverage));
            continue;
          }
          const pending = startBlocks(setup.plan, request);
          if (!gumDone) {
            // The law of propagation runs on this thread while the workers draw the trials.
            gumDone = true;
            try {
              gum = gumFor(setup, ro, mainModel as MeasurementModel);
            } catch (error) {
              await pending.catch(() => undefined);
              throw error;
            }
          }
          step = procedure.next(await pending);
        }
        return monteCarloResult(setup, step.value, gum);
      });
      queue = job.catch(() => undefined);
      return job;
    },
    async close() {
      closed = true;
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
  const o = checkObject('options', options);
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
