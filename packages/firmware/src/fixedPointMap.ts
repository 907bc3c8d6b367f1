import {
  BridgeworkError,
  checkInteger,
  checkOneOf,
  formatValue,
  requireOption,
  type Interval,
} from '@bridgework/core';
import type { ExactValue } from './exactValue.js';
import { BINARY64, roundToBinary, upperDouble } from './internal/binary.js';
import {
  checkBits,
  checkCodeRange,
  readOptions,
  resolveVerification,
  sampleCodes,
} from './internal/codes.js';
import { decimalString } from './internal/decimal.js';
import { exactRational, rationalFromNumber } from './internal/exact.js';
import { registerFastEvaluator } from './internal/fast.js';
import { scanAll, scanCodes, type FixedKernel, type ScanResult } from './internal/fixedScan.js';
import {
  abs,
  add,
  cmp,
  div,
  max,
  mul,
  mulPow2,
  rat,
  roundHalfEven,
  sign,
  sub,
  ZERO,
  type Rational,
} from './internal/rational.js';
import { checkQuantityUnit } from './internal/text.js';
import { fixedPointRoundings, roundShiftUnchecked, type FixedPointRounding } from './roundShift.js';
import type { Verification, VerificationMode } from './verification.js';

/** Options of {@link fixedPointMap}. */
export interface FixedPointMapOptions {
  /** Quantity per converter code (the map's slope), exact; any non-zero value, either sign. */
  readonly scale: ExactValue;
  /** The code at which the quantity is zero, exact (need not be an integer). Default 0. */
  readonly offset?: ExactValue;
  /** Lowest code the firmware will convert, an integer in [−2^31, 2^31 − 1]. */
  readonly codeMin: number;
  /** Highest code the firmware will convert, an integer in [codeMin, 2^31 − 1]. */
  readonly codeMax: number;
  /** The quantity of one output LSB, in the unit of `scale` (> 0, exact), e.g. `'0.00001'` kg for 0.01 g. */
  readonly outputUnit: ExactValue;
  /** Name of the quantity's unit for reports and headers (e.g. `'kg'`); default `''`. */
  readonly quantityUnit?: string;
  /** Width of the signed multiplier word in bits, in [2, 32]. Default 32. */
  readonly coefficientBits?: number;
  /** Width of the signed accumulator in bits, in [8, 64]. Default 64. */
  readonly accumulatorBits?: number;
  /** Width of the signed output word in bits, in [2, 32]. Default 32. */
  readonly outputBits?: number;
  /** How the accumulator is rounded to the output. Default `'half-even'`. */
  readonly rounding?: FixedPointRounding;
  /** How the error is verified. Default `'auto'` (exhaustive up to 2^24 codes). */
  readonly verification?: VerificationMode;
}

/**
 * A Q-format: the fixed-point reading of the multiplier word.
 *
 * @remarks
 * Qm.n is a signed two's-complement word of 1 + m + n bits holding integer · 2^−n: n fraction bits,
 * m integer bits, and the sign bit counted in neither (common practice in DSP texts; Q0.31 is the
 * "Q31" of 32-bit signal-processing libraries). Here n is the map's shift and
 * m = coefficientBits − 1 − n. A negative m means n > coefficientBits − 1: the word holds only the low
 * fraction bits and the leading ones are implicit sign copies (Q-3.34 in 32 bits holds values in
 * [−2^−3, 2^−3)).
 */
export interface QFormat {
  /** m: integer bits, sign excluded (may be negative). */
  readonly integerBits: number;
  /** n: fraction bits (the shift). */
  readonly fractionBits: number;
  /** 1 + m + n: the word width (the coefficient bits). */
  readonly wordBits: number;
  /** The name, e.g. `'Q1.30'`. */
  readonly text: string;
}

