import { BridgeworkError, exactDecimalString, formatValue } from '@bridgework/core';
import type { ExactValue } from '../exactValue.js';
import { div, rat, reduce, sign, type Rational } from './rational.js';

const DECIMAL = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;
const MAX_EXPONENT = 4000;

function parseDecimal(param: string, text: string, whole: unknown): Rational {
  const m = DECIMAL.exec(text.trim());
  const intDigits = m?.[2] ?? '';
  const fracDigits = m?.[3] ?? '';
  if (m === null || intDigits + fracDigits === '') {
    throw new BridgeworkError(
      'parse-error',
      `\`${param}\` must be a decimal numeral or a ratio of two (e.g. '1.9876e-3' or '30/2134169.2'); got ${formatValue(whole)}`,
      { param, value: whole },
    );
  }
  const exponent = Number(m[4] ?? '0');
  if (Math.abs(exponent) > MAX_EXPONENT) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must have a decimal exponent in [-${MAX_EXPONENT}, ${MAX_EXPONENT}]; got ${formatValue(whole)}`,
      { param, value: whole, limit: [-MAX_EXPONENT, MAX_EXPONENT] },
    );
  }
  const digits = BigInt(intDigits + fracDigits) * (m[1] === '-' ? -1n : 1n);
  const power = exponent - fracDigits.length;
  return power >= 0 ? rat(digits * 10n ** BigInt(power)) : rat(digits, 10n ** BigInt(-power));
}

/**
 * Reads an {@link ExactValue} as an exact rational.
 *
 * @throws BridgeworkError `wrong-type` (not a number, bigint or string), `not-finite` (NaN,
 *   ±Infinity, or a ratio with a zero denominator), `parse-error` (a malformed string),
 *   `out-of-range` (a decimal exponent beyond ±4000).
 */
export function exactRational(param: string, value: unknown): Rational {
  if (typeof value === 'bigint') return rat(value);
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      throw new BridgeworkError(
        'not-finite',
        `\`${param}\` must be a finite number; got ${formatValue(value)}`,
        {
          param,
          value,
        },
      );
    }
    return parseDecimal(param, exactDecimalString(value), value);
  }
  if (typeof value !== 'string') {
    throw new BridgeworkError(
      'wrong-type',
      `\`${param}\` must be a number, a bigint or a decimal string; got ${formatValue(value)}`,
      { param, value },
    );
  }
  const parts = value.split('/');
  if (parts.length > 2) parseDecimal(param, '', value); // throws parse-error
  const numerator = parseDecimal(param, parts[0] ?? '', value);
  if (parts.length === 1) return numerator;
  const denominator = parseDecimal(param, parts[1] ?? '', value);
  if (sign(denominator) === 0) {
    throw new BridgeworkError(
      'not-finite',
      `\`${param}\` must not divide by zero; got ${formatValue(value)}`,
      {
        param,
        value,
      },
    );
  }
  return reduce(div(numerator, denominator));
}

/** The exact rational value of a finite double (through core's exact decimal expansion). */
export function rationalFromNumber(x: number): Rational {
  return exactRational('x', x);
}
