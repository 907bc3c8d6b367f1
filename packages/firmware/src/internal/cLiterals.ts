/**
 * C99 literals for the emitted constants. Each is parenthesised when negative, so a macro can be
 * used anywhere in an expression.
 */

/** A binary32 value as a `float` literal: 9 significant digits (enough to round-trip) and `f`. */
export function floatLiteral(value: number): string {
  if (!Number.isFinite(value) || Math.fround(value) !== value) {
    throw new RangeError(`not a finite binary32 value: ${value}`);
  }
  // toPrecision(9) always carries a decimal point (or an exponent after one): never a bare `2f`.
  const text = `${Math.abs(value).toPrecision(9)}f`;
  return value < 0 || Object.is(value, -0) ? `(-${text})` : text;
}

/** A binary64 value as a `double` literal: the shortest round-trip form, with a point or exponent. */
export function doubleLiteral(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`not a finite binary64 value: ${value}`);
  let text = String(Math.abs(value));
  if (!/[.e]/.test(text)) text += '.0';
  return value < 0 || Object.is(value, -0) ? `(-${text})` : text;
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
