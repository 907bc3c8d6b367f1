import { BridgeworkError, checkInteger, checkOneOf, requireOption } from '@bridgework/core';
import type { ExactValue } from './exactValue.js';
import { BINARY32, BINARY64, roundToBinary, upperDouble, type BinaryFormat } from './internal/binary.js';
import { callReference, checkCodeRange, readOptions } from './internal/codes.js';
import { decimalString } from './internal/decimal.js';
import { exactRational, rationalFromNumber } from './internal/exact.js';
import { registerFastEvaluator } from './internal/fast.js';
import type { FloatPrecision } from './internal/floatEval.js';
import { abs, add, cmp, div, max, mul, mulPow2, rat, sign, sub, type Rational } from './internal/rational.js';
import { checkQuantityUnit } from './internal/text.js';

/** Options of {@link floatMobiusMap}. */
export interface FloatMobiusMapOptions {
  /** a: the numerator's slope, quantity unit per code (exact). */
  readonly a: ExactValue;
  /** b: the value at the centre code, quantity unit (exact). */
  readonly b: ExactValue;
  /** c: the denominator's slope, per code (exact); 0 gives an affine map. */
  readonly c: ExactValue;
  /** The integer code where x = 0. Default: the middle of the range. */
  readonly centre?: number;
  /** The firmware's arithmetic. */
  readonly precision: FloatPrecision;
  /** Lowest code, an integer in [−2^31, 2^31 − 1]. */
  readonly codeMin: number;
  /** Highest code, an integer in [codeMin, 2^31 − 1]. */
  readonly codeMax: number;
  /** Name of the quantity's unit; default `''`. */
  readonly quantityUnit?: string;
}

/** A linear-fractional (Möbius) map y = (b + a·x)/(1 + c·x) in float arithmetic (see {@link floatMobiusMap}). */
export interface FloatMobiusMap {
  /** Discriminator. */
  readonly kind: 'mobius';
  /** The arithmetic. */
  readonly precision: FloatPrecision;
  /** Lowest code covered. */
  readonly codeMin: number;
  /** Highest code covered. */
  readonly codeMax: number;
  /** The integer code where x = 0. */
  readonly centre: number;
  /** a, b and c rounded to the precision (nearest, ties to even). */
  readonly a: number;
  /** See `a`. */
  readonly b: number;
  /** See `a`. */
  readonly c: number;
  /** The quantity's unit name (may be empty). */
  readonly quantityUnit: string;
  /** The exact values the constants were rounded from, as decimals. */
  readonly source: {
    /** a, exact (or to 40 digits). */
    readonly a: string;
    /** b, exact (or to 40 digits). */
    readonly b: string;
    /** c, exact (or to 40 digits). */
    readonly c: string;
  };
  /**
   * The analytic bound of |result − (b + a·x)/(1 + c·x)| with the exact a, b, c over the range,
   * quantity unit: constant rounding, the conversion of x, two multiplies, two additions and the
   * division (see docs/firmware.md). The arithmetic part of the total error.
   */
  readonly arithmeticBound: number;
  /**
   * The result for a code, bit for bit as the emitted C computes it.
   *
   * @param code - An integer in [codeMin, codeMax].
   * @returns The quantity (a binary32 value for float32).
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, `out-of-range`.
   */
  evaluate(code: number): number;
}

/** Relative rounding error u and the underflow unit η of a format. */
function units(format: BinaryFormat): { u: Rational; eta: Rational } {
  return {
    u: mulPow2(rat(1n), -format.precision),
    eta: mulPow2(rat(1n), format.minExponent - format.precision),
  };
}

