import { BridgeworkError, checkFinite, checkLength, formatValue } from '@bridgework/core';

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