/** The exact source values of a fixed-point map, as decimal strings (exact, or to 40 digits). */
export interface FixedPointSource {
  /** Quantity per code. */
  readonly scale: string;
  /** Code at zero quantity. */
  readonly offset: string;
  /** Quantity per output LSB. */
  readonly outputUnit: string;
  /** m = scale / outputUnit: output LSB per code, the coefficient the multiplier approximates. */
  readonly outputPerCode: string;
  /** m · 2^shift: the exact multiplier before rounding to an integer. */
  readonly multiplierExact: string;
}

/** A closed interval of bigints. */
export interface BigIntRange {
  /** Smallest value. */
  readonly min: bigint;
  /** Largest value. */
  readonly max: bigint;
}

/** Constants and proved bounds of an integer map from converter code to output (see {@link fixedPointMap}). */
export interface FixedPointMap {
  /** Discriminator: the affine form. */
  readonly kind: 'affine';
  /** Lowest code covered. */
  readonly codeMin: number;
  /** Highest code covered. */
  readonly codeMax: number;
  /** The integer subtracted from the code first. */
  readonly offsetCode: number;
  /** The signed multiplier M (|M| ≤ 2^(coefficientBits−1) − 1). */
  readonly multiplier: number;
  /** The shift s: the output is acc / 2^s, rounded. */
  readonly shift: number;
  /**
   * Added to the product, in accumulator units: round((offsetCode − offset)·m·2^s), which carries a
   * fractional offset; 0 when the offset is an integer.
   */
  readonly bias: number;
  /** The rounding of acc / 2^s. */
  readonly rounding: FixedPointRounding;
  /** Multiplier word width in bits. */
  readonly coefficientBits: number;
  /** Accumulator width in bits. */
  readonly accumulatorBits: number;
  /** Output word width in bits. */
  readonly outputBits: number;
  /** The multiplier's Q-format (n = shift). */
  readonly qFormat: QFormat;
  /** Name of the quantity's unit (may be empty). */
  readonly quantityUnit: string;
  /** The exact values the constants were derived from. */
  readonly source: FixedPointSource;
  /** M/2^s − m: the coefficient error in output LSB per code, nearest double (0 when exact). */
  readonly coefficientError: number;
  /** Outputs at the ends of the code range (the map is monotone), in output LSB. */
  readonly outputRange: Interval;
  /** Extreme accumulator values over the code range, rounding addend included. */
  readonly accumulatorRange: BigIntRange;
  /** Largest accumulator magnitude allowed: 2^(accumulatorBits−1) − 1. */
  readonly accumulatorLimit: bigint;
  /**
   * Proved maximum |output − (code − offset)·scale/outputUnit| over the code range, in output LSB:
   * exhaustive result plus its measuring margin, or the analytic bound when sampled.
   */
  readonly maxAbsError: number;
  /** The analytic bound max|ρ| + max|d·Δ + β| over the range, in output LSB (≥ `maxAbsError`). */
  readonly errorBound: number;
  /** How the error was verified and the worst case found. */
  readonly verification: Verification;
  /**
   * The integer output for a code, computed exactly as the firmware computes it.
   *
   * @param code - An integer in [codeMin, codeMax].
   * @returns The output in output LSB.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, `out-of-range`.
   */
  evaluate(code: number): number;
}

function overflow(param: string, message: string, value: unknown, limit: string): never {
  throw new BridgeworkError('overflow', message, { param, value, limit });
}

function bigAbs(x: bigint): bigint {
  return x < 0n ? -x : x;
}

interface Design {
  readonly shift: number;
  readonly multiplier: bigint;
  readonly bias: bigint;
  readonly accMin: bigint;
  readonly accMax: bigint;
}