/**
 * Builds float32 or float64 constants for y = (b + a·x)/(1 + c·x), x = (T)(code − centre): one
 * subtraction in integers, one conversion, two multiplies, two additions and one division. For
 * targets with a hardware divider (a Cortex-M4F divides a float in 14 cycles).
 *
 * @remarks
 * Every linear-fractional channel map (the Wheatstone bridge read ratiometrically, with leads, for
 * most arrangements) has this form exactly, so the approximation error is the reference's alone.
 * The C is `x = (T)(code - CENTRE); return (B + A * x) / (1.0 + C * x);` with every operation
 * rounded (no contraction). The denominator must keep one sign over the range (checked).
 *
 * Arithmetic bound (standard model fl(z) = z(1 + δ) + η, |δ| ≤ u, Higham 2nd ed. §2.2): with
 * X = max|x|, the numerator N = â·x + b̂ and denominator D = 1 + ĉ·x of the rounded constants are
 * computed within εN = γ₂(|â|X + |b̂|) + 2η and εD = γ₂(1 + |ĉ|X) + 2η, so
 * |num/den − N/D| ≤ Δ = (εN + Y·εD)/(D_min − εD) and the result within u(Y + Δ) + Δ + η, where Y
 * bounds |N/D| and D_min = min|D| (both at the range ends: the map is monotone). The rounding of
 * the constants adds (|Δa|X + |Δb| + Y|Δc|X)/D̂_min; the conversion of x (|x| > 2^p only) adds
 * u·X·|a − b·c|/D_min². All in exact rationals.
 *
 * @param options - a, b, c, centre, precision, code range.
 * @returns The rounded constants, the arithmetic bound and a bit-exact evaluator.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (param `c`) when the denominator
 *   changes sign or vanishes over the range; `overflow` when a constant does not fit the precision;
 *   the option codes for bad options.
 * @example
 * ```ts
 * // y = 100·code/(1000 + code) over codes 0 … 1000, centred at 500: with x = code − 500,
 * // y = (50000 + 100·x)/(1500 + x), so b = 50000/1500, a = 100/1500 and c = 1/1500 per code.
 * const map = floatMobiusMap({ a: '100/1500', b: '50000/1500', c: '1/1500', centre: 500, precision: 'float32', codeMin: 0, codeMax: 1000 });
 * map.evaluate(1000); // ≈ 50
 * ```
 */
export function floatMobiusMap(options: FloatMobiusMapOptions): FloatMobiusMap {
  const o = readOptions(options, {
    known: ['a', 'b', 'c', 'centre', 'precision', 'codeMin', 'codeMax', 'quantityUnit'],
    required: ['a', 'b', 'c', 'precision', 'codeMin', 'codeMax'],
  });
  const a = exactRational('a', o['a']);
  const b = exactRational('b', o['b']);
  const c = exactRational('c', o['c']);
  const precision = checkOneOf('precision', requireOption('precision', o['precision']), [
    'float32',
    'float64',
  ] as const);
  const range = checkCodeRange(o);
  const centre =
    o['centre'] === undefined
      ? Math.floor((range.codeMin + range.codeMax + 1) / 2)
      : checkInteger('centre', o['centre'], { min: range.codeMin, max: range.codeMax });
  const quantityUnit = checkQuantityUnit(o['quantityUnit']);
  const map = buildFloatMobius(a, b, c, centre, precision, range.codeMin, range.codeMax, quantityUnit);
  if (map === undefined) {
    throw new BridgeworkError(
      'out-of-range',
      `\`c\` must keep 1 + c·(code − centre) of one sign over codes ${range.codeMin} … ${range.codeMax}; got ${decimalString(c)}`,
      { param: 'c', value: o['c'] },
    );
  }
  return map;
}

