import { BridgeworkError, checkInteger, formatValue, requireOption, type Interval } from '@bridgework/core';
import type { ExactValue } from './exactValue.js';
import { BINARY64, roundToBinary, upperDouble } from './internal/binary.js';
import { checkBits, readOptions } from './internal/codes.js';
import { decimalString } from './internal/decimal.js';
import { exactRational, rationalFromNumber } from './internal/exact.js';
import { checkPiecewisePolynomial } from './internal/piecewiseChecks.js';
import { registerFastEvaluator } from './internal/fast.js';
import {
  abs,
  add,
  div,
  mul,
  mulPow2,
  pow,
  rat,
  roundHalfEven,
  sign,
  sub,
  ZERO,
  type Rational,
} from './internal/rational.js';
import { checkQuantityUnit } from './internal/text.js';
import { segmentCodesUnchecked, type PiecewisePolynomial } from './piecewisePolynomial.js';

/** Options of {@link fixedPiecewiseMap}. */
export interface FixedPiecewiseMapOptions {
  /** The piecewise polynomial to implement (quantity unit), e.g. from {@link fitPiecewisePolynomial}. */
  readonly polynomial: PiecewisePolynomial;
  /** The quantity of one output LSB (> 0, exact), e.g. `'0.01'` for 0.01 °C steps. */
  readonly outputUnit: ExactValue;
  /** Width of the signed coefficient words in bits, an integer in [8, 32]. Default 32. */
  readonly coefficientBits?: number;
  /** Name of the quantity's unit for reports and headers; default `''`. */
  readonly quantityUnit?: string;
}

/** The fixed-point constants of one segment (see {@link fixedPiecewiseMap}). */
export interface FixedSegment {
  /** The integer coefficients C_0 … C_n (C_0 includes the rounding half 2^(f_0 − 1) when f_0 > 0). */
  readonly coefficients: readonly number[];
  /** The fraction bits f_0 … f_n of each coefficient (its Q-format is Q(w−1−f).f in w-bit words). */
  readonly fractionBits: readonly number[];
  /** The shifts: S_j = f_(j+1) − f_j after the multiply of step j (j = 0 … n−1), then f_0. */
  readonly shifts: readonly number[];
  /** The analytic bound of |output − polynomial/outputUnit| on this segment, output LSB. */
  readonly arithmeticBound: number;
  /** The largest magnitude any intermediate value can take on this segment (proved ≤ 2^31 − 1). */
  readonly accumulatorBound: number;
}

/**
 * A piecewise polynomial in 32-bit integer arithmetic (see {@link fixedPiecewiseMap}).
 */
export interface FixedPiecewiseMap {
  /** Discriminator. */
  readonly kind: 'piecewise-polynomial';
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
  /** Width of the coefficient words (8, 16 or 32 in the header's tables: the smallest holding `coefficientBits`). */
  readonly coefficientBits: number;
  /** Width of every intermediate value: 32 (int32_t; products are 32 × 32 → 32 bits). */
  readonly accumulatorBits: 32;
  /** The rounding of the output: to nearest, exact halves up (floor(x + 1/2)). */
  readonly rounding: 'half-up';
  /** The quantity of one output LSB, as a decimal (exact, or to 40 digits). */
  readonly outputUnit: string;
  /** The quantity's unit name (may be empty). */
  readonly quantityUnit: string;
  /** Per segment constants. */
  readonly segments: readonly FixedSegment[];
  /**
   * The analytic bound of |output − polynomial(code)/outputUnit| over the code range, in output
   * LSB: coefficient rounding, the floor of every Horner step and the output rounding (see
   * docs/firmware.md). The arithmetic part of the total error.
   */
  readonly arithmeticBound: number;
  /** The largest proved intermediate magnitude over all segments (≤ 2^31 − 1). */
  readonly accumulatorBound: number;
  /** Outputs at most in this range (from the polynomial and the arithmetic bound), output LSB. */
  readonly outputRange: Interval;
  /** The polynomial implemented. */
  readonly polynomial: PiecewisePolynomial;
  /**
   * The integer output for a code, exactly as the firmware computes it.
   *
   * @param code - An integer in [codeMin, codeMax].
   * @returns The output in output LSB.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, `out-of-range`.
   */
  evaluate(code: number): number;
}

const INT32_LIMIT = 2n ** 31n - 1n;
const LOG2_LIMIT = 31;

