/**
 * Correct rounding of exact rationals to IEEE 754 binary formats, done in integers so that no
 * double rounding can occur (a rational rounded to binary64 and then to binary32 can differ from
 * the rational rounded to binary32 directly).
 */
import { floorLog2, mulPow2, floor as ratFloor, sign, type Rational } from './rational.js';

/** An IEEE 754 binary interchange format. */
export interface BinaryFormat {
  /** Precision p in bits, including the hidden bit. */
  readonly precision: number;
  /** Smallest normal exponent emin. */
  readonly minExponent: number;
  /** Largest exponent emax. */
  readonly maxExponent: number;
}

export const BINARY32: BinaryFormat = { precision: 24, minExponent: -126, maxExponent: 127 };
export const BINARY64: BinaryFormat = { precision: 53, minExponent: -1022, maxExponent: 1023 };

/** How a value between two representable numbers is rounded. */
export type Direction = 'nearest' | 'up' | 'down';

/**
 * Rounds an exact rational to the given binary format and returns it as a double (every binary32
 * and binary64 value is a double). Returns ±Infinity when the rounded magnitude exceeds the
 * format's largest finite number (the caller turns that into an error).
 *
 * Method: with 2^e ≤ |a| < 2^(e+1) and q = max(e, emin) − (p − 1), the representable numbers near
 * a are the multiples of 2^q; the integer significand m = a / 2^q is rounded in the chosen
 * direction (ties to even for 'nearest'), and m·2^q is formed exactly in double arithmetic.
 */
export function roundToBinary(a: Rational, format: BinaryFormat, direction: Direction = 'nearest'): number {
  const s = sign(a);
  if (s === 0) return 0;
  const e = floorLog2(a);
  const q = Math.max(e, format.minExponent) - (format.precision - 1);
  const scaled = mulPow2(a, -q); // a / 2^q, |scaled| < 2^p
  let m: bigint;
  if (direction === 'nearest') {
    const f = ratFloor(scaled);
    const twiceRest = 2n * (scaled.n - f * scaled.d);
    m = twiceRest > scaled.d || (twiceRest === scaled.d && f % 2n !== 0n) ? f + 1n : f;
  } else {
    const f = ratFloor(scaled);
    const exact = f * scaled.d === scaled.n;
    m = direction === 'down' || exact ? f : f + 1n;
  }
  // m·2^q in double: |m| ≤ 2^p ≤ 2^53 is exact, and the product is a representable double.
  const magnitude = Math.abs(Number(m)) * 2 ** q;
  const limit = (2 - 2 ** (1 - format.precision)) * 2 ** format.maxExponent;
  const value = s < 0 ? -magnitude : magnitude;
  if (Math.abs(value) > limit) return s < 0 ? -Infinity : Infinity;
  return value === 0 ? 0 : value;
}

/** The nearest double to a rational, rounded upward (a safe upper bound). */
export function upperDouble(a: Rational): number {
  return roundToBinary(a, BINARY64, 'up');
}
