import { BridgeworkError, checkFinite, formatValue } from '@bridgework/core';

/** Checks a closed interval `[min, max]` of finite numbers with min < max and returns a frozen copy. */
export function checkInterval(param: string, value: unknown): readonly [number, number] {
  if (!Array.isArray(value) || value.length !== 2) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}\` must be an array [min, max]; got ${formatValue(value)}`,
      {
        param,
        value,
        limit: 2,
      },
    );
  }
  const min = checkFinite(`${param}[0]`, value[0]);
  const max = checkFinite(`${param}[1]`, value[1]);
  if (!(min < max)) {
    throw new BridgeworkError('out-of-range', `\`${param}\` must have min < max; got [${min}, ${max}]`, {
      param,
      value,
    });
  }
  return Object.freeze([min, max] as [number, number]);
}