/** ⌊log2 x⌋ for a positive double (exact for powers of two). */
function floorLog2(x: number): number {
  let e = Math.floor(Math.log2(x));
  if (2 ** e > x) e -= 1;
  if (2 ** (e + 1) <= x) e += 1;
  return e;
}

/** The largest f with m·2^f ≤ limit (m > 0), at most 120 (a zero coefficient gets 120). */
function capFor(m: number, limit: number): number {
  if (!(m > 0)) return 120;
  return Math.min(120, floorLog2(limit / m));
}

/**
 * Proves that no intermediate value of a segment's Horner evaluation leaves int32_t: for every
 * |t| ≤ T, |C_j| fits the coefficient word, |y_(j+1)·t| and |y_j| stay within 2^31 − 1, bounded by
 * the triangle inequality in integers (|⌊p/2^s⌋| ≤ ⌈|p|/2^s⌉). Returns the largest bound, or the
 * index of the first coefficient whose fraction bits must shrink.
 *
 * @internal
 */
export function proveSegment(
  C: readonly bigint[],
  shifts: readonly number[],
  T: bigint,
  coefficientBits: number,
): { readonly peak: bigint } | number {
  const n = C.length - 1;
  const coefLimit = (1n << BigInt(coefficientBits - 1)) - 1n;
  for (let j = 0; j <= n; j++) {
    const c = C[j] as bigint;
    if (c > coefLimit || c < -coefLimit) return j;
  }
  const absC = (j: number) => {
    const c = C[j] as bigint;
    return c < 0n ? -c : c;
  };
  let y = absC(n);
  let peak = y;
  for (let j = n - 1; j >= 0; j--) {
    const product = y * T;
    if (product > INT32_LIMIT) return j + 1;
    const s = BigInt(shifts[j] as number);
    y = ((product + (1n << s) - 1n) >> s) + absC(j);
    if (y > INT32_LIMIT) return j;
    if (product > peak) peak = product;
    if (y > peak) peak = y;
  }
  return { peak };
}

/**
 * Designs one segment: fraction bits, integer coefficients, the proved intermediate bound and the
 * arithmetic bound; undefined when no choice fits (the output cannot be held with f_0 ≥ 0).
 */
function designSegment(
  a: readonly Rational[],
  tLow: number,
  tHigh: number,
  coefficientBits: number,
): FixedSegment | undefined {
  const n = a.length - 1;
  const T = Math.max(Math.abs(tLow), Math.abs(tHigh));
  const Tb = BigInt(T);
  const aAbs = a.map((x) => Math.abs(roundToBinary(x, BINARY64)) * (1 + 2 ** -40));
  // B_j ≥ max|Σ_(i≥j) a_i t^(i−j)|: the real size of the partial Horner value y_j.
  const B = aAbs.map((_, j) => {
    let s = 0;
    for (let i = n; i >= j; i--) s = s * T + (aAbs[i] as number);
    return s;
  });
  const coefLimit = 2 ** (coefficientBits - 1) - 2;
  // First guesses from the real sizes; the integer proof below lowers any that do not fit.
  const caps = a.map((_, j) => {
    const half = j === 0 ? 0.5 : 0;
    let cap = Math.min(
      capFor((aAbs[j] as number) + half, coefLimit),
      capFor(B[j] as number, 2 ** LOG2_LIMIT - 4),
    );
    if (j >= 1 && T > 0) cap = Math.min(cap, capFor((B[j] as number) * T, 2 ** LOG2_LIMIT - 4));
    return cap;
  });
  for (let attempt = 0; attempt < 200; attempt++) {
    // f_j ≤ f_(j+1) (right shifts only) and f_(j+1) ≤ f_j + 30 (shifts below the word width).
    const f = caps.slice();
    for (let j = n - 1; j >= 0; j--) f[j] = Math.min(f[j] as number, f[j + 1] as number);
    for (let j = 0; j < n; j++) f[j + 1] = Math.min(f[j + 1] as number, (f[j] as number) + 30);
    if ((f[0] as number) < 0 || (f[0] as number) > 30) {
      if ((f[0] as number) > 30) {
        caps[0] = 30;
        continue;
      }
      return undefined;
    }
    // Integer coefficients, nearest (ties to even), and the exact quantisation errors.
    const C = a.map((x, j) => roundHalfEven(mulPow2(x, f[j] as number)));
    const q = a.map((x, j) => sub(mulPow2(rat(C[j] as bigint), -(f[j] as number)), x));
    const f0 = f[0] as number;
    if (f0 > 0) C[0] = (C[0] as bigint) + (1n << BigInt(f0 - 1));
    const shifts = Array.from({ length: n }, (_, j) => (f[j + 1] as number) - (f[j] as number));
    const proof = proveSegment(C, shifts, Tb, coefficientBits);
    if (typeof proof === 'number') {
      caps[proof] = (f[proof] as number) - 1;
      continue;
    }
    const peak = proof.peak;
    // Arithmetic bound: output rounding, floors of the steps with a shift, coefficient rounding.
    let bound: Rational = f0 > 0 ? rat(1n, 2n) : ZERO;
    const TPow = (j: number) => pow(rat(Tb), j);
    for (let j = 0; j < n; j++) {
      if ((shifts[j] as number) > 0) bound = add(bound, mul(mulPow2(rat(1n), -(f[j] as number)), TPow(j)));
    }
    for (let j = 0; j <= n; j++) bound = add(bound, mul(abs(q[j] as Rational), TPow(j)));
    return {
      coefficients: C.map(Number),
      fractionBits: f,
      shifts: [...shifts, f0],
      arithmeticBound: upperDouble(bound),
      accumulatorBound: Number(peak),
    };
  }
  return undefined;
}

