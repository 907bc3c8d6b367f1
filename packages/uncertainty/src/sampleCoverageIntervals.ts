import { BridgeworkError, checkRange, formatValue } from '@bridgework/core';
import { coveredCount, sampleIntervalsInPlace } from './internal/select.js';
import type { Interval } from '@bridgework/core';

/** The two coverage intervals of JCGM 101 7.7 (see {@link sampleCoverageIntervals}). */
export interface CoverageIntervals {
  /** The probabilistically symmetric coverage interval (JCGM 101 7.7.1). */
  readonly interval: Interval;
  /** The shortest coverage interval (JCGM 101 7.7.2). */
  readonly shortestInterval: Interval;
}

/**
 * The probabilistically symmetric and the shortest coverage interval of a sample of model values
 * (JCGM 101 7.7), for samples made elsewhere.
 *
 * @remarks
 * With q = pM (or the integer part of pM + ½ when pM is not an integer): the symmetric interval is
 * [y₍ᵣ₎, y₍ᵣ₊q₎] with r = (M − q)/2, or (M − q + 1)/2 when that is not an integer; the shortest is
 * the [y₍ᵣ₎, y₍ᵣ₊q₎] of least width over r = 1 … M − q (the first one on ties). Only the lowest
 * and highest M − q values are sorted, after Floyd–Rivest selection (expected linear time).
 * The sample is copied, not reordered.
 *
 * @param values - The model values (finite), at least enough that q < M.
 * @param coverage - Coverage probability p, in (0, 1). Default 0.95.
 * @returns Both intervals.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` unless an array or Float64Array of
 *   numbers; `not-finite` for a non-finite value; `too-few-points` when q = M; `out-of-range` for p.
 * @example
 * ```ts
 * sampleCoverageIntervals([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 21], 0.9);
 * // { interval: { min: 2, max: 21 }, shortestInterval: { min: 1, max: 20 } }
 * ```
 */
export function sampleCoverageIntervals(
  values: readonly number[] | Float64Array,
  coverage: number = 0.95,
): CoverageIntervals {
  const p = checkRange('coverage', coverage, { min: 0, max: 1, minExclusive: true, maxExclusive: true });
  if (!(values instanceof Float64Array) && !Array.isArray(values)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`values\` must be an array of numbers; got ${formatValue(values)}`,
      { param: 'values', value: values },
    );
  }
  // Checked before copying: a copy would convert strings and throw on a bigint (TypeError).
  const n = values.length;
  for (let i = 0; i < n; i++) {
    const v = (values as ArrayLike<unknown>)[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new BridgeworkError(
        typeof v === 'number' ? 'not-finite' : 'wrong-type',
        `\`values[${i}]\` must be a finite number; got ${formatValue(v)}`,
        {
          param: `values[${i}]`,
          value: v,
        },
      );
    }
  }
  const a = Float64Array.from(values);
  if (coveredCount(p, a.length) >= a.length) {
    throw new BridgeworkError(
      'too-few-points',
      `\`values\` must hold more than pM values for p = ${p}; got ${a.length}`,
      {
        param: 'values',
        value: a.length,
      },
    );
  }
  return sampleIntervalsInPlace(a, p);
}
