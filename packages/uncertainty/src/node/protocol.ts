/** Messages between the Monte Carlo pool and its worker threads. */
import type { ErrorCode } from '@bridgework/core';
import type { EnginePlan } from '../internal/engine.js';
import type { TailThresholds } from '../internal/select.js';

/** Slots of the shared Int32 control array of a run. */
export const CONTROL = {
  /** The next block to claim. */
  next: 0,
  /** The lowest block in which a model failed (blockCount while none has). */
  failed: 1,
  /** Trials done (for progress). */
  done: 2,
  /** Number of slots. */
  length: 3,
} as const;

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
    }
  | {
      readonly type: 'tails';
      /** Shared Float64 model values. */
      readonly values: SharedArrayBuffer;
      /** The range of trials this worker scans. */
      readonly from: number;
      readonly to: number;
      readonly thresholds: TailThresholds;
      /** Shared Float64 buffers of `thresholds.capacity` values for the two tails. */
      readonly low: SharedArrayBuffer;
      readonly high: SharedArrayBuffer;
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
  | { readonly type: 'done' }
  | { readonly type: 'tails'; readonly low: number; readonly high: number }
  | TransferredError;