/**
 * Builds the 32-bit integer evaluator of a piecewise polynomial: per-segment Q-format
 * coefficients, Horner's rule in int32_t with a floor shift after each multiply, and a rounded
 * output in units of `outputUnit`.
 *
 * @remarks
 * For a code, with the segment index i and the centred t of {@link PiecewisePolynomial}, the
 * firmware computes, every value an int32_t,
 *
 * ```text
 * y = C_n
 * y = floor(y·t / 2^S_j) + C_j          j = n−1, …, 0
 * output = floor(y / 2^f_0)             (C_0 holds the half 2^(f_0−1): round to nearest, halves up)
 * ```
 *
 * C_j = round(a_j/outputUnit · 2^f_j) (nearest, ties to even) holds coefficient j with f_j
 * fraction bits; S_j = f_(j+1) − f_j. The f_j of each segment are the largest for which the
 * coefficient fits `coefficientBits` and every intermediate value — each product y·t, each shifted
 * sum — provably stays within ±(2^31 − 1) for every t of the segment (bounded by the triangle
 * inequality in integers), with 0 ≤ S_j ≤ 30 and 0 ≤ f_0 ≤ 30. So the products are 32 × 32 → 32-bit
 * multiplies: no 64-bit arithmetic, no division, no library call on any 32-bit core (a Cortex-M0+
 * included). The floor shift never shifts a negative value (C99 6.5.7 leaves that
 * implementation-defined): see {@link roundShift}.
 *
 * Arithmetic error against the polynomial (exactly, per segment, T = max|t|):
 * |output − p(t)/outputUnit| ≤ ½ (when f_0 > 0) + Σ_(j<n, S_j>0) 2^−f_j·T^j + Σ_j |q_j|·T^j,
 * with q_j = C_j·2^−f_j − a_j/outputUnit the exact coefficient rounding (the half excluded); the
 * derivation is in docs/firmware.md. `arithmeticBound` is the largest over the segments.
 *
 * @param options - The polynomial, the output unit, the coefficient width.
 * @returns The constants, the proved bounds and an exact evaluator.
 * @throws {@link @bridgework/core!BridgeworkError} `overflow` (param `polynomial`) when a segment's
 *   values cannot be held in int32_t at any Q-format; `not-positive` for `outputUnit` ≤ 0; the
 *   option codes for bad options.
 * @example
 * ```ts
 * const polynomial = fitPiecewisePolynomial({ exact: (c) => 1e-3 * c + 1e-12 * c * c, codeMin: 0, codeMax: 65535, segmentBits: 14, degree: 2 });
 * const map = fixedPiecewiseMap({ polynomial, outputUnit: '0.001' });
 * map.evaluate(40000); // 41600 (41.6 in steps of 0.001)
 * ```
 */
