import { BridgeworkError, checkInteger, checkOneOf, formatValue, requireOption } from '@bridgework/core';
import type { ExactValue } from './exactValue.js';
import { BINARY32, BINARY64, roundToBinary, upperDouble, type BinaryFormat } from './internal/binary.js';
import { checkCodeRange, readOptions, resolveVerification, sampleCodes } from './internal/codes.js';
import { decimalString } from './internal/decimal.js';
import { exactRational, rationalFromNumber } from './internal/exact.js';
import { registerFastEvaluator } from './internal/fast.js';
import { evaluationBound, referenceBound, type FloatBoundInput } from './internal/floatBounds.js';
import { evaluateProgram, type FloatPrecision, type FloatProgram } from './internal/floatEval.js';
import { scanFloat, type ReferenceMap } from './internal/floatScan.js';
import {
  abs,
  add,
  cmp,
  max,
  mul,
  mulPow2,
  pow,
  rat,
  sign,
  sub,
  ZERO,
  type Rational,
} from './internal/rational.js';
import { checkQuantityUnit } from './internal/text.js';
import type { Verification, VerificationMode } from './verification.js';

export type { FloatPrecision };

/** Every {@link FloatPrecision}, for option checks. */
export const floatPrecisions: readonly FloatPrecision[] = ['float32', 'float64'];

/** The most coefficients a polynomial float map takes (degree 15). */
export const MAX_POLYNOMIAL_COEFFICIENTS = 16;

/** Options of {@link floatMap}. */
export interface FloatMapOptions {
  /**
   * `'affine'`: y = (code − offset)·scale; `'polynomial'`: y = Σ coefficients[k]·(code − offset)^k,
   * evaluated by Horner's rule.
   */
  readonly kind: 'affine' | 'polynomial';
  /** Quantity per code for `'affine'` (non-zero, exact). Not allowed with `'polynomial'`. */
  readonly scale?: ExactValue;
  /**
   * Coefficients in ascending powers of (code − offset) for `'polynomial'` (1 to 16 exact values,
   * in the quantity's unit per code^k). Not allowed with `'affine'`.
   */
  readonly coefficients?: readonly ExactValue[];
  /** The code subtracted first (exact; need not be an integer). Default 0. */
  readonly offset?: ExactValue;
  /** The firmware's arithmetic: `'float32'` (C `float`) or `'float64'` (C `double`). */
  readonly precision: FloatPrecision;
  /** Lowest code converted, an integer in [−2^31, 2^31 − 1]. */
  readonly codeMin: number;
  /** Highest code converted, an integer in [codeMin, 2^31 − 1]. */
  readonly codeMax: number;
  /** Name of the quantity's unit for reports and headers (e.g. `'kg'`); default `''`. */
  readonly quantityUnit?: string;
  /** How the error is verified. Default `'auto'` (exhaustive up to 2^24 codes). */
  readonly verification?: VerificationMode;
}

/** The exact source values of a float map, as decimal strings (exact, or to 40 digits). */
export interface FloatMapSource {
  /** The offset. */
  readonly offset: string;
  /** affine: `[scale]`; polynomial: the coefficients in ascending powers. */
  readonly coefficients: readonly string[];
}

/** What both kinds of float map share. */
export interface FloatMapBase {
  /** The arithmetic the constants are rounded to and the evaluator runs in. */
  readonly precision: FloatPrecision;
  /** Lowest code covered. */
  readonly codeMin: number;
  /** Highest code covered. */
  readonly codeMax: number;
  /** Name of the quantity's unit (may be empty). */
  readonly quantityUnit: string;
  /** The offset rounded to the precision (nearest, ties to even). */
  readonly offset: number;
  /** The exact values the constants were rounded from. */
  readonly source: FloatMapSource;
  /**
   * Proved maximum |result − exact map| over the code range, in the quantity's unit: the
   * exhaustive maximum with the reference's error bound added, or the analytic bound when sampled.
   * It covers the rounding of the constants, the conversion of the code and every operation.
   */
  readonly maxAbsError: number;
  /** The analytic a priori bound (≥ `maxAbsError`), in the quantity's unit. */
  readonly errorBound: number;
  /** How the error was verified and the worst case found. */
  readonly verification: Verification;
  /**
   * The result for a code, bit for bit as the emitted C evaluator computes it.
   *
   * @param code - An integer in [codeMin, codeMax].
   * @returns The quantity (a binary32 value when the precision is float32).
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, `out-of-range`.
   */
  evaluate(code: number): number;
}

