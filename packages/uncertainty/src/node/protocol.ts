/** Messages between the Monte Carlo pool and its worker threads. */
import type { ErrorCode } from '@bridgework/core';
import type { EnginePlan } from '../internal/engine.js';
import type { TailThresholds } from '../internal/select.js';

/** Main thread → worker. */
export type WorkerMessage =
  | { readonly type: 'load'; readonly module: string; readonly exportName: string }
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
      /** Shared Int32 counter: the next block to claim. */
      readonly counter: SharedArrayBuffer;
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

/** Worker → main thread. */
export type WorkerReply =
  | { readonly type: 'loaded' }
  | { readonly type: 'done' }
  | { readonly type: 'tails'; readonly low: number; readonly high: number }
  | {
      readonly type: 'error';
      readonly code: ErrorCode | undefined;
      readonly message: string;
      readonly param: string | undefined;
      readonly value: number | undefined;
    };
