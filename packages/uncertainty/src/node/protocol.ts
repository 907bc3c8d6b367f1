/** Messages between the Monte Carlo pool and its worker threads. */
import type { ErrorCode } from '@bridgework/core';
import type { EnginePlan } from '../internal/engine.js';

/** Slots of the shared Int32 control array of a run. */
export const CONTROL = {
  /** The next block to claim. */
  next: 0,
  /** The lowest block in which a model failed (blockCount while none has). */
  failed: 1,
  /** Trials done (for progress). */
  done: 2,
  /** Tail thresholds: 0 while block 0 is not done, 1 when they are in place, 2 when there are none. */
  ready: 3,
  /** Number of slots. */
  length: 4,
} as const;

/** Where a worker collects the coverage-interval tails of the blocks it runs. */
export interface TailBuffers {
  /** Number of values the intervals span the tails of: the request's trials. */
  readonly trials: number;
  /** M − q: how many values each tail must hold at least. */
  readonly candidates: number;
  /** Shared Float64 [below, above, capacity], written by the worker that runs block 0. */
  readonly thresholds: SharedArrayBuffer;
  /** This worker's shared Float64 buffers for the two tails (room for every value of the request). */
  readonly low: SharedArrayBuffer;
  readonly high: SharedArrayBuffer;
}

/** Main thread → worker. */
export type WorkerMessage =
  | {
      readonly type: 'load';
      readonly module: string;
      readonly exportName: string;
      /** Whether the export is a factory to call with `argument`. */
      readonly hasArgument: boolean;
      readonly argument: unknown;
    }
  | {
      readonly type: 'run';
      readonly plan: EnginePlan;
      readonly firstBlock: number;
      readonly blockCount: number;
      readonly trials: number;
      /** Shared Float64 model values, `trials` long. */
      readonly values: SharedArrayBuffer;
      /** Shared Float64 block statistics, 2·blockCount long. */
      readonly stats: SharedArrayBuffer;
      /** Shared Int32 control slots ({@link CONTROL}). */
      readonly control: SharedArrayBuffer;
      /** Collect the tails of the blocks run, sorted, for the coverage intervals (fixed runs). */
      readonly tails: TailBuffers | undefined;
    };

/** A BridgeworkError (or a model's own error) as it crosses to the main thread. */
export interface TransferredError {
  readonly type: 'error';
  readonly code: ErrorCode | undefined;
  readonly message: string;
  readonly param: string | undefined;
  readonly value: unknown;
  readonly limit: number | string | readonly (number | string)[] | undefined;
  /** The run's trial at which the model failed, when it was a trial. */
  readonly trial: number | undefined;
  /** Name and message of the underlying error, when there is one. */
  readonly cause: { readonly name: string; readonly message: string } | undefined;
}

/** Worker → main thread. */
export type WorkerReply =
  | { readonly type: 'loaded' }
  | {
      readonly type: 'done';
      /** Values in this worker's sorted tails, or −1 when they could not be collected. */
      readonly low: number;
      readonly high: number;
    }
  | TransferredError;