/** A float map y = (code − offset)·scale (see {@link floatMap}). */
export interface AffineFloatMap extends FloatMapBase {
  /** Discriminator. */
  readonly kind: 'affine';
  /** The scale rounded to the precision. */
  readonly scale: number;
}

/** A float map y = Σ c_k (code − offset)^k by Horner's rule (see {@link floatMap}). */
export interface PolynomialFloatMap extends FloatMapBase {
  /** Discriminator. */
  readonly kind: 'polynomial';
  /** The coefficients rounded to the precision, ascending powers. */
  readonly coefficients: readonly number[];
}

/** A float map of either kind. */
export type FloatMap = AffineFloatMap | PolynomialFloatMap;

function formatOf(precision: FloatPrecision): BinaryFormat {
  return precision === 'float32' ? BINARY32 : BINARY64;
}

/** Rounds to the format, refusing values beyond its range. */
function roundConstant(param: string, value: Rational, format: BinaryFormat, precision: string): number {
  const x = roundToBinary(value, format);
  if (!Number.isFinite(x)) {
    throw new BridgeworkError(
      'overflow',
      `\`${param}\` must fit a ${precision}; got ${decimalString(value)}`,
      {
        param,
        value: decimalString(value),
      },
    );
  }
  return x;
}

function splitDouble(value: Rational): [number, number] {
  const hi = roundToBinary(value, BINARY64);
  if (!Number.isFinite(hi)) return [hi, 0];
  return [hi, roundToBinary(sub(value, rationalFromNumber(hi)), BINARY64)];
}

function readCoefficients(o: Record<string, unknown>, kind: 'affine' | 'polynomial'): Rational[] {
  if (kind === 'affine') {
    if (o['coefficients'] !== undefined) {
      throw new BridgeworkError(
        'conflicting-options',
        "`coefficients` must not be given with kind 'affine'",
        {
          param: 'coefficients',
        },
      );
    }
    const scale = exactRational('scale', requireOption('scale', o['scale'], "for kind 'affine'"));
    if (sign(scale) === 0) {
      throw new BridgeworkError('out-of-range', '`scale` must be non-zero; got 0', {
        param: 'scale',
        value: o['scale'],
      });
    }
    return [scale];
  }
  if (o['scale'] !== undefined) {
    throw new BridgeworkError('conflicting-options', "`scale` must not be given with kind 'polynomial'", {
      param: 'scale',
    });
  }
  const list = requireOption('coefficients', o['coefficients'], "for kind 'polynomial'");
  if (!Array.isArray(list) || list.length < 1 || list.length > MAX_POLYNOMIAL_COEFFICIENTS) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`coefficients\` must be an array of 1 to ${MAX_POLYNOMIAL_COEFFICIENTS} values; got ${formatValue(list)}`,
      { param: 'coefficients', value: list, limit: [1, MAX_POLYNOMIAL_COEFFICIENTS] },
    );
  }
  return list.map((v: unknown, k: number) => exactRational(`coefficients[${k}]`, v));
}

