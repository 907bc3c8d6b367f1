/**
 * The messages between the main thread and a conversion worker thread (see
 * {@link startConversionLanes} and `conversionWorker.ts`), and how an error crosses between them
 * unchanged.
 */
import { BridgeworkError, isBridgeworkError, type ErrorCode, type SpecIssue } from '@bridgework/core';
import type { BlockDone, BlockJob, LaneSetup } from './blockConversion.js';

/** Main thread → worker. */
export type LaneRequest =
  | {
      readonly type: 'setup';
      /** How every block of the run is converted. */
      readonly setup: LaneSetup;
      /** One channel spec per lane (`Channel.spec`), made into channels in the worker. */
      readonly specs: readonly unknown[];
    }
  | ({ readonly type: 'block'; readonly id: number } & BlockJob);

/** An error as sent between threads. */
export type SentError =
  | {
      readonly bridgework: true;
      readonly code: ErrorCode;
      readonly message: string;
      readonly param: string | undefined;
      readonly value: unknown;
      readonly limit: number | string | readonly (number | string)[] | undefined;
      readonly issues: readonly SpecIssue[];
    }
  | { readonly bridgework: false; readonly name: string; readonly message: string; readonly stack: string };

/** Worker → main thread. */
export type LaneReply =
  | { readonly type: 'ready' }
  | ({ readonly type: 'done'; readonly id: number } & Omit<BlockDone, 'out'>)
  | { readonly type: 'failed'; readonly id: number | undefined; readonly error: SentError };

/**
 * An error made fit to send to another thread: a `BridgeworkError` keeps its code, message,
 * parameter, value (when it can be sent), limit and issues, so the user sees the message one thread
 * would have shown.
 *
 * @param error - Anything thrown.
 * @returns The error as data.
 */
export function sendError(error: unknown): SentError {
  if (isBridgeworkError(error)) {
    let value: unknown = error.value;
    try {
      structuredClone(value);
    } catch {
      value = String(value);
    }
    return {
      bridgework: true,
      code: error.code,
      message: error.message,
      param: error.param,
      value,
      limit: error.limit,
      issues: error.issues,
    };
  }
  const e = error instanceof Error ? error : new Error(String(error));
  return { bridgework: false, name: e.name, message: e.message, stack: e.stack ?? '' };
}

/**
 * The error a {@link SentError} describes, made again in this thread.
 *
 * @param sent - The error as data.
 * @returns A `BridgeworkError` with the same fields, or a plain `Error` with the same message.
 */
export function receiveError(sent: SentError): Error {
  if (sent.bridgework) {
    return new BridgeworkError(sent.code, sent.message, {
      ...(sent.param === undefined ? {} : { param: sent.param }),
      value: sent.value,
      ...(sent.limit === undefined ? {} : { limit: sent.limit }),
      issues: sent.issues,
    });
  }
  const e = new Error(sent.message);
  e.name = sent.name;
  e.stack = sent.stack;
  return e;
}
