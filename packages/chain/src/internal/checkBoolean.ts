import { BridgeworkError, formatValue } from '@bridgework/core';

/**
 * Validates a boolean option. With a `fallback` the option may be absent (the fallback is
 * returned); without one it is required.
 */
export function checkBoolean(param: string, value: unknown, fallback?: boolean): boolean {
  if (value === undefined && fallback !== undefined) return fallback;
  if (typeof value !== 'boolean') {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a boolean; got ${formatValue(value)}`, {
      param,
      value,
    });
  }
  return value;
}