/** {@link floatMobiusMap} without option checks; undefined when the denominator changes sign. @internal */
export function buildFloatMobius(
  a: Rational,
  b: Rational,
  c: Rational,
  centre: number,
  precision: FloatPrecision,
  codeMin: number,
  codeMax: number,
  quantityUnit: string,
): FloatMobiusMap | undefined {
  const format = precision === 'float32' ? BINARY32 : BINARY64;
  const round = (name: string, v: Rational) => {
    const r = roundToBinary(v, format);
    if (!Number.isFinite(r)) {
      throw new BridgeworkError('overflow', `\`${name}\` must fit a ${precision}; got ${decimalString(v)}`, {
        param: name,
        value: decimalString(v),
      });
    }
    return r;
  };
  const ar = round('a', a);
  const br = round('b', b);
  const cr = round('c', c);
  const [A, B, C] = [ar, br, cr].map(rationalFromNumber) as [Rational, Rational, Rational];
  const xLow = rat(BigInt(codeMin - centre));
  const xHigh = rat(BigInt(codeMax - centre));
  const one = rat(1n);
  // Denominators at the ends, exact and rounded constants: one sign, away from zero.
  const dens = [xLow, xHigh].flatMap((x) => [add(one, mul(c, x)), add(one, mul(C, x))]);
  if (!dens.every((d) => sign(d) > 0)) return undefined;
  const X = max(abs(xLow), abs(xHigh));
  const { u, eta } = units(format);
  const g2 = div(mulPow2(u, 1), sub(one, mulPow2(u, 1)));
  const dMin = (k: Rational) => {
    const lo = add(one, mul(k, xLow));
    const hi = add(one, mul(k, xHigh));
    return cmp(lo, hi) < 0 ? lo : hi;
  };
  const valueAt = (aa: Rational, bb: Rational, cc: Rational, x: Rational) =>
    abs(div(add(bb, mul(aa, x)), add(one, mul(cc, x))));
  const Y = max(valueAt(A, B, C, xLow), valueAt(A, B, C, xHigh));
  const Yexact = max(valueAt(a, b, c, xLow), valueAt(a, b, c, xHigh));
  const Dmin = dMin(C);
  const epsN = add(mul(g2, add(mul(abs(A), X), abs(B))), mulPow2(eta, 1));
  const epsD = add(mul(g2, add(one, mul(abs(C), X))), mulPow2(eta, 1));
  const room = sub(Dmin, epsD);
  if (sign(room) <= 0) return undefined;
  const delta = div(add(epsN, mul(Y, epsD)), room);
  let bound = add(add(mul(u, add(Y, delta)), delta), eta);
  // Rounding of the constants: |N̂/D̂ − N/D| ≤ (|Δa|X + |Δb| + |N/D|·|Δc|X)/D̂_min.
  const constants = div(
    add(add(mul(abs(sub(A, a)), X), abs(sub(B, b))), mul(Yexact, mul(abs(sub(C, c)), X))),
    Dmin,
  );
  bound = add(bound, constants);
  // Conversion of x when it is not exact: |x̂ − x| ≤ u·X, times |dy/dx| ≤ |a − b·c|/D_min².
  if (cmp(X, mulPow2(one, format.precision)) > 0) {
    const dExact = dMin(c);
    bound = add(bound, div(mul(mul(u, X), abs(sub(a, mul(b, c)))), mul(dExact, dExact)));
  }
  const f32 = precision === 'float32';
  const evaluateUnchecked = f32
    ? (code: number): number => {
        const x = Math.fround(code - centre);
        return Math.fround(Math.fround(br + Math.fround(ar * x)) / Math.fround(1 + Math.fround(cr * x)));
      }
    : (code: number): number => {
        const x = code - centre;
        return (br + ar * x) / (1 + cr * x);
      };
  const map: FloatMobiusMap = Object.freeze({
    kind: 'mobius' as const,
    precision,
    codeMin,
    codeMax,
    centre,
    a: ar,
    b: br,
    c: cr,
    quantityUnit,
    source: { a: decimalString(a), b: decimalString(b), c: decimalString(c) },
    arithmeticBound: upperDouble(bound),
    evaluate(code: number): number {
      checkInteger('code', code, { min: codeMin, max: codeMax });
      return evaluateUnchecked(code);
    },
  });
  registerFastEvaluator(map, evaluateUnchecked);
  return map;
}

/**
 * Fits y = (b + a·x)/(1 + c·x), x = code − centre, to a map through three Chebyshev points of the
 * range (exact for a linear-fractional map, up to the map's own rounding). @internal
 */
export function fitMobius(
  f: (code: number) => number,
  codeMin: number,
  codeMax: number,
  centre: number,
): { a: number; b: number; c: number } | undefined {
  const mid = (codeMin + codeMax) / 2;
  const h = (codeMax - codeMin) / 2;
  if (!(h > 0)) return undefined;
  const s = Math.cos(Math.PI / 6);
  // Scaled unknowns: with τ = x/h, y(1 + γτ) = b + ατ, i.e. b + α·τ − γ·τ·y = y.
  const rows = [-s, 0, s].map((p) => {
    const code = mid + h * p;
    const y = callReference(f, code);
    const tau = (code - centre) / h;
    return [1, tau, -tau * y, y];
  });
  const solution = solve3(rows);
  if (solution === undefined) return undefined;
  const [b, alpha, gamma] = solution;
  const out = { a: alpha / h, b, c: gamma / h };
  return Number.isFinite(out.a) && Number.isFinite(out.b) && Number.isFinite(out.c) ? out : undefined;
}

/** Gaussian elimination with partial pivoting on a 3 × 4 augmented matrix. */
function solve3(m: readonly (readonly number[])[]): [number, number, number] | undefined {
  const r: Float64Array[] = m.map((row) => Float64Array.from(row));
  for (let col = 0; col < 3; col++) {
    let pivot = col;
    for (let i = col + 1; i < 3; i++) {
      if (
        Math.abs((r[i] as Float64Array)[col] as number) > Math.abs((r[pivot] as Float64Array)[col] as number)
      )
        pivot = i;
    }
    const top = r[pivot] as Float64Array;
    if (top[col] === 0) return undefined;
    r[pivot] = r[col] as Float64Array;
    r[col] = top;
    for (let i = col + 1; i < 3; i++) {
      const row = r[i] as Float64Array;
      const k = (row[col] as number) / (top[col] as number);
      for (let j = col; j < 4; j++) row[j] = (row[j] as number) - k * (top[j] as number);
    }
  }
  const x = [0, 0, 0];
  for (let i = 2; i >= 0; i--) {
    const row = r[i] as Float64Array;
    let s = row[3] as number;
    for (let j = i + 1; j < 3; j++) s -= (row[j] as number) * (x[j] as number);
    x[i] = s / (row[i] as number);
  }
  return x as [number, number, number];
}
