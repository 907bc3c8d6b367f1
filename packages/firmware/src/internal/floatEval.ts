/**
 * Exact emulation of the float evaluators that the C header emits, operation for operation.
 *
 * binary32: every operation is performed in binary64 and rounded with Math.fround. For +, −, ×
 * on binary32 operands this equals the correctly rounded binary32 operation, because binary64 has
 * at least 2·24 + 2 bits (Figueroa, "When is double rounding innocuous?", SIGNUM Newsletter 30(3),
 * 1995 — from memory). Math.fround of an integer code is the C conversion (float)code (round to
 * nearest even). binary64: plain JavaScript arithmetic, which never fuses a multiply-add.
 *
 * The C evaluators (see emitCHeader) are, with x the offset-relative argument:
 *   affine:      x = (T)code − OFFSET;  y = x · SCALE
 *   polynomial:  x = (T)code − OFFSET;  y = Cn;  y = y·x + C(n−1); … ; y = y·x + C0
 */

/** The arithmetic of a float map: `'float32'` (IEEE 754 binary32, C `float`) or `'float64'` (binary64, C `double`). */
export type FloatPrecision = 'float32' | 'float64';

/** The rounded constants of a float map, as the firmware holds them. */
export interface FloatProgram {
  readonly kind: 'affine' | 'polynomial';
  readonly precision: FloatPrecision;
  readonly offset: number;
  /** affine: [scale]; polynomial: [c0, c1, …, cn] in ascending powers. */
  readonly coefficients: readonly number[];
}

const identity = (x: number): number => x;

/** The rounding of one operation in the program's precision. */
export function rounder(precision: FloatPrecision): (x: number) => number {
  return precision === 'float32' ? Math.fround : identity;
}

/** Evaluates the program at one code, exactly as the C evaluator does. */
export function evaluateProgram(p: FloatProgram, code: number): number {
  const r = rounder(p.precision);
  const c = p.coefficients;
  const x = r(r(code) - p.offset);
  if (p.kind === 'affine') return r(x * (c[0] as number));
  let y = c[c.length - 1] as number;
  for (let k = c.length - 2; k >= 0; k--) y = r(r(y * x) + (c[k] as number));
  return y;
}