/**
 * Builds float32 or float64 constants for an affine or polynomial map from code to quantity, with
 * the worst-case error of evaluating them in that precision over the whole code range.
 *
 * @remarks
 * Constants: each exact source value ({@link ExactValue}) is rounded once, directly, to the
 * nearest number of the precision (ties to even), so float32 constants carry no double rounding.
 * Evaluation (the emitted C, emulated bit for bit here): x = (T)code − offset, then x·scale, or
 * Horner's rule y = c_n, y = y·x + c_(n−1), …, y = y·x + c_0, each operation rounded in T. Float32
 * emulation rounds every binary64 operation with `Math.fround`, which is exact for +, − and ×
 * (binary64 carries more than 2·24 + 2 bits). The C matches when compiled without floating-point
 * contraction and with FLT_EVAL_METHOD 0 (gcc `-std=c99` on x86-64 and Cortex-M4F).
 *
 * Error against the exact map (the source values): exhaustively measured over every code (up to
 * 2^24 codes by default) against a double-double evaluation of the exact map, whose own a priori
 * bound (some 10^−29 relative) is added; or, for sampled ranges, the analytic bound
 * (conversion, offset, coefficient and Horner rounding, after Higham, _Accuracy and Stability of
 * Numerical Algorithms_, 2nd ed., §5.1). Both are reported. With `exact`, the total error against
 * that reference is reported too.
 *
 * @param options - Kind, scale or coefficients, offset, precision, code range, reference, verification.
 * @returns The rounded constants, their source values, the proved error and a bit-exact evaluator.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown kind, precision or
 *   verification; `missing-option` without `scale` (affine) or `coefficients` (polynomial);
 *   `conflicting-options` when the other one is given; `invalid-shape` for 0 or more than 16
 *   coefficients; `out-of-range` for a zero scale or a bad code range; `overflow` when a constant or
 *   a result exceeds the precision's range; `wrong-type`, `not-finite`, `parse-error`,
 *   `not-integer` for bad values; `model-not-finite` when `exact` returns a non-finite value.
 * @example
 * ```ts
 * const map = floatMap({
 *   kind: 'affine',
 *   scale: '50/2147483.648', // kg per count
 *   precision: 'float32',
 *   codeMin: -8388608,
 *   codeMax: 8388607,
 * });
 * map.scale; // 0.000023283064365386963 (25000 · 2^-30, exact in float32)
 * map.evaluate(2147484); // 50.00000762939453 kg (a float32 value)
 * map.maxAbsError; // 0.0000076293946… kg: 2^-17, half an ulp of float32 results near 195 kg
 * ```
 */
