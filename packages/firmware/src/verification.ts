/**
 * How the error of a firmware map is verified over its code range.
 *
 * @remarks
 * - `'auto'` (the default): `'exhaustive'` when the range holds at most 2^24 codes
 *   ({@link EXHAUSTIVE_CODE_LIMIT}), otherwise `'sampled'`;
 * - `'exhaustive'`: every code of the range is evaluated as the firmware evaluates it and its
 *   error measured (allowed up to 2^32 codes; beyond 2^24 this takes seconds);
 * - `'sampled'`: the stated bound is the analytic one; the extremes of the range, the codes around
 *   the offset, an even grid and pseudo-random codes (about 50 000 in all, the same on every run)
 *   are evaluated as a check of it.
 */
export type VerificationMode = 'auto' | 'exhaustive' | 'sampled';

/** Every {@link VerificationMode}, for option checks. */
export const verificationModes: readonly VerificationMode[] = ['auto', 'exhaustive', 'sampled'];

/** The largest code range that `'auto'` verifies exhaustively: 2^24 codes (a 24-bit converter). */
export const EXHAUSTIVE_CODE_LIMIT = 2 ** 24;

/** What was done to verify a map's error, and the worst case it found. */
export interface Verification {
  /** `'exhaustive'` (every code evaluated) or `'sampled'` (analytic bound, checked on samples). */
  readonly method: 'exhaustive' | 'sampled';
  /** How many distinct codes were evaluated. */
  readonly codesChecked: number;
  /** A code at which the largest error magnitude among those evaluated occurs. */
  readonly worstCode: number;
  /**
   * The signed error at `worstCode` (result − exact map), computed exactly in rationals and rounded
   * to the nearest double; in the map's error unit (output LSB for fixed-point, the quantity's unit
   * for float maps).
   */
  readonly worstError: number;
}
