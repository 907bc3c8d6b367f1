/// <reference types="node" preserve="true" />
/**
 * Worker-thread entry of the Monte Carlo pool: imports the model module named by the pool, then
 * runs blocks of trials into shared memory with the same kernel as the in-process runner.
 */
import { parentPort } from 'node:worker_threads';
import { isBridgeworkError } from '@bridgework/core';
import { BLOCK_TRIALS, createBlockRunner } from '../internal/engine.js';
import { resolveModel } from '../internal/model.js';
import { extractTails, sortTailPart, thresholdsFromSample } from '../internal/select.js';
import { loadModelExport } from './loadModel.js';
import {
  CONTROL,
  type TailBuffers,
  type TransferredError,
  type WorkerMessage,
  type WorkerReply,
} from './protocol.js';

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

/** The tails of this worker's blocks: extracted block by block once block 0 gave the thresholds. */
class TailCollector {
  private readonly thresholds: Float64Array;
  private readonly low: Float64Array;
  private readonly high: Float64Array;
  private readonly pending: number[] = [];
  private nl = 0;
  private nh = 0;
  private failed = false;

  constructor(
    private readonly buffers: TailBuffers,
    private readonly control: Int32Array,
    private readonly values: Float64Array,
  ) {
    this.thresholds = new Float64Array(buffers.thresholds);
    this.low = new Float64Array(buffers.low);
    this.high = new Float64Array(buffers.high);
  }

  /** Publishes the thresholds from block 0's values (the first 16 384 trials, or all of them). */
  publish(count: number): void {
    const sample = this.values.slice(0, count);
    const t =
      count >= 8192 ? thresholdsFromSample(sample, this.buffers.trials, this.buffers.candidates) : undefined;
    if (t !== undefined) {
      this.thresholds[0] = t.below;
      this.thresholds[1] = t.above;
      this.thresholds[2] = t.capacity;
    }
    this.abandonOr(t === undefined ? 2 : 1);
  }

  /** Marks block 0 as done without thresholds (2), or with them (1), and wakes any waiting worker. */
  abandonOr(state: 1 | 2): void {
    Atomics.store(this.control, CONTROL.ready, state);
    Atomics.notify(this.control, CONTROL.ready);
  }

  /** Takes the tails of a block now, or later if the thresholds are not known yet. */
  add(from: number, to: number): void {
    const ready = Atomics.load(this.control, CONTROL.ready);
    if (ready === 0) this.pending.push(from, to);
    else if (ready === 1) this.extract(from, to);
  }

  /**
   * After the last block: takes the blocks that waited for block 0's thresholds, then copies this
   * worker's tails into the combined buffers (or marks the tails lost when they could not be
   * collected or do not fit).
   */
  contribute(): void {
    const control = this.control;
    // A worker that collected nothing has nothing to add, whether or not block 0 is done yet
    // (unless block 0 gave no thresholds: then the tails are lost for every worker).
    const empty = this.pending.length === 0 && this.nl === 0 && this.nh === 0;
    if (empty && !this.failed && Atomics.load(control, CONTROL.ready) !== 2) return;
    if (this.pending.length > 0) {
      // Block 0 is being run by another worker: wait for it (a failure anywhere ends the wait).
      while (Atomics.load(control, CONTROL.ready) === 0 && Atomics.load(control, CONTROL.failed) >= 0) {
        Atomics.wait(control, CONTROL.ready, 0, 20);
      }
      if (Atomics.load(control, CONTROL.ready) === 1) {
        for (let k = 0; k < this.pending.length; k += 2) this.extract(this.pending[k]!, this.pending[k + 1]!);
      } else this.failed = true;
    }
    if (this.failed || Atomics.load(control, CONTROL.ready) !== 1) {
      Atomics.store(control, CONTROL.tailsLost, 1);
      return;
    }
    const allLow = new Float64Array(this.buffers.allLow);
    const allHigh = new Float64Array(this.buffers.allHigh);
    const lowAt = Atomics.add(control, CONTROL.lowFill, this.nl);
    const highAt = Atomics.add(control, CONTROL.highFill, this.nh);
    if (lowAt + this.nl > allLow.length || highAt + this.nh > allHigh.length) {
      Atomics.store(control, CONTROL.tailsLost, 1);
      return;
    }
    allLow.set(this.low.subarray(0, this.nl), lowAt);
    allHigh.set(this.high.subarray(0, this.nh), highAt);
  }