export function fixedPiecewiseMap(options: FixedPiecewiseMapOptions): FixedPiecewiseMap {
  const o = readOptions(options, {
    known: ['polynomial', 'outputUnit', 'coefficientBits', 'quantityUnit'],
    required: ['polynomial', 'outputUnit'],
  });
  const polynomial = checkPiecewisePolynomial('polynomial', requireOption('polynomial', o['polynomial']));
  const outputUnit = exactRational('outputUnit', o['outputUnit']);
  if (sign(outputUnit) <= 0) {
    throw new BridgeworkError(
      'not-positive',
      `\`outputUnit\` must be > 0; got ${formatValue(o['outputUnit'])}`,
      {
        param: 'outputUnit',
        value: o['outputUnit'],
        limit: 0,
      },
    );
  }
  const coefficientBits = checkBits('coefficientBits', o['coefficientBits'], 32, 8, 32);
  const quantityUnit = checkQuantityUnit(o['quantityUnit']);
  const map = buildFixedPiecewise(polynomial, outputUnit, coefficientBits, quantityUnit);
  if (map === undefined) {
    throw new BridgeworkError(
      'overflow',
      `\`polynomial\` must have values an int32_t output in steps of ${decimalString(outputUnit)} can hold with ${coefficientBits}-bit coefficients; some segment cannot`,
      { param: 'polynomial', value: decimalString(outputUnit) },
    );
  }
  return map;
}

/** {@link fixedPiecewiseMap} without option checks; undefined when a segment does not fit. @internal */
export function buildFixedPiecewise(
  polynomial: PiecewisePolynomial,
  outputUnit: Rational,
  coefficientBits: number,
  quantityUnit: string,
): FixedPiecewiseMap | undefined {
  const { segmentCount, degree } = polynomial;
  const segments: FixedSegment[] = [];
  let lowest = Infinity;
  let highest = -Infinity;
  for (let i = 0; i < segmentCount; i++) {
    const s = segmentCodesUnchecked(polynomial, i);
    const a = (polynomial.coefficients[i] as readonly number[]).map((c) =>
      div(rationalFromNumber(c), outputUnit),
    );
    const seg = designSegment(a, s.first - s.centre, s.last - s.centre, coefficientBits);
    if (seg === undefined) return undefined;
    segments.push(seg);
    // Output range: the polynomial's extremes (sampled at the ends and Chebyshev points) widened
    // by the segment's arithmetic bound and one LSB; used for display and the output-word check.
    for (const t of [s.first - s.centre, s.last - s.centre, 0]) {
      const v = roundToBinary(
        a.reduceRight((acc: Rational, c) => add(mul(acc, rat(BigInt(t))), c), ZERO),
        BINARY64,
      );
      lowest = Math.min(lowest, v - seg.arithmeticBound);
      highest = Math.max(highest, v + seg.arithmeticBound);
    }
  }
  const arithmeticBound = segments.reduce((m, s) => Math.max(m, s.arithmeticBound), 0);
  const accumulatorBound = segments.reduce((m, s) => Math.max(m, s.accumulatorBound), 0);
  // Flat tables for the evaluator: coefficients and 2^−shift as doubles (all exact).
  const width = degree + 1;
  const coef = new Float64Array(segmentCount * width);
  const scale = new Float64Array(segmentCount * width);
  segments.forEach((s, i) => {
    for (let j = 0; j <= degree; j++) {
      coef[i * width + j] = s.coefficients[j] as number;
      scale[i * width + j] = 2 ** -(s.shifts[j] as number);
    }
  });
  const { codeMin, codeMax, segmentBase, segmentBits } = polynomial;
  const length = 2 ** segmentBits;
  const half = length / 2;
  const evaluateUnchecked = (code: number): number => {
    const u = code - segmentBase;
    const i = Math.floor(u / length);
    const t = u - i * length - half;
    const base = i * width;
    let y = coef[base + degree] as number;
    // Every product and sum is an integer below 2^31 (proved), so binary64 holds it exactly and
    // floor(p·2^−S) is the C floor shift.
    for (let j = degree - 1; j >= 0; j--)
      y = Math.floor(y * t * (scale[base + j] as number)) + (coef[base + j] as number);
    return Math.floor(y * (scale[base + degree] as number));
  };
  const map: FixedPiecewiseMap = Object.freeze({
    kind: 'piecewise-polynomial' as const,
    codeMin,
    codeMax,
    segmentBase,
    segmentBits,
    segmentCount,
    degree,
    coefficientBits,
    accumulatorBits: 32 as const,
    rounding: 'half-up' as const,
    outputUnit: decimalString(outputUnit),
    quantityUnit,
    segments: Object.freeze(segments),
    arithmeticBound,
    accumulatorBound,
    outputRange: { min: Math.floor(lowest) - 1, max: Math.ceil(highest) + 1 },
    polynomial,
    evaluate(code: number): number {
      checkInteger('code', code, { min: codeMin, max: codeMax });
      return evaluateUnchecked(code);
    },
  });
  registerFastEvaluator(map, evaluateUnchecked);
  return map;
}
