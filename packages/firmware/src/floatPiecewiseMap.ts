import { BridgeworkError, checkInteger, checkOneOf, requireOption } from '@bridgework/core';
import { BINARY32, BINARY64, roundToBinary, upperDouble } from './internal/binary.js';
import { rationalFromNumber } from './internal/exact.js';
import { registerFastEvaluator } from './internal/fast.js';
import { evaluationBound } from './internal/floatBounds.js';
import type { FloatPrecision } from './internal/floatEval.js';
import { checkPiecewisePolynomial } from './internal/piecewiseChecks.js';
import { ZERO } from './internal/rational.js';
import { checkQuantityUnit } from './internal/text.js';
import { segmentCodesUnchecked, type PiecewisePolynomial } from './piecewisePolynomial.js';
import { readOptions } from './internal/codes.js';

/** Options of {@link floatPiecewiseMap}. */
export interface FloatPiecewiseMapOptions {
  /** The piecewise polynomial to implement, e.g. from {@link fitPiecewisePolynomial}. */
  readonly polynomial: PiecewisePolynomial;
  /** The firmware's arithmetic: `'float32'` (C `float`) or `'float64'` (C `double`). */
  readonly precision: FloatPrecision;
  /** Name of the quantity's unit for reports and headers; default `''`. */
  readonly quantityUnit?: string;
}

/** A piecewise polynomial evaluated in float32 or float64 (see {@link floatPiecewiseMap}). */
export interface FloatPiecewiseMap {
  /** Discriminator. */
  readonly kind: 'piecewise-polynomial';
  /** The arithmetic. */
  readonly precision: FloatPrecision;
  /** Lowest code covered. */
  readonly codeMin: number;
  /** Highest code covered. */
  readonly codeMax: number;
  /** The segmentation's base code (see {@link PiecewisePolynomial}). */
  readonly segmentBase: number;
  /** log2 of the segment length. */
  readonly segmentBits: number;
  /** Number of segments. */
  readonly segmentCount: number;
  /** Polynomial degree. */
  readonly degree: number;
  /** The quantity's unit name (may be empty). */
  readonly quantityUnit: string;
  /** Per segment, the coefficients rounded to the precision (nearest, ties to even), ascending. */
  readonly coefficients: readonly (readonly number[])[];
  /**
   * The analytic bound of |result − polynomial(code)| over the range, quantity unit: coefficient
   * rounding, the conversion of t and Horner's rule (see docs/firmware.md). The arithmetic part of
   * the total error.
   */
  readonly arithmeticBound: number;
  /** The polynomial implemented. */
  readonly polynomial: PiecewisePolynomial;
  /**
   * The result for a code, bit for bit as the emitted C computes it.
   *
   * @param code - An integer in [codeMin, codeMax].
   * @returns The quantity (a binary32 value for float32).
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, `out-of-range`.
   */
  evaluate(code: number): number;
}

/**
 * Builds the float32 or float64 evaluator of a piecewise polynomial: a table of coefficients per
 * segment and Horner's rule in the target's arithmetic.
 *
 * @remarks
 * The firmware finds the segment and the centred t in integers ({@link PiecewisePolynomial}),
 * converts t to the float type (exact while |t| ≤ 2^24 for float32, 2^53 for float64), and
 * evaluates y = c_n, y = y·x + c_(n−1), …, y = y·x + c_0, every operation rounded (no fused
 * multiply-add: gcc `-std=c99` does not contract). Each coefficient is rounded once from its
 * binary64 value to the precision (nearest, ties to even). The emulation here matches the C bit
 * for bit (Math.fround after each binary64 operation is the binary32 operation; docs/firmware.md).
 *
 * Arithmetic bound per segment (Higham, _Accuracy and Stability of Numerical Algorithms_, 2nd ed.,
 * §5.1, with the coefficient rounding, the conversion of t and underflow added): the bound of
 * {@link floatMap} for a polynomial in t over the segment's t range. `arithmeticBound` is the
 * largest over the segments.
 *
 * @param options - The polynomial and the precision.
 * @returns The rounded constants, the arithmetic bound and a bit-exact evaluator.
 * @throws {@link @bridgework/core!BridgeworkError} `overflow` when a coefficient does not fit the
 *   precision; the option codes for bad options.
 * @example
 * ```ts
 * const polynomial = fitPiecewisePolynomial({ exact: Math.sqrt, codeMin: 1, codeMax: 65536, segmentBits: 12, degree: 3 });
 * const map = floatPiecewiseMap({ polynomial, precision: 'float32' });
 * map.evaluate(40000); // ≈ 200 (a float32 value)
 * ```
 */