  /**
   * Once every worker has arrived (see `run`), sorts the combined side(s) this worker is given;
   * false when the tails were lost or the run was stopped before every worker arrived.
   */
  sortSides(): boolean {
    const { control, buffers } = this;
    if (buffers.sorts === 0) return true;
    for (;;) {
      const arrived = Atomics.load(control, CONTROL.arrived);
      if (arrived >= buffers.workers || Atomics.load(control, CONTROL.failed) < 0) break;
      Atomics.wait(control, CONTROL.arrived, arrived, 20);
    }
    if (
      Atomics.load(control, CONTROL.arrived) < buffers.workers ||
      Atomics.load(control, CONTROL.tailsLost) !== 0
    )
      return false;
    if ((buffers.sorts & 1) !== 0)
      sortTailPart(new Float64Array(buffers.allLow, 0, Atomics.load(control, CONTROL.lowFill)));
    if ((buffers.sorts & 2) !== 0)
      sortTailPart(new Float64Array(buffers.allHigh, 0, Atomics.load(control, CONTROL.highFill)));
    return true;
  }

  private extract(from: number, to: number): void {
    if (this.failed) return;
    const t = {
      below: this.thresholds[0] as number,
      above: this.thresholds[1] as number,
      capacity: Math.min(this.thresholds[2] as number, this.low.length),
    };
    const n = extractTails(this.values, from, to, t, this.low, this.high, this.nl, this.nh);
    if (n.low < 0) this.failed = true;
    this.nl = n.low;
    this.nh = n.high;
  }
}

function run(message: Extract<WorkerMessage, { type: 'run' }>): WorkerReply {
  const control = new Int32Array(message.control);
  // Every worker arrives exactly once per run, whatever happens, so a sorting worker never waits
  // for one that is gone.
  let arrived = false;
  let contributed = false;
  const arrive = (): void => {
    if (arrived) return;
    arrived = true;
    // A worker leaving without its tails (a failure) leaves the combined tails incomplete.
    if (message.tails !== undefined && !contributed) Atomics.store(control, CONTROL.tailsLost, 1);
    Atomics.add(control, CONTROL.arrived, 1);
    Atomics.notify(control, CONTROL.arrived);
  };
  try {
    const runner = createBlockRunner(message.plan, resolveModel(model, message.plan.names));
    const values = new Float64Array(message.values);
    const stats = new Float64Array(message.stats);
    const tails = message.tails === undefined ? undefined : new TailCollector(message.tails, control, values);
    try {
      for (;;) {
        const b = Atomics.add(control, CONTROL.next, 1);
        // Blocks are claimed in increasing order, so every block below a failed one is run.
        if (b >= message.blockCount || b > Atomics.load(control, CONTROL.failed)) {
          if (b === 0) tails?.abandonOr(2);
          break;
        }
        const count = Math.min(BLOCK_TRIALS, message.trials - b * BLOCK_TRIALS);
        try {
          runner.runBlock(message.firstBlock + b, count, values, b * BLOCK_TRIALS, stats, b);
        } catch (error) {
          recordFailure(control, b);
          if (b === 0) tails?.abandonOr(2);
          return failure(error, runner.failedTrial >= 0 ? runner.failedTrial : undefined);
        }
        Atomics.add(control, CONTROL.done, count);
        if (tails !== undefined) {
          if (b === 0) tails.publish(count);
          tails.add(b * BLOCK_TRIALS, b * BLOCK_TRIALS + count);
        }
      }
    } finally {
      runner.release();
    }
    tails?.contribute();
    contributed = true;
    arrive();
    return { type: 'done', tails: tails?.sortSides() ?? false };
  } finally {
    arrive();
  }
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
      port.postMessage(run(message));
    } catch (error) {
      port.postMessage(failure(error, undefined));
    }
  })();
});
