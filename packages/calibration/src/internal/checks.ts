import { BridgeworkError, checkFinite, checkLength, checkRange, formatValue } from '@bridgework/core';

/** Checks that `value` is a finite, non-zero number (a rated output, a slope) and returns it. */
export function checkNonZero(param: string, value: unknown): number {
  const x = checkFinite(param, value);
  if (x === 0) {
    throw new BridgeworkError('out-of-range', `\`${param}\` must be non-zero; got ${formatValue(value)}`, {
      param,
      value,
    });
  }
  return x;
}

/**
 * Checks that `value` is an array of finite numbers (of `length` entries, when given) and returns
 * a copy; each bad entry is named by its index (`readings[3]`).
 */
export function checkFiniteArray(param: string, value: unknown, length?: number): number[] {
  if (length !== undefined) checkLength(param, value, length);
  if (!Array.isArray(value)) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}\` must be an array of numbers; got ${formatValue(value)}`,
      {
        param,
        value,
      },
    );
  }
  return (value as unknown[]).map((x, i) => checkFinite(`${param}[${i}]`, x));
}

/**
 * The largest magnitude the fits accept for a load or a reading: 1e100, so that cubes of scaled
 * quantities and sums of squares stay finite (1e300 < 1.8e308).
 */
export const MAGNITUDE_LIMIT = 1e100;

/**
 * Checks that `value` is an array of finite numbers of magnitude at most {@link MAGNITUDE_LIMIT}
 * (of `length` entries, when given) and returns a copy; each bad entry is named by its index.
 */
export function checkBoundedArray(param: string, value: unknown, length?: number): number[] {
  return checkFiniteArray(param, value, length).map((x, i) =>
    checkRange(`${param}[${i}]`, x, { min: -MAGNITUDE_LIMIT, max: MAGNITUDE_LIMIT }),
  );
}

/**
 * Returns `result` when it is finite; otherwise throws `out-of-range` against the caller's input
 * `param` (a result that overflows is refused, never returned as ±Infinity or NaN).
 */
export function finiteResult(param: string, value: unknown, result: number, what: string): number {
  if (Number.isFinite(result)) return result;
  throw new BridgeworkError(
    'out-of-range',
    `\`${param}\` must keep ${what} finite (it overflows the double range); got ${formatValue(value)}`,
    { param, value },
  );
}
