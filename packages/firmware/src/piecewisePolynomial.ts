import { BridgeworkError, checkInteger, checkOptions, formatValue, requireOption } from '@bridgework/core';
import { checkCodeRange, checkReference, readOptions } from './internal/codes.js';
import { chebyshevInterpolant } from './internal/fit.js';

/** The highest polynomial degree of a piecewise map. */
export const MAX_PIECEWISE_DEGREE = 5;

/**
 * A piecewise polynomial over a range of converter codes, segmented so that firmware finds the
 * segment with one subtraction and one shift (no search).
 *
 * @remarks
 * Segment i covers the codes `segmentBase + i·2^segmentBits` … `segmentBase + (i + 1)·2^segmentBits − 1`
 * (clipped to [codeMin, codeMax]); for a code,
 *
 * ```text
 * u = code − segmentBase          (0 ≤ u < segmentCount·2^segmentBits ≤ 2^32)
 * i = u >> segmentBits            (floor(u / 2^segmentBits))
 * t = (u mod 2^segmentBits) − 2^(segmentBits − 1)     (the code relative to the segment's centre)
 * y = Σ_j coefficients[i][j] · t^j
 * ```
 *
 * `segmentBase` ≤ codeMin spreads the unused codes of the first and last segment evenly, so a single
 * segment is centred on the range. Coefficients are binary64 values in the quantity's unit per
 * code^j. This is the description the firmware maps implement and that other emitters (SQL, for
 * example) can evaluate: in binary64 with the same Horner order it gives what the float64 map gives.
 */
export interface PiecewisePolynomial {
  /** Lowest code covered. */
  readonly codeMin: number;
  /** Highest code covered. */
  readonly codeMax: number;
  /** The code where segment 0 starts (≤ codeMin, ≥ −2^31). */
  readonly segmentBase: number;
  /** log2 of the segment length, an integer in [1, 31]. */
  readonly segmentBits: number;
  /** Number of segments: ⌊(codeMax − segmentBase) / 2^segmentBits⌋ + 1. */
  readonly segmentCount: number;
  /** The polynomial degree (every segment has degree + 1 coefficients). */
  readonly degree: number;
  /** Per segment, ascending coefficients in powers of t (quantity unit per code^j). */
  readonly coefficients: readonly (readonly number[])[];
}

/** The first and last code of a segment and its centre (see {@link PiecewisePolynomial}). */
export interface SegmentCodes {
  /** First code of the segment inside the range. */
  readonly first: number;
  /** Last code of the segment inside the range. */
  readonly last: number;
  /** The code where t = 0. */
  readonly centre: number;
}

/**
 * The codes of segment `index` of a piecewise polynomial.
 *
 * @param p - The piecewise polynomial (its `codeMin`, `codeMax`, `segmentBase` and `segmentBits`
 *   are read; of a piecewise map, pass its `polynomial`).
 * @param index - The segment index, an integer in 0 … segmentCount − 1.
 * @returns First and last code inside the range, and the centre (a code, or a half code for
 *   one-code segments).
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option` for a key a piecewise polynomial
 *   does not have, `missing-option`, `not-integer` or `out-of-range` for a layout that is not one
 *   (codes outside [−2^31, 2^31 − 1], a base above codeMin or a whole segment below it,
 *   segmentBits outside 0 … 31) or an index past the last segment.
 * @example
 * ```ts
 * segmentCodes({ codeMin: 0, codeMax: 999, segmentBase: -12, segmentBits: 8 }, 1);
 * // { first: 244, last: 499, centre: 372 }
 * ```
 */
export function segmentCodes(
  p: Pick<PiecewisePolynomial, 'codeMin' | 'codeMax' | 'segmentBase' | 'segmentBits'>,
  index: number,
): SegmentCodes {
  const o = checkOptions('p', p, {
    known: ['codeMin', 'codeMax', 'segmentBase', 'segmentBits', 'segmentCount', 'degree', 'coefficients'],
  });
  for (const key of ['codeMin', 'codeMax', 'segmentBase', 'segmentBits']) requireOption(key, o[key]);
  const { codeMin, codeMax } = checkCodeRange(o, 'p.');
  const segmentBits = checkInteger('p.segmentBits', o['segmentBits'], { min: 0, max: 31 });
  const segmentBase = checkInteger('p.segmentBase', o['segmentBase'], {
    min: Math.max(-(2 ** 31), codeMin - 2 ** segmentBits + 1),
    max: codeMin,
  });
  const count = Math.floor((codeMax - segmentBase) / 2 ** segmentBits) + 1;
  checkInteger('index', index, { min: 0, max: count - 1 });
  return segmentCodesUnchecked({ codeMin, codeMax, segmentBase, segmentBits }, index);
}

/**
 * {@link segmentCodes} without checks, for layouts this package made.
 *
 * @internal
 */