/** The largest shift whose multiplier fits the coefficient word and whose accumulator fits its width. */
function chooseShift(
  m: Rational,
  offsetError: Rational,
  dMin: bigint,
  dMax: bigint,
  bits: { coefficient: number; accumulator: number },
  rounding: FixedPointRounding,
): Design {
  const coefLimit = (1n << BigInt(bits.coefficient - 1)) - 1n;
  const accLimit = (1n << BigInt(bits.accumulator - 1)) - 1n;
  let coefficientFits = false;
  for (let s = bits.accumulator - 2; s >= 0; s--) {
    const M = roundHalfEven(mulPow2(m, s));
    if (bigAbs(M) > coefLimit) continue;
    // A zero multiplier maps every code to one output: a lower shift cannot help.
    if (M === 0n && coefficientFits) break;
    if (M === 0n) {
      throw new BridgeworkError(
        'out-of-range',
        `\`scale\` / \`outputUnit\` must be at least 2^-${bits.accumulator - 1} in magnitude to give a non-zero multiplier; got ${decimalString(m)}`,
        { param: 'scale', value: decimalString(m) },
      );
    }
    coefficientFits = true;
    const bias = roundHalfEven(mulPow2(mul(offsetError, m), s));
    const half = s > 0 && rounding !== 'floor' ? 1n << BigInt(s - 1) : 0n;
    const a = dMin * M + bias;
    const b = dMax * M + bias;
    const accMin = (a < b ? a : b) - half;
    const accMax = (a < b ? b : a) + half;
    // M and bias too: each must be a constant of the accumulator's type.
    const widest = [dMin, dMax, M, bias, dMin * M, dMax * M, accMin, accMax].reduce((w, v) =>
      bigAbs(v) > w ? bigAbs(v) : w,
    );
    if (widest <= accLimit) return { shift: s, multiplier: M, bias, accMin, accMax };
  }
  if (!coefficientFits) {
    overflow(
      'scale',
      `\`scale\` / \`outputUnit\` (${decimalString(m)} output LSB per code) must fit a ${bits.coefficient}-bit multiplier at shift 0; it overflows`,
      decimalString(m),
      `${coefLimit}`,
    );
  }
  overflow(
    'accumulatorBits',
    `\`accumulatorBits\` (${bits.accumulator}) must hold (code − offsetCode)·multiplier over the code range at some shift with a non-zero multiplier; it overflows at every one`,
    bits.accumulator,
    `${accLimit}`,
  );
}

/**
 * Builds the integer pipeline for y = (code − offset)·scale: multiplier, shift and offset, with the
 * proved maximum error and an overflow-free guarantee over the code range.
 *
 * @remarks
 * The firmware computes, in a signed accumulator of `accumulatorBits`,
 *
 *   acc = (code − offsetCode)·multiplier + bias,   output = round(acc / 2^shift)
 *
 * with the chosen rounding ({@link roundShift}), which is `round((code − offsetCode)·multiplier / 2^shift)`
 * when the offset is an integer (bias 0). The output is in units of `outputUnit`: the map
 * approximated is t(code) = (code − offset)·m with m = scale/outputUnit, in output LSB.
 *
 * Constants: every input is read as an exact rational ({@link ExactValue}); offsetCode is the
 * integer nearest the offset (ties to even); for each shift s from accumulatorBits − 2 down, the
 * multiplier is M = round(m·2^s) (nearest, ties to even) and bias = round((offsetCode − offset)·m·2^s).
 * The shift chosen is the largest for which |M| ≤ 2^(coefficientBits−1) − 1 (the word is signed, so a
 * negative scale works and the symmetric limit keeps −M representable) and every intermediate value —
 * code − offsetCode, the product, the accumulator, and the accumulator with the rounding addend
 * 2^(s−1) — stays within ±(2^(accumulatorBits−1) − 1) at both ends of the code range (all are
 * affine in the code, so the ends are the extremes). The outputs at the ends must fit a signed
 * `outputBits` word. Anything else is refused: overflow is an error, never a warning.
 *
 * Error: exactly e = ρ + d·Δ + β with d = code − offsetCode, ρ = output − acc/2^s (the rounding,
 * within ±1/2, or (−1, 0] for floor), Δ = M/2^s − m and β = bias/2^s − (offsetCode − offset)·m. The
 * analytic bound `errorBound` is max|ρ| + max|d·Δ + β| at the range ends. `maxAbsError` comes from
 * evaluating every code (up to 2^24 codes by default, in exact integer steps; see docs/firmware.md
 * for the proof) plus a measuring margin ε = 8u(D|Δ| + |β|) + 2u (u = 2^−53, D = max|d|; zero when
 * the coefficient and offset are exact), or equals the analytic bound when the range is sampled. The Q-format of the multiplier is Qm.n with n = shift and
 * m = coefficientBits − 1 − n ({@link QFormat}).
 *
 * @param options - Scale, offset, code range, output unit, word widths, rounding, reference, verification.
 * @returns The constants, their Q-format, ranges, proved error and an exact evaluator.
 * @throws {@link @bridgework/core!BridgeworkError} `overflow` when no shift fits the multiplier word
 *   (`param` `'scale'`) or the accumulator (`'accumulatorBits'`), or the outputs do not fit
 *   (`'outputBits'`); `out-of-range` for a zero scale, a scale too small for any multiplier, or a bad
 *   code range; `not-positive` for `outputUnit` ≤ 0; `missing-option`, `wrong-type`, `not-finite`,
 *   `parse-error`, `not-integer`, `invalid-option` for bad options; `model-not-finite` when `exact`
 *   returns a non-finite value.
 * @example
 * ```ts
 * // 50 kg cell, 2 mV/V, gain 128, 24-bit bipolar converter: 2^30 counts per V/V; output in 0.01 g.
 * const map = fixedPointMap({
 *   scale: '50/2147483.648', // kg per count = 50 kg / (0.002 V/V · 2^30 counts per V/V)
 *   outputUnit: '0.00001', // 0.01 g in kg
 *   codeMin: -8388608,
 *   codeMax: 8388607,
 * });
 * map.multiplier; // 1250000000
 * map.shift; // 29  (Q2.29)
 * map.maxAbsError; // 0.5 (the coefficient is exact)
 * ```
 */
