import { BridgeworkError } from './BridgeworkError.js';
import { checkFinite, checkOptions, formatValue } from './checks.js';

/**
 * An interval of numbers `{ min, max }`, the one interval type of every bridgework package.
 *
 * @remarks
 * Whether the ends belong to the interval is stated by the API that returns or takes it (an
 * open range of ratios a sensor can produce, a closed span of interest); the unit is the unit
 * of the quantity it bounds.
 */
export interface Interval {
  /** Lower end. */
  readonly min: number;
  /** Upper end (≥ `min`). */
  readonly max: number;
}

/**
 * Checks that `value` is an {@link Interval} with finite ends and `min ≤ max` (or `min < max`
 * with `strict`) and returns a fresh copy.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param options - `strict`: require `min < max`.
 * @returns `{ min, max }`.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, `unknown-option` (a key other than
 *   `min` and `max`, naming the closest), `missing-option` (an end absent), or `out-of-range`
 *   (max below min).
 * @example
 * ```ts
 * checkInterval('span', { min: -1e-3, max: 1e-3 }); // { min: -0.001, max: 0.001 }
 * ```
 */
export function checkInterval(
  param: string,
  value: unknown,
  options: { readonly strict?: boolean } = {},
): Interval {
  const strict = checkStrict(options);
  const o = checkOptions(param, value, { known: ['min', 'max'], required: ['min', 'max'] });
  const min = checkFinite(`${param}.min`, o['min']);
  const max = checkFinite(`${param}.max`, o['max']);
  const bad = strict ? !(min < max) : !(min <= max);
  if (bad) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}.max\` must be ${strict ? '>' : '>='} \`${param}.min\` (${min}); got ${formatValue(max)}`,
      { param: `${param}.max`, value: max, limit: min },
    );
  }
  return { min, max };
}

function checkStrict(options: unknown): boolean {
  const o = checkOptions('options', options, { known: ['strict'] });
  const strict = o['strict'];
  if (strict !== undefined && typeof strict !== 'boolean') {
    throw new BridgeworkError(
      'wrong-type',
      `\`options.strict\` must be a boolean; got ${formatValue(strict)}`,
      {
        param: 'options.strict',
        value: strict,
      },
    );
  }
  return strict === true;
}
