import {
  BridgeworkError,
  checkFinite,
  checkOneOf,
  checkOptions,
  formatValue,
  type Interval,
} from '@bridgework/core';
import { cIdentifierFromName } from './cIdentifierFromName.js';
import { upperDouble } from './internal/binary.js';
import { doubleLiteral, floatLiteral } from './internal/cLiterals.js';
import { rationalFromNumber } from './internal/exact.js';
import { floatPrecisions, type FloatPrecision } from './floatMap.js';
import { abs, add, div, max, mul, mulPow2, rat, sub, ZERO, type Rational } from './internal/rational.js';

/** The most rows or columns of a matrix map. */
export const MAX_MATRIX_SIZE = 64;

/** Options of {@link matrixMap}. */
export interface MatrixMapOptions {
  /** C (M×N): y_j = Σ_i C_ji·(x_i − a_i). Finite doubles. */
  readonly matrix: readonly (readonly number[])[];
  /** a (N), subtracted from each input. Default zeros. */
  readonly offsets?: readonly number[];
  /** The range of each input x_i (N), over which the bound holds. */
  readonly inputRanges: readonly Interval[];
  /** The arithmetic of the firmware: `'float32'` or `'float64'`. */
  readonly precision: FloatPrecision;
}

/** A matrix-vector map for firmware with its proved error bound (see {@link matrixMap}). */
export interface MatrixMap {
  /** The arithmetic. */
  readonly precision: FloatPrecision;
  /** The matrix as the firmware holds it (each entry rounded to the precision, nearest). */
  readonly matrix: readonly (readonly number[])[];
  /** The offsets as the firmware holds them. */
  readonly offsets: readonly number[];
  /**
   * Per output, the proved bound on |computed − exact| over the input ranges, where exact is
   * Σ_i C_ji·(x_i − a_i) in real arithmetic with the given (double) C and a, and computed is the
   * emitted C function on the inputs rounded to the precision. In the outputs' unit.
   */
  readonly bounds: readonly number[];
  /** The parts of each bound: the constants' and inputs' rounding, and the arithmetic's. */
  readonly boundParts: readonly {
    /** The constants' and inputs' rounding to the precision (0 in float64). */
    readonly rounding: number;
    /** The subtraction and inner product's arithmetic, underflow included. */
    readonly arithmetic: number;
  }[];
  /**
   * The outputs as the emitted C computes them (every operation rounded to the precision, in the
   * C function's order), for checks.
   *
   * @param inputs - N inputs, each within its input range.
   * @returns M outputs.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for the wrong number of
   *   inputs, `not-finite`, and `out-of-range` for an input outside its range.
   */
  evaluate(inputs: ArrayLike<number>): number[];
  /**
   * The C99 source of the map: the constant arrays and a `static inline` function
   * `<prefix>_<name>_<precision>(const T x[N], T y[M])`, which compiles with
   * `-std=c99 -Wall -Wextra -Wconversion -Werror -pedantic`.
   *
   * @param prefix - Lower-case C name prefix (as {@link cIdentifierFromName} makes).
   * @param name - The map's name (any text with a letter or digit).
   * @returns The source text.
   */
  cSource(prefix: string, name: string): string;
}

function checkMatrix(value: unknown): number[][] {
  if (!Array.isArray(value) || value.length === 0 || value.length > MAX_MATRIX_SIZE) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`matrix\` must be an array of 1 to ${MAX_MATRIX_SIZE} rows; got ${formatValue(value)}`,
      { param: 'matrix', value },
    );
  }
  const width = Array.isArray(value[0]) ? (value[0] as unknown[]).length : 0;
  return value.map((row, j) => {
    if (!Array.isArray(row) || row.length !== width || width === 0 || width > MAX_MATRIX_SIZE) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`matrix[${j}]\` must hold ${width > 0 ? width : `1 to ${MAX_MATRIX_SIZE}`} numbers, as the first row; got ${formatValue(row)}`,
        { param: `matrix[${j}]`, value: row },
      );
    }
    return row.map((x, i) => checkFinite(`matrix[${j}][${i}]`, x));
  });
}