export function fixedPointMap(options: FixedPointMapOptions): FixedPointMap {
  const o = readOptions(options, {
    known: [
      'scale',
      'offset',
      'codeMin',
      'codeMax',
      'outputUnit',
      'quantityUnit',
      'coefficientBits',
      'accumulatorBits',
      'outputBits',
      'rounding',
      'verification',
    ],
    required: ['scale', 'codeMin', 'codeMax', 'outputUnit'],
  });
  const scale = exactRational('scale', requireOption('scale', o['scale']));
  if (sign(scale) === 0) {
    throw new BridgeworkError('out-of-range', '`scale` must be non-zero; got 0', {
      param: 'scale',
      value: o['scale'],
    });
  }
  const offset = o['offset'] === undefined ? ZERO : exactRational('offset', o['offset']);
  const outputUnit = exactRational('outputUnit', requireOption('outputUnit', o['outputUnit']));
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
  const range = checkCodeRange(o);
  const coefficientBits = checkBits('coefficientBits', o['coefficientBits'], 32, 2, 32);
  const accumulatorBits = checkBits('accumulatorBits', o['accumulatorBits'], 64, 8, 64);
  const outputBits = checkBits('outputBits', o['outputBits'], 32, 2, 32);
  const rounding =
    o['rounding'] === undefined ? 'half-even' : checkOneOf('rounding', o['rounding'], fixedPointRoundings);
  const quantityUnit = checkQuantityUnit(o['quantityUnit']);
  const method = resolveVerification(o['verification'], range);

  const m = div(scale, outputUnit);
  const offsetCodeBig = roundHalfEven(offset);
  if (bigAbs(offsetCodeBig) > BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new BridgeworkError('out-of-range', '`offset` must lie within ±2^53 codes', {
      param: 'offset',
      value: o['offset'],
      limit: [-Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER],
    });
  }
  const offsetError = sub(rat(offsetCodeBig), offset);
  const dMin = BigInt(range.codeMin) - offsetCodeBig;
  const dMax = BigInt(range.codeMax) - offsetCodeBig;
  const design = chooseShift(
    m,
    offsetError,
    dMin,
    dMax,
    { coefficient: coefficientBits, accumulator: accumulatorBits },
    rounding,
  );
  const { shift, multiplier, bias } = design;
  const s = BigInt(shift);

  const yA = roundShiftUnchecked(dMin * multiplier + bias, s, rounding);
  const yB = roundShiftUnchecked(dMax * multiplier + bias, s, rounding);
  const outMin = yA < yB ? yA : yB;
  const outMax = yA < yB ? yB : yA;
  const outLimit = 1n << BigInt(outputBits - 1);
  if (outMin < -outLimit || outMax > outLimit - 1n) {
    overflow(
      'outputBits',
      `\`outputBits\` (${outputBits}) must hold the outputs ${outMin} … ${outMax} over the code range; they overflow [${-outLimit}, ${outLimit - 1n}]`,
      outputBits,
      `${outLimit - 1n}`,
    );
  }

  const offsetCode = Number(offsetCodeBig);
  const delta = sub(mulPow2(rat(multiplier), -shift), m);
  const beta = sub(mulPow2(rat(bias), -shift), mul(offsetError, m));
  const analytic = analyticBound(delta, beta, dMin, dMax, shift, rounding);
  const kernel: FixedKernel = {
    dMin: Number(dMin),
    dMax: Number(dMax),
    offsetCode,
    multiplier: Number(multiplier),
    shift,
    bias,
    rounding,
    delta: roundToBinary(delta, BINARY64),
    beta: roundToBinary(beta, BINARY64),
  };
  const scan =
    method === 'exhaustive' ? scanAll(kernel) : scanCodes(kernel, sampleCodes(range, [offsetCode]));

  const evaluateExact = (code: number): bigint =>
    roundShiftUnchecked((BigInt(code) - offsetCodeBig) * multiplier + bias, s, rounding);
  const exactError = (code: number): Rational =>
    sub(rat(evaluateExact(code)), mul(sub(rat(BigInt(code)), offset), m));
  const verification = verificationOf(scan, method, exactError);
  const dAbs = bigAbs(dMin) > bigAbs(dMax) ? bigAbs(dMin) : bigAbs(dMax);
  // Margin of the binary64 measurement (fixedScan.ts): ε = 8u(D|Δ| + |β|) + 2u with u = 2^−53, and
  // 0 when the affine part vanishes (ρ alone is exact) unless ρ itself was rounded (shift > 52).
  const affinePart = add(mul(rat(dAbs), abs(delta)), abs(beta));
  const margin =
    sign(affinePart) === 0 && shift <= 52 ? ZERO : add(mulPow2(affinePart, 3 - 53), mulPow2(rat(1n), 1 - 53));
  const measured = add(rationalFromNumber(Math.max(scan.maxError, -scan.minError)), margin);
  const proved = method === 'exhaustive' && cmp(measured, analytic) < 0 ? measured : analytic;

  const checkCode = (code: unknown): number => {
    checkInteger('code', code, { min: range.codeMin, max: range.codeMax });
    return code as number;
  };
  const map: FixedPointMap = Object.freeze({
    kind: 'affine' as const,
    codeMin: range.codeMin,
    codeMax: range.codeMax,
    offsetCode,
    multiplier: Number(multiplier),
    shift,
    bias: Number(bias),
    rounding,
    coefficientBits,
    accumulatorBits,
    outputBits,
    qFormat: qFormat(coefficientBits, shift),
    quantityUnit,
    source: {
      scale: decimalString(scale),
      offset: decimalString(offset),
      outputUnit: decimalString(outputUnit),
      outputPerCode: decimalString(m),
      multiplierExact: decimalString(mulPow2(m, shift)),
    },
    coefficientError: roundToBinary(delta, BINARY64),
    outputRange: { min: Number(outMin), max: Number(outMax) },
    accumulatorRange: { min: design.accMin, max: design.accMax },
    accumulatorLimit: (1n << BigInt(accumulatorBits - 1)) - 1n,
    maxAbsError: upperDouble(proved),
    errorBound: upperDouble(analytic),
    verification,
    evaluate: (code: number) => Number(evaluateExact(checkCode(code))),
  });
  registerFastEvaluator(map, fastAffineEvaluator(kernel));
  return map;
}

