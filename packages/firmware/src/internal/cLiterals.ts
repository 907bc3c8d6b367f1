/**
 * C99 literals for the emitted constants. Each is parenthesised when negative, so a macro can be
 * used anywhere in an expression.
 */

/** A binary32 value as a `float` literal: 9 significant digits (enough to round-trip) and `f`. */
export function floatLiteral(value: number, parenthesise = true): string {
  if (!Number.isFinite(value) || Math.fround(value) !== value) {
    throw new RangeError(`not a finite binary32 value: ${value}`);
  }
  // toPrecision(9) gives nine significant digits, which identify every binary32 value. Its text has
  // a point or an exponent except for integers of exactly nine digits (1e8 ≤ |x| < 1e9, such as
  // 215786624): `215786624f` is no C literal, so those get `.0` (a floating constant needs a point
  // or an exponent before its suffix, C99 6.4.4.2).
  let digits = Math.abs(value).toPrecision(9);
  if (!/[.e]/.test(digits)) digits += '.0';
  const text = `${digits}f`;
  return value < 0 || Object.is(value, -0) ? (parenthesise ? `(-${text})` : `-${text}`) : text;
}

/** A binary64 value as a `double` literal: the shortest round-trip form, with a point or exponent. */
export function doubleLiteral(value: number, parenthesise = true): string {
  if (!Number.isFinite(value)) throw new RangeError(`not a finite binary64 value: ${value}`);
  let text = String(Math.abs(value));
  if (!/[.e]/.test(text)) text += '.0';
  return value < 0 || Object.is(value, -0) ? (parenthesise ? `(-${text})` : `-${text}`) : text;
}

/** An integer literal through `INT32_C`/`INT64_C`; the most negative value is written as in <stdint.h>. */
export function intLiteral(value: bigint | number, bits: 32 | 64): string {
  const n = BigInt(value);
  const macro = bits === 32 ? 'INT32_C' : 'INT64_C';
  const limit = 1n << BigInt(bits - 1);
  if (n < -limit || n >= limit) throw new RangeError(`${n} does not fit int${bits}_t`);
  if (n === -limit) return `(-${macro}(${limit - 1n}) - 1)`;
  return n < 0n ? `(-${macro}(${-n}))` : `${macro}(${n})`;
}
