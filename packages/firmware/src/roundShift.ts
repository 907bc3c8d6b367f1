import { BridgeworkError, checkInteger, checkOneOf, formatValue } from '@bridgework/core';

/**
 * How a fixed-point result n / 2^shift is rounded to an integer.
 *
 * @remarks
 * - `'half-even'`: to the nearest integer, exact halves to the even neighbour (IEEE 754
 *   roundTiesToEven; no bias over many readings);
 * - `'half-away'`: to the nearest integer, exact halves away from zero (the school rule, symmetric
 *   about zero);
 * - `'floor'`: toward −∞ (a bare arithmetic shift in two's complement; error in (−1, 0]).
 *
 * JavaScript's `Math.round` is none of these (it rounds halves toward +∞) and is never used.
 */
export type FixedPointRounding = 'half-even' | 'half-away' | 'floor';

/** Every {@link FixedPointRounding}, for option checks. */
export const fixedPointRoundings: readonly FixedPointRounding[] = ['half-even', 'half-away', 'floor'];

/** ⌊n / 2^s⌋ without shifting a negative value right (the C code does the same, see below). */
function floorShift(n: bigint, s: bigint): bigint {
  return n >= 0n ? n >> s : -(-(n + 1n) >> s) - 1n;
}

/**
 * Rounds n / 2^shift to an integer, exactly as the emitted C evaluators do.
 *
 * @remarks
 * The operations are the C ones, step for step, so TypeScript and firmware agree on every input:
 * - floor: `n ≥ 0 ? n >> s : −((−(n + 1)) >> s) − 1`. Right-shifting a negative value is
 *   implementation-defined in C99 (6.5.7), so only non-negative values are shifted; for n < 0,
 *   ⌊n/2^s⌋ = −⌊(−n − 1)/2^s⌋ − 1, and −(n + 1) cannot overflow.
 * - half-away: with h = 2^(s−1), `n ≥ 0 ? (n + h) >> s : −((h − n) >> s)`.
 * - half-even: q = floor(n + h); when n + h is a multiple of 2^s (an exact half) and q is odd,
 *   q − 1. The multiple test reads the low bits of (uint64_t)(n + h), which C99 defines as the
 *   value modulo 2^64 (6.3.1.3).
 *
 * A shift of 0 returns n unchanged. The emitted C relies on the generator's proof that n, n + h and
 * h − n fit the accumulator; this function, on bigints, has no such limit.
 *
 * @param n - The accumulator value (any bigint).
 * @param shift - The number of fraction bits s to remove, an integer in [0, 126].
 * @param rounding - The rounding rule.
 * @returns The rounded quotient as a bigint.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` unless `n` is a bigint; `not-integer`,
 *   `out-of-range` for a bad shift; `invalid-option` for an unknown rounding.
 * @example
 * ```ts
 * roundShift(5n, 1, 'half-even'); // 2n  (2.5 → 2)
 * roundShift(7n, 1, 'half-even'); // 4n  (3.5 → 4)
 * roundShift(-5n, 1, 'half-away'); // -3n (−2.5 → −3)
 * roundShift(-5n, 1, 'floor'); // -3n (−2.5 → −3)
 * ```
 */
export function roundShift(n: bigint, shift: number, rounding: FixedPointRounding): bigint {
  if (typeof n !== 'bigint') {
    throw new BridgeworkError('wrong-type', `\`n\` must be a bigint; got ${formatValue(n)}`, {
      param: 'n',
      value: n,
    });
  }
  checkInteger('shift', shift, { min: 0, max: 126 });
  const mode = checkOneOf('rounding', rounding, fixedPointRoundings);
  return roundShiftUnchecked(n, BigInt(shift), mode);
}

/** {@link roundShift} without input checks (internal kernels). */
export function roundShiftUnchecked(n: bigint, s: bigint, rounding: FixedPointRounding): bigint {
  if (s === 0n) return n;
  if (rounding === 'floor') return floorShift(n, s);
  const half = 1n << (s - 1n);
  if (rounding === 'half-away') return n >= 0n ? (n + half) >> s : -((half - n) >> s);
  const q = floorShift(n + half, s);
  const exactHalf = ((n + half) & ((1n << s) - 1n)) === 0n;
  return exactHalf && (q & 1n) === 1n ? q - 1n : q;
}