export function floatPiecewiseMap(options: FloatPiecewiseMapOptions): FloatPiecewiseMap {
  const o = readOptions(options, {
    known: ['polynomial', 'precision', 'quantityUnit'],
    required: ['polynomial', 'precision'],
  });
  const polynomial = checkPiecewisePolynomial('polynomial', requireOption('polynomial', o['polynomial']));
  const precision = checkOneOf('precision', o['precision'], ['float32', 'float64'] as const);
  const quantityUnit = checkQuantityUnit(o['quantityUnit']);
  return buildFloatPiecewise(polynomial, precision, quantityUnit);
}

/** {@link floatPiecewiseMap} without option checks. @internal */
export function buildFloatPiecewise(
  polynomial: PiecewisePolynomial,
  precision: FloatPrecision,
  quantityUnit: string,
): FloatPiecewiseMap {
  const format = precision === 'float32' ? BINARY32 : BINARY64;
  const { segmentCount, degree, codeMin, codeMax, segmentBase, segmentBits } = polynomial;
  const coefficients: (readonly number[])[] = [];
  let bound = 0;
  for (let i = 0; i < segmentCount; i++) {
    const design = polynomial.coefficients[i] as readonly number[];
    const exact = design.map(rationalFromNumber);
    const rounded = exact.map((c, j) => {
      const r = roundToBinary(c, format);
      if (!Number.isFinite(r)) {
        throw new BridgeworkError(
          'overflow',
          `\`polynomial.coefficients[${i}][${j}]\` must fit a ${precision}; got ${design[j]}`,
          { param: `polynomial.coefficients[${i}][${j}]`, value: design[j] },
        );
      }
      return r;
    });
    coefficients.push(Object.freeze(rounded));
    const s = segmentCodesUnchecked(polynomial, i);
    const segmentBound = evaluationBound({
      kind: 'polynomial',
      format,
      offset: ZERO,
      offsetRounded: ZERO,
      coefficients: exact,
      coefficientsRounded: rounded.map(rationalFromNumber),
      codeMin: s.first - s.centre,
      codeMax: s.last - s.centre,
    });
    bound = Math.max(bound, upperDouble(segmentBound));
  }
  const width = degree + 1;
  const table = new Float64Array(segmentCount * width);
  coefficients.forEach((row, i) => row.forEach((c, j) => (table[i * width + j] = c)));
  const length = 2 ** segmentBits;
  const half = length / 2;
  const f32 = precision === 'float32';
  const evaluateUnchecked = (code: number): number => {
    const u = code - segmentBase;
    const i = Math.floor(u / length);
    const t = u - i * length - half;
    const base = i * width;
    let y = table[base + degree] as number;
    if (f32) {
      const x = Math.fround(t);
      for (let j = degree - 1; j >= 0; j--) y = Math.fround(Math.fround(y * x) + (table[base + j] as number));
    } else {
      for (let j = degree - 1; j >= 0; j--) y = y * t + (table[base + j] as number);
    }
    return y;
  };
  const map: FloatPiecewiseMap = Object.freeze({
    kind: 'piecewise-polynomial' as const,
    precision,
    codeMin,
    codeMax,
    segmentBase,
    segmentBits,
    segmentCount,
    degree,
    quantityUnit,
    coefficients: Object.freeze(coefficients),
    arithmeticBound: bound,
    polynomial,
    evaluate(code: number): number {
      checkInteger('code', code, { min: codeMin, max: codeMax });
      return evaluateUnchecked(code);
    },
  });
  registerFastEvaluator(map, evaluateUnchecked);
  return map;
}