/**
 * The output for a code in binary64 arithmetic, exact: acc = d·M + bias is split so that every
 * partial value is an integer below 2^53 (d·M_hi·2^16 + d·M_lo + bias, |M_lo| < 2^16), the floor
 * quotient and remainder by 2^s formed from the parts, then rounded as {@link roundShift} does.
 * Shifts above 52 go through BigInt.
 */
function fastAffineEvaluator(k: FixedKernel): (code: number) => number {
  const { offsetCode, multiplier: M, shift: s, rounding } = k;
  const bias = Number(k.bias); // |bias| ≤ |M|/2 + 1 < 2^31
  const T = 2 ** s;
  const half = T / 2;
  const mHi = Math.floor(M / 65536);
  const mLo = M - mHi * 65536;
  const bigShift = BigInt(s);
  const round = (q: number, r: number): number => {
    if (rounding === 'floor' || s === 0) return q;
    if (rounding === 'half-away') return (q >= 0 ? r >= half : r > half) ? q + 1 : q;
    return r > half || (r === half && q % 2 !== 0) ? q + 1 : q;
  };
  return (code: number): number => {
    const d = code - offsetCode;
    if (s <= 21) {
      // |acc| < 2^(31 + s) ≤ 2^52: exact in binary64 (the outputs fit 32 bits).
      const acc = d * M + bias;
      const q = Math.floor(acc / T);
      return round(q, acc - q * T);
    }
    if (s > 52) return Number(roundShiftUnchecked(BigInt(d) * BigInt(M) + k.bias, bigShift, rounding));
    // acc = P1·2^16 + L with P1 = d·M_hi, L = d·M_lo + bias (both exact integers below 2^53).
    const P1 = d * mHi;
    const L = d * mLo + bias;
    const D = 2 ** (s - 16);
    const q1 = Math.floor(P1 / D);
    const R = (P1 - q1 * D) * 65536 + L; // |R| < 2^s + 2^49 ≤ 2^53: exact
    const q2 = Math.floor(R / T);
    return round(q1 + q2, R - q2 * T);
  };
}

