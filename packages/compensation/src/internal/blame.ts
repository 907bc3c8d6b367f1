import { BridgeworkError, isBridgeworkError } from '@bridgework/core';

/** The caller's option an inner failure is reported against, and why. */
export interface Blame {
  readonly param: string;
  readonly value: unknown;
  /** What the option must do, in the message grammar: `must keep the reading inside the sensor's range`. */
  readonly requirement: string;
}

/**
 * Runs a computation on values derived from the caller's options; a `BridgeworkError` from
 * inside (which names an internal quantity such as `ratio` or `ohms`) is re-raised as
 * `out-of-range` against the option the caller gave, with the inner message as the reason.
 */
export function blameCaller<T>(blame: Blame, compute: () => T): T {
  try {
    return compute();
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    throw new BridgeworkError(
      'out-of-range',
      `\`${blame.param}\` ${blame.requirement}; got ${String(blame.value)} (${e.message})`,
      { param: blame.param, value: blame.value, cause: e },
    );
  }
}