/**
 * A matrix-vector map y = C·(x − a) for firmware (a multi-component sensor's load matrix, say),
 * in float32 or float64, with a proved bound on its total error over given input ranges.
 *
 * @remarks
 * The emitted function computes, for each output j, s = 0; s += c̃_ji·(x̃_i − ã_i) for i = 0…N−1
 * in order, every operation rounded to nearest in the precision (C99 without contraction), with
 * c̃, ã the constants rounded to the precision and x̃ the inputs as the caller passes them in
 * that precision. Error analysis (N. J. Higham, _Accuracy and Stability of Numerical
 * Algorithms_, 2nd ed., SIAM 2002, §2.2 and §3.1, Lemma 3.1 and the inner-product bound (3.5)):
 * each term carries the factors (1 + δ) of the constant's rounding, of the subtraction and of the
 * inner product's N operations, so with u = 2⁻²⁴ (float32) or 2⁻⁵³ (float64) and
 * γ_k = k·u/(1 − k·u),
 *
 * |ỹ_j − y_j| ≤ Σ_i |C_ji|·[γ_k·D_i + (1 + γ_k)·u·(X_i + |a_i|)] + N·η·(1 + γ_k),
 *
 * with k = N + 2 (float32; k = N + 1 in float64, whose constants are exact), D_i the largest
 * |x_i − a_i| and X_i the largest |x_i| over the range, the u·(X_i + |a_i|) term the rounding of
 * the input and the offset to float32 (zero in float64, where both are exact), and η = 2⁻¹⁵⁰ or
 * 2⁻¹⁰⁷⁵ the absolute error of a product that underflows. The bound is evaluated in exact rational
 * arithmetic and rounded up to a double. Inputs whose products could overflow are refused.
 *
 * @param options - Matrix, offsets, input ranges, precision.
 * @returns The map, its bounds, an evaluator that reproduces the C, and the C source.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the
 *   options rule; `invalid-shape` for ragged or oversized arrays; `not-finite` for non-finite
 *   entries; `invalid-option` for an unknown precision; `out-of-range` for an empty input range
 *   or values beyond the precision's range.
 * @example
 * ```ts
 * const map = matrixMap({
 *   matrix: [[2000, -30], [5, 1980]],
 *   offsets: [-0.05, 0.03],
 *   inputRanges: [{ min: -1.5, max: 1.5 }, { min: -1.5, max: 1.5 }],
 *   precision: 'float32',
 * });
 * map.bounds; // ≈ [0.00094, 0.00091] (in the outputs’ unit)
 * ```
 */