export function segmentCodesUnchecked(
  p: Pick<PiecewisePolynomial, 'codeMin' | 'codeMax' | 'segmentBase' | 'segmentBits'>,
  index: number,
): SegmentCodes {
  const length = 2 ** p.segmentBits;
  const start = p.segmentBase + index * length;
  return {
    first: Math.max(p.codeMin, start),
    last: Math.min(p.codeMax, start + length - 1),
    centre: start + length / 2,
  };
}

/**
 * The segmentation of [codeMin, codeMax] into segments of 2^segmentBits codes: the base and the
 * count, with the unused codes split evenly between both ends (and the base kept ≥ −2^31).
 *
 * @internal
 */
export function segmentation(
  codeMin: number,
  codeMax: number,
  segmentBits: number,
): { readonly segmentBase: number; readonly segmentCount: number } {
  const length = 2 ** segmentBits;
  const n = codeMax - codeMin + 1;
  const segmentCount = Math.ceil(n / length);
  const slack = segmentCount * length - n;
  const segmentBase = Math.max(-(2 ** 31), codeMin - Math.floor(slack / 2));
  return { segmentBase, segmentCount: Math.floor((codeMax - segmentBase) / length) + 1 };
}

/** Options of {@link fitPiecewisePolynomial}. */
export interface FitPiecewisePolynomialOptions {
  /**
   * The map to approximate, quantity for a code. It is called at fractional codes inside
   * [codeMin, codeMax] (the Chebyshev points of each segment) and must return finite numbers.
   */
  readonly exact: (code: number) => number;
  /** Lowest code, an integer in [−2^31, 2^31 − 1]. */
  readonly codeMin: number;
  /** Highest code, an integer in [codeMin, 2^31 − 1]. */
  readonly codeMax: number;
  /** log2 of the segment length, an integer in [1, 31]. */
  readonly segmentBits: number;
  /** Polynomial degree, an integer in [0, 5]. */
  readonly degree: number;
}

/**
 * Fits a piecewise polynomial to a map: on each segment, the polynomial that interpolates the map
 * at the segment's Chebyshev points (near-minimax).
 *
 * @remarks
 * Chebyshev interpolation of degree n is within a factor 2 + (2/π)·ln(n + 1) of the best uniform
 * approximation (Trefethen, _Approximation Theory and Approximation Practice_, 2013, Theorem 16.1),
 * about 3 for n ≤ 5 and in practice much closer. The coefficients are computed in binary64 through
 * the discrete Chebyshev transform and re-expanded in powers of the segment-centred t. No error is
 * claimed here: {@link designFirmwareConstants} measures the fit against the map over every code.
 *
 * @param options - The map, the code range, the segment length and the degree.
 * @returns The piecewise polynomial.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option`, `wrong-type`,
 *   `not-integer`, `out-of-range` for bad options; `model-not-finite` when `exact` returns a
 *   non-finite value.
 * @example
 * ```ts
 * const p = fitPiecewisePolynomial({ exact: (c) => Math.sqrt(c), codeMin: 1, codeMax: 4096, segmentBits: 10, degree: 2 });
 * p.segmentCount; // 4
 * ```
 */
export function fitPiecewisePolynomial(options: FitPiecewisePolynomialOptions): PiecewisePolynomial {
  const o = readOptions(options, {
    known: ['exact', 'codeMin', 'codeMax', 'segmentBits', 'degree'],
    required: ['exact', 'codeMin', 'codeMax', 'segmentBits', 'degree'],
  });
  const exact = checkReference(requireOption('exact', o['exact']));
  if (exact === undefined)
    throw new BridgeworkError('missing-option', '`exact` must be given', { param: 'exact' });
  const range = checkCodeRange(o);
  const segmentBits = checkInteger('segmentBits', o['segmentBits'], { min: 1, max: 31 });
  const degree = checkInteger('degree', o['degree'], { min: 0, max: MAX_PIECEWISE_DEGREE });
  return fitUnchecked(exact, range.codeMin, range.codeMax, segmentBits, degree);
}

/** {@link fitPiecewisePolynomial} without option checks. @internal */
export function fitUnchecked(
  exact: (code: number) => number,
  codeMin: number,
  codeMax: number,
  segmentBits: number,
  degree: number,
): PiecewisePolynomial {
  const { segmentBase, segmentCount } = segmentation(codeMin, codeMax, segmentBits);
  const layout = { codeMin, codeMax, segmentBase, segmentBits };
  const coefficients = Array.from({ length: segmentCount }, (_, i) => {
    const s = segmentCodesUnchecked(layout, i);
    if (s.last < s.first) {
      throw new BridgeworkError('out-of-range', `segment ${i} holds no code; got ${formatValue(layout)}`, {
        param: 'segmentBits',
      });
    }
    return Object.freeze(chebyshevInterpolant(exact, s.first, s.last, s.centre, degree));
  });
  return Object.freeze({ ...layout, segmentCount, degree, coefficients: Object.freeze(coefficients) });
}
