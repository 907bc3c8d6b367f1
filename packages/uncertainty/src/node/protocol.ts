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
  /** Workers done with their blocks (each counts once per run, whether it succeeded or failed). */
  arrived: 4,
  /** Values copied into the combined lower tail so far (the next free index). */
  lowFill: 5,
  /** Values copied into the combined upper tail so far. */
  highFill: 6,
  /** 1 once any worker could not collect its tails (the intervals are then computed on the main thread). */
  tailsLost: 7,
  /** Number of slots. */
  length: 8,
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
  /**
   * The combined tails of all workers, shared Float64: each worker copies its tails in after its
   * last block, and once every worker has, one worker sorts the lower tail and another the upper
   * (the only one sorts both), in parallel, so the main thread reads two sorted arrays.
   */
  readonly allLow: SharedArrayBuffer;
  readonly allHigh: SharedArrayBuffer;
  /** Number of workers taking part in the run. */
  readonly workers: number;
  /** Which sides this worker sorts: 0 none, 1 the lower tail, 2 the upper, 3 both. */
  readonly sorts: 0 | 1 | 2 | 3;
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
      /** Whether the combined tails this worker sorted (if any) are in place: false when they could not be collected. */
      readonly tails: boolean;
    }
  | TransferredError;