export function matrixMap(options: MatrixMapOptions): MatrixMap {
  const o = checkOptions('options', options, {
    known: ['matrix', 'offsets', 'inputRanges', 'precision'],
    required: ['matrix', 'inputRanges', 'precision'],
  });
  const precision = checkOneOf('precision', o['precision'], floatPrecisions);
  const c = checkMatrix(o['matrix']);
  const m = c.length;
  const n = (c[0] as number[]).length;
  const offsetsIn = o['offsets'] ?? new Array<number>(n).fill(0);
  if (!Array.isArray(offsetsIn) || offsetsIn.length !== n) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`offsets\` must hold ${n} numbers; got ${formatValue(offsetsIn)}`,
      {
        param: 'offsets',
        value: offsetsIn,
      },
    );
  }
  const a = offsetsIn.map((x, i) => checkFinite(`offsets[${i}]`, x));
  const rangesIn = o['inputRanges'];
  if (!Array.isArray(rangesIn) || rangesIn.length !== n) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`inputRanges\` must hold ${n} intervals { min, max }; got ${formatValue(rangesIn)}`,
      { param: 'inputRanges', value: rangesIn },
    );
  }
  const ranges = rangesIn.map((r, i) => {
    const ro = checkOptions(`inputRanges[${i}]`, r, { known: ['min', 'max'], required: ['min', 'max'] });
    const lo = checkFinite(`inputRanges[${i}].min`, ro['min']);
    const hi = checkFinite(`inputRanges[${i}].max`, ro['max']);
    if (!(lo <= hi)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`inputRanges[${i}]\` must have min ≤ max; got [${lo}, ${hi}]`,
        {
          param: `inputRanges[${i}]`,
          value: r,
        },
      );
    }
    return { min: lo, max: hi };
  });
  const f32 = precision === 'float32';
  const round = f32 ? Math.fround : (x: number) => x;
  const limit = f32 ? 3.4e38 : 1.7e308;
  // Constants as the firmware holds them.
  const cr = c.map((row) => row.map(round));
  const ar = a.map(round);
  // Everything the arithmetic touches must stay far inside the precision's range.
  const biggest = Math.max(
    ...cr.flat().map(Math.abs),
    ...ranges.map((r) => Math.max(Math.abs(r.min), Math.abs(r.max))),
    ...ar.map(Math.abs),
  );
  const sums = c.map((row) =>
    row.reduce(
      (s, x, i) =>
        s + Math.abs(x) * (Math.max(Math.abs(ranges[i]!.min), Math.abs(ranges[i]!.max)) + Math.abs(a[i]!)),
      0,
    ),
  );
  if (
    !(biggest < limit / 4) ||
    !sums.every((s) => s < limit / 4) ||
    cr.flat().some((x, k) => x === 0 && c.flat()[k] !== 0)
  ) {
    throw new BridgeworkError(
      'out-of-range',
      `\`matrix\`, \`offsets\` and \`inputRanges\` must keep every constant, input and product within ${precision}'s range (no overflow, no entry that rounds to zero); rescale the inputs or outputs`,
      { param: 'matrix', limit: precision },
    );
  }
  // The bound, in exact rationals.
  const uExp = f32 ? -24 : -53;
  const u = mulPow2(rat(1n), uExp);
  const k = f32 ? n + 2 : n + 1;
  // γ_k = k·u/(1 − k·u)
  const ku = mul(rat(BigInt(k)), u);
  const gammaR = div(ku, sub(rat(1n), ku));
  const onePlusGamma = add(rat(1n), gammaR);
  const eta = mulPow2(rat(1n), f32 ? -150 : -1075);
  const parts = c.map((row) => {
    let rounding: Rational = ZERO;
    let arithmetic: Rational = ZERO;
    row.forEach((cji, i) => {
      const cq = abs(rationalFromNumber(cji));
      const aq = rationalFromNumber(a[i]!);
      const lo = rationalFromNumber(ranges[i]!.min);
      const hi = rationalFromNumber(ranges[i]!.max);
      const d = max(abs(sub(lo, aq)), abs(sub(hi, aq)));
      const x = max(abs(lo), abs(hi));
      arithmetic = add(arithmetic, mul(cq, mul(gammaR, d)));
      if (f32) rounding = add(rounding, mul(cq, mul(onePlusGamma, mul(u, add(x, abs(aq))))));
    });
    arithmetic = add(arithmetic, mul(rat(BigInt(n)), mul(eta, onePlusGamma)));
    return { rounding, arithmetic };
  });
  const bounds = parts.map((p) => upperDouble(add(p.rounding, p.arithmetic)));
  const boundParts = parts.map((p) => ({
    rounding: upperDouble(p.rounding),
    arithmetic: upperDouble(p.arithmetic),
  }));

  const evaluate = (inputs: ArrayLike<number>): number[] => {
    if (typeof inputs !== 'object' || inputs === null || inputs.length !== n) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`inputs\` must hold ${n} numbers; got ${formatValue(inputs)}`,
        {
          param: 'inputs',
          value: inputs,
        },
      );
    }
    const x = Array.from({ length: n }, (_, i) => {
      const v = checkFinite(`inputs[${i}]`, inputs[i]);
      const r = ranges[i] as Interval;
      if (!(v >= r.min && v <= r.max)) {
        throw new BridgeworkError(
          'out-of-range',
          `\`inputs[${i}]\` must lie in its input range [${r.min}, ${r.max}], where the bound holds; got ${v}`,
          { param: `inputs[${i}]`, value: v, limit: [r.min, r.max] },
        );
      }
      return round(v);
    });
    return cr.map((row) => {
      let s = 0;
      for (let i = 0; i < n; i++)
        s = round(s + round((row[i] as number) * round((x[i] as number) - (ar[i] as number))));
      return s;
    });
  };

  const cSource = (prefix: string, name: string): string => {
    const p = `${cIdentifierFromName(prefix, 'prefix')}_${cIdentifierFromName(name)}`;
    const type = f32 ? 'float' : 'double';
    const lit = f32 ? floatLiteral : doubleLiteral;
    const suffix = f32 ? 'f32' : 'f64';
    const rows = cr.map((row) => `    { ${row.map((v) => lit(v)).join(', ')} }`).join(',\n');
    return [
      `static const ${type} ${p}_matrix_${suffix}[${m}][${n}] = {\n${rows}\n};`,
      `static const ${type} ${p}_offsets_${suffix}[${n}] = { ${ar.map((v) => lit(v)).join(', ')} };`,
      `/* y[j] = sum over i of matrix[j][i] * (x[i] - offsets[i]), in this order; bounds: ${bounds.map((b) => b.toPrecision(3)).join(', ')} */`,
      `static inline void ${p}_${suffix}(const ${type} x[${n}], ${type} y[${m}]) {`,
      '    int j;',
      '    int i;',
      `    for (j = 0; j < ${m}; j++) {`,
      `        ${type} s = ${f32 ? '0.0f' : '0.0'};`,
      `        for (i = 0; i < ${n}; i++) {`,
      `            s += ${p}_matrix_${suffix}[j][i] * (x[i] - ${p}_offsets_${suffix}[i]);`,
      '        }',
      '        y[j] = s;',
      '    }',
      '}',
      '',
    ].join('\n');
  };

  return { precision, matrix: cr, offsets: ar, bounds, boundParts, evaluate, cSource };
}
