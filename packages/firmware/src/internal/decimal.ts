/**
 * The package's private decimal.js instance (40 significant digits, ties to even), used to render
 * exact rationals as decimal source values. Never `Decimal.set`: global state stays untouched.
 */
import { exactDecimalString } from '@bridgework/core';
import { Decimal } from 'decimal.js';
import type { Rational } from './rational.js';

export const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });

/** The same precision rounding away from zero: quotients of bounds are never rounded down. */
const DUp = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_UP });

/**
 * A rational as a decimal string: exact when its decimal expansion has at most 40 significant
 * digits, otherwise rounded to 40 (ties to even). Plain notation for moderate exponents,
 * scientific otherwise.
 */
export function decimalString(a: Rational): string {
  const x = new D(a.n.toString()).div(a.d.toString());
  return x.isZero() ? '0' : x.toString();
}

/**
 * A non-negative rational bound as a short decimal string, rounded upward to `digits` significant
 * digits (both the 40-digit quotient and the final rounding go away from zero).
 */
export function boundString(a: Rational, digits = 6): string {
  const x = new DUp(a.n.toString()).div(a.d.toString());
  return x.isZero() ? '0' : x.toSignificantDigits(digits, Decimal.ROUND_UP).toString();
}

/** A finite double as a short decimal string, rounded to nearest at `digits` significant digits. */
export function shortString(x: number, digits = 6): string {
  return x === 0 ? '0' : new D(exactDecimalString(x)).toSignificantDigits(digits).toString();
}
