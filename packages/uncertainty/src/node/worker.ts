/// <reference types="node" preserve="true" />
/**
 * Worker-thread entry of the Monte Carlo pool: imports the model module named by the pool, then
 * runs blocks of trials into shared memory with the same kernel as the in-process runner.
 */
import { parentPort } from 'node:worker_threads';
import { isBridgeworkError } from '@bridgework/core';
import { BLOCK_TRIALS, createBlockRunner } from '../internal/engine.js';
import { resolveModel } from '../internal/model.js';
import { extractTails, sortTailPart } from '../internal/select.js';
import { loadModelExport } from './loadModel.js';
import { CONTROL, type TransferredError, type WorkerMessage, type WorkerReply } from './protocol.js';

if (parentPort === null) throw new Error('this module runs as a worker thread');
const port = parentPort;
let model: unknown;

function cloneable(value: unknown): unknown {
  try {
    return structuredClone(value);
  } catch {
    return undefined;
  }
}

function failure(error: unknown, trial: number | undefined): TransferredError {
  const cause = isBridgeworkError(error) ? error.cause : error;
  const causeOf =
    cause instanceof Error
      ? { name: cause.name, message: cause.message }
      : cause === undefined
        ? undefined
        : { name: 'Error', message: String(cause) };
  if (isBridgeworkError(error)) {
    return {
      type: 'error',
      code: error.code,
      message: error.message,
      param: error.param,
      value: cloneable(error.value),
      limit: error.limit,
      trial,
      cause: causeOf,
    };
  }
  return {
    type: 'error',
    code: undefined,
    message: error instanceof Error ? error.message : String(error),
    param: undefined,
    value: undefined,
    limit: undefined,
    trial,
    cause: causeOf,
  };
}

/** Lowers the shared "first failed block" to `block` unless a lower one is there already. */
function recordFailure(control: Int32Array, block: number): void {
  for (;;) {
    const current = Atomics.load(control, CONTROL.failed);
    if (current <= block) return;
    if (Atomics.compareExchange(control, CONTROL.failed, current, block) === current) return;
  }
}

function run(message: Extract<WorkerMessage, { type: 'run' }>): WorkerReply {
  const runner = createBlockRunner(message.plan, resolveModel(model, message.plan.names));
  const values = new Float64Array(message.values);
  const stats = new Float64Array(message.stats);
  const control = new Int32Array(message.control);
  try {
    for (;;) {
      const b = Atomics.add(control, CONTROL.next, 1);
      // Blocks are claimed in increasing order, so every block below a failed one is run.
      if (b >= message.blockCount || b > Atomics.load(control, CONTROL.failed)) break;
      const count = Math.min(BLOCK_TRIALS, message.trials - b * BLOCK_TRIALS);
      try {
        runner.runBlock(message.firstBlock + b, count, values, b * BLOCK_TRIALS, stats, b);
      } catch (error) {
        recordFailure(control, b);
        return failure(error, runner.failedTrial >= 0 ? runner.failedTrial : undefined);
      }
      Atomics.add(control, CONTROL.done, count);
    }
  } finally {
    runner.release();
  }
  return { type: 'done' };
}

port.on('message', (message: WorkerMessage) => {
  void (async () => {
    try {
      if (message.type === 'load') {
        model = await loadModelExport(
          message.module,
          message.exportName,
          message.hasArgument,
          message.argument,
        );
        port.postMessage({ type: 'loaded' } satisfies WorkerReply);
        return;
      }
      if (message.type === 'tails') {
        const low = new Float64Array(message.low);
        const high = new Float64Array(message.high);
        const counts = extractTails(
          new Float64Array(message.values),
          message.from,
          message.to,
          message.thresholds,
          low,
          high,
        );
        if (counts.low >= 0) {
          sortTailPart(low.subarray(0, counts.low));
          sortTailPart(high.subarray(0, counts.high));
        }
        port.postMessage({ type: 'tails', ...counts } satisfies WorkerReply);
        return;
      }
      port.postMessage(run(message));
    } catch (error) {
      port.postMessage(failure(error, undefined));
    }
  })();
});
