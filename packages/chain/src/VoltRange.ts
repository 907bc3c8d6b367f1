import { BridgeworkError, checkFinite, checkObject, formatValue } from '@bridgework/core';

/** A closed range of voltages `[min, max]`, in V. */
export interface VoltRange {
  /** Lower end in V. */
  readonly min: number;
  /** Upper end in V (≥ `min`). */
  readonly max: number;
}

/** @internal Validates a {@link VoltRange} (finite ends, min ≤ max). */
export function checkVoltRange(param: string, value: unknown): VoltRange {
  const o = checkObject(param, value);
  const min = checkFinite(`${param}.min`, o['min']);
  const max = checkFinite(`${param}.max`, o['max']);
  if (!(min <= max)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}.max\` must be >= \`${param}.min\` (${min}); got ${formatValue(max)}`,
      { param: `${param}.max`, value: max, limit: min },
    );
  }
  return { min, max };
}
