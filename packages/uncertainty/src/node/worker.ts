/// <reference types="node" />
/**
 * Worker-thread entry of the Monte Carlo pool: imports the model module named by the pool, then
 * runs blocks of trials into shared memory with the same kernel as the in-process runner.
 */
import { parentPort } from 'node:worker_threads';
import { isBridgeworkError } from '@bridgework/core';
import { BLOCK_TRIALS, createBlockRunner, type EngineModel } from '../internal/engine.js';
import { extractTails, sortTailPart } from '../internal/select.js';
import type { WorkerMessage, WorkerReply } from './protocol.js';

if (parentPort === null) throw new Error('this module runs as a worker thread');
const port = parentPort;
let model: EngineModel | undefined;

function failure(error: unknown): WorkerReply {
  if (isBridgeworkError(error)) {
    return {
      type: 'error',
      code: error.code,
      message: error.message,
      param: error.param,
      value: typeof error.value === 'number' ? error.value : undefined,
    };
  }
  return {
    type: 'error',
    code: undefined,
    message: error instanceof Error ? error.message : String(error),
    param: undefined,
    value: undefined,
  };
}

port.on('message', (message: WorkerMessage) => {
  void (async () => {
    try {
      if (message.type === 'load') {
        const module = (await import(message.module)) as Record<string, unknown>;
        const candidate = module[message.exportName];
        if (typeof candidate !== 'function') {
          port.postMessage({
            type: 'error',
            code: 'wrong-type',
            message: `\`model.exportName\` must name a function exported by ${message.module}; '${message.exportName}' is ${typeof candidate}`,
            param: 'model.exportName',
            value: undefined,
          } satisfies WorkerReply);
          return;
        }
        model = candidate as EngineModel;
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
      if (model === undefined) throw new Error('no model loaded');
      const runner = createBlockRunner(message.plan, model);
      const values = new Float64Array(message.values);
      const stats = new Float64Array(message.stats);
      const counter = new Int32Array(message.counter);
      try {
        for (;;) {
          const b = Atomics.add(counter, 0, 1);
          if (b >= message.blockCount) break;
          const count = Math.min(BLOCK_TRIALS, message.trials - b * BLOCK_TRIALS);
          runner.runBlock(message.firstBlock + b, count, values, b * BLOCK_TRIALS, stats, b);
        }
      } finally {
        runner.release();
      }
      port.postMessage({ type: 'done' } satisfies WorkerReply);
    } catch (error) {
      port.postMessage(failure(error));
    }
  })();
});