/** Qm.n for a multiplier word of `bits` bits and n = shift fraction bits. */
function qFormat(bits: number, shift: number): QFormat {
  const integerBits = bits - 1 - shift;
  return { integerBits, fractionBits: shift, wordBits: bits, text: `Q${integerBits}.${shift}` };
}

/** max |ρ + d·Δ + β| over the range from the extremes of ρ and of the affine part. */
function analyticBound(
  delta: Rational,
  beta: Rational,
  dMin: bigint,
  dMax: bigint,
  shift: number,
  rounding: FixedPointRounding,
): Rational {
  const a = add(mul(rat(dMin), delta), beta);
  const b = add(mul(rat(dMax), delta), beta);
  const affineLow = cmp(a, b) < 0 ? a : b;
  const affineHigh = cmp(a, b) < 0 ? b : a;
  let rhoLow: Rational;
  let rhoHigh: Rational;
  if (shift === 0) {
    rhoLow = ZERO;
    rhoHigh = ZERO;
  } else if (rounding === 'floor') {
    rhoLow = rat(1n - (1n << BigInt(shift)), 1n << BigInt(shift)); // −(2^s − 1)/2^s
    rhoHigh = ZERO;
  } else {
    rhoLow = rat(-1n, 2n);
    rhoHigh = rat(1n, 2n);
  }
  return max(abs(add(rhoLow, affineLow)), abs(add(rhoHigh, affineHigh)));
}

function verificationOf(
  scan: ScanResult,
  method: 'exhaustive' | 'sampled',
  exactError: (code: number) => Rational,
): Verification {
  const atMax = exactError(scan.maxCode);
  const atMin = exactError(scan.minCode);
  const useMax = cmp(abs(atMax), abs(atMin)) >= 0;
  return {
    method,
    codesChecked: scan.count,
    worstCode: useMax ? scan.maxCode : scan.minCode,
    worstError: roundToBinary(useMax ? atMax : atMin, BINARY64),
  };
}