export function floatMap(options: FloatMapOptions): FloatMap {
  const o = readOptions(options, {
    known: [
      'kind',
      'scale',
      'coefficients',
      'offset',
      'precision',
      'codeMin',
      'codeMax',
      'quantityUnit',
      'verification',
    ],
    required: ['kind', 'precision', 'codeMin', 'codeMax'],
  });
  const kind = checkOneOf('kind', requireOption('kind', o['kind']), ['affine', 'polynomial'] as const);
  const precision = checkOneOf('precision', requireOption('precision', o['precision']), floatPrecisions);
  const format = formatOf(precision);
  const exactCoefficients = readCoefficients(o, kind);
  const offset = o['offset'] === undefined ? ZERO : exactRational('offset', o['offset']);
  const range = checkCodeRange(o);
  const quantityUnit = checkQuantityUnit(o['quantityUnit']);
  const method = resolveVerification(o['verification'], range);

  const param = (k: number) => (kind === 'affine' ? 'scale' : `coefficients[${k}]`);
  const rounded = exactCoefficients.map((a, k) => roundConstant(param(k), a, format, precision));
  const offsetRounded = roundConstant('offset', offset, format, precision);
  const program: FloatProgram = { kind, precision, offset: offsetRounded, coefficients: rounded };

  const boundInput: FloatBoundInput = {
    kind,
    format,
    offset,
    offsetRounded: rationalFromNumber(offsetRounded),
    coefficients: exactCoefficients,
    coefficientsRounded: rounded.map(rationalFromNumber),
    codeMin: range.codeMin,
    codeMax: range.codeMax,
  };
  const analytic = evaluationBound(boundInput);
  checkResultRange(kind, exactCoefficients, offset, range, analytic, format, precision);

  const polynomial = kind === 'affine' ? [ZERO, exactCoefficients[0] as Rational] : exactCoefficients;
  // Reference constants in binary64 (float32 maps) or double-double (float64 maps): floatScan.ts.
  const split = polynomial.map(splitDouble);
  const [offsetHi, offsetLo] = splitDouble(offset);
  const reference: ReferenceMap = {
    offsetHi,
    offsetLo,
    hi: split.map((p) => p[0]),
    lo: split.map((p) => p[1]),
  };
  const codes = method === 'exhaustive' ? range : sampleCodes(range, [offsetRounded]);
  const scan = scanFloat(program, reference, codes);
  if (scan.nonFiniteCode !== undefined) {
    throw new BridgeworkError(
      'overflow',
      `the ${precision} result at code ${scan.nonFiniteCode} must be finite; it overflows`,
      { param: kind === 'affine' ? 'scale' : 'coefficients', value: scan.nonFiniteCode },
    );
  }
  const u = 2 ** -53;
  const measured = add(
    rationalFromNumber(scan.maxError * (1 + 4 * u)),
    referenceBound(boundInput, precision === 'float64'),
  );
  const proved = method === 'exhaustive' && cmp(measured, analytic) < 0 ? measured : analytic;
  const worstCode = scan.maxCode;
  const worstValue = evaluateProgram(program, worstCode);
  const exactAt = (code: number): Rational => {
    const t = sub(rat(BigInt(code)), offset);
    return polynomial.reduce((sum, a, k) => add(sum, mul(a, pow(t, k))), ZERO);
  };
  const verification: Verification = {
    method,
    codesChecked: scan.count,
    worstCode,
    worstError: roundToBinary(sub(rationalFromNumber(worstValue), exactAt(worstCode)), BINARY64),
  };
  const base = {
    precision,
    codeMin: range.codeMin,
    codeMax: range.codeMax,
    quantityUnit,
    offset: offsetRounded,
    source: { offset: decimalString(offset), coefficients: exactCoefficients.map(decimalString) },
    maxAbsError: upperDouble(proved),
    errorBound: upperDouble(analytic),
    verification,
    evaluate: (code: number) => {
      checkInteger('code', code, { min: range.codeMin, max: range.codeMax });
      return evaluateProgram(program, code);
    },
  };
  const map: FloatMap = Object.freeze(
    kind === 'affine'
      ? { kind, scale: rounded[0] as number, ...base }
      : { kind, coefficients: Object.freeze(rounded.slice()), ...base },
  );
  registerFastEvaluator(map, (code: number) => evaluateProgram(program, code));
  return map;
}

/**
 * Refuses maps whose results could leave the precision's finite range (for float64, 2^990, the
 * range of the double-double reference): every Horner intermediate is at most
 * max_k(|y_k|, |y_k|·X') with |y_k| ≤ Σ_(j≥k) |a_j| X'^(j−k), X' = X + 1 ≥ max|x̂|.
 */
function checkResultRange(
  kind: 'affine' | 'polynomial',
  coefficients: readonly Rational[],
  offset: Rational,
  range: { codeMin: number; codeMax: number },
  bound: Rational,
  format: BinaryFormat,
  precision: string,
): void {
  const X = add(
    max(abs(sub(rat(BigInt(range.codeMin)), offset)), abs(sub(rat(BigInt(range.codeMax)), offset))),
    rat(1n),
  );
  const poly = kind === 'affine' ? [ZERO, coefficients[0] as Rational] : coefficients;
  let partial = ZERO;
  let peak = ZERO;
  for (let k = poly.length - 1; k >= 0; k--) {
    partial = add(mul(partial, X), abs(poly[k] as Rational));
    peak = max(peak, max(partial, mul(partial, X)));
  }
  const reach = add(peak, bound);
  // binary64: below 2^990, where the double-double reference's splitting (Dekker) cannot overflow.
  const limitExponent = format === BINARY64 ? 990 : format.maxExponent;
  if (cmp(reach, mulPow2(rat(1n), limitExponent)) > 0) {
    throw new BridgeworkError(
      'overflow',
      `the ${precision} results over codes ${range.codeMin} … ${range.codeMax} must stay finite; intermediate values could reach ${decimalString(reach)}`,
      { param: kind === 'affine' ? 'scale' : 'coefficients', value: decimalString(reach) },
    );
  }
}
