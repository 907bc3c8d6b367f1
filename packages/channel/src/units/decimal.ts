/**
 * Exact decimal numbers as (integer digits, power of ten), for unit conversion without rounding:
 * a quantity's text and a unit's factor are both exact decimals, so their product is exact, and
 * `Number()` of its decimal text is the correctly rounded double (ECMA-262 StringToNumber).
 */

/** `digits × 10^exponent`, exactly. */
export interface Decimal {
  /** The integer digits (signed). */
  readonly digits: bigint;
  /** The power of ten. */
  readonly exponent: number;
}

const DECIMAL = /^([+-]?)(\d+)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$|^([+-]?)\.(\d+)(?:[eE]([+-]?\d+))?$/;

/**
 * Reads a decimal literal (`350`, `-0.5`, `.5`, `2.5e-3`) exactly.
 *
 * @param text - The literal, without spaces.
 * @returns The decimal, or undefined when `text` is not a decimal literal.
 */
export function parseDecimal(text: string): Decimal | undefined {
  const m = DECIMAL.exec(text);
  if (m === null) return undefined;
  const sign = (m[1] ?? m[5]) === '-' ? -1n : 1n;
  const whole = m[2] ?? '';
  const fraction = m[3] ?? m[6] ?? '';
  const exponentText = m[4] ?? m[7];
  const exponent = (exponentText === undefined ? 0 : Number(exponentText)) - fraction.length;
  if (!Number.isSafeInteger(exponent) || Math.abs(exponent) > 100_000) return undefined;
  return { digits: sign * BigInt(`${whole}${fraction}` || '0'), exponent };
}

/** The exact product of two decimals. */
export function multiplyDecimal(a: Decimal, b: Decimal): Decimal {
  return { digits: a.digits * b.digits, exponent: a.exponent + b.exponent };
}

/** The exact sum of two decimals. */
export function addDecimal(a: Decimal, b: Decimal): Decimal {
  const e = Math.min(a.exponent, b.exponent);
  return {
    digits: a.digits * 10n ** BigInt(a.exponent - e) + b.digits * 10n ** BigInt(b.exponent - e),
    exponent: e,
  };
}

/** The double nearest the decimal (correctly rounded); ±Infinity beyond the double range. */
export function decimalToNumber(x: Decimal): number {
  return Number(`${x.digits}e${x.exponent}`);
}

/** The power of ten `10^k`, as an exact decimal. */
export function powerOfTen(k: number): Decimal {
  return { digits: 1n, exponent: k };
}
