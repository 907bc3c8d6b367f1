import {
  BridgeworkError,
  checkFinite,
  checkFiniteResult,
  checkNonNegative,
  checkOptions,
  formatValue,
} from '@bridgework/core';

/** One uncorrelated noise contribution, in any unit shared by all the terms (V rms, V/√Hz, …). */
export interface NoiseTerm {
  /** What the contribution is (e.g. `'bridge-thermal'`, `'amplifier-voltage'`). */
  readonly name: string;
  /** Its size (≥ 0): an rms value or a density, in the unit common to all terms. */
  readonly value: number;
}

/** One term of a {@link NoiseCombination}, with its share of the total. */
export interface NoiseShare extends NoiseTerm {
  /** value²/total²: the fraction of the total noise power from this term (the fractions add to 1; all 0 when the total is 0). */
  readonly fractionOfPower: number;
}

/** The root-sum-square of uncorrelated noise terms (see {@link combineNoise}). */
export interface NoiseCombination {
  /** √(Σ valueᵢ²), in the unit of the terms. */
  readonly total: number;
  /** Every term, in the order given, with its share of the total power. */
  readonly terms: readonly NoiseShare[];
}

/**
 * Combines uncorrelated noise sources by root-sum-square, reporting each one's share.
 *
 * @remarks
 * Powers of uncorrelated sources add: total = √(Σ xᵢ²) (any text on noise, e.g. Motchenbacher &
 * Connelly, Low-Noise Electronic System Design, ch. 1 — from memory). This holds for rms values and
 * for densities at one frequency alike, so the terms may be either as long as all share one unit.
 * Computed with scaling by the largest term, so neither tiny nor huge values overflow or underflow;
 * within a few ulps. Correlated sources (the two halves of a differential input driven by one
 * current, for example) must be summed before they are given here.
 *
 * @param terms - The contributions; an empty list gives a total of 0.
 * @returns The total and each term's fraction of the total power.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` when `terms` is not an array;
 *   `wrong-type` for a name that is not a string or a term that is not an object; `negative`,
 *   `not-finite` or `wrong-type` for a value; `out-of-range` when the root-sum-square exceeds
 *   binary64; `unknown-option` for a key other than `name` and `value` (naming the closest),
 *   `missing-option` for a term without one.
 * @example
 * ```ts
 * combineNoise([
 *   { name: 'amplifier', value: 3 },
 *   { name: 'bridge', value: 4 },
 * ]); // { total: 5, terms: [{ …, fractionOfPower: 0.36 }, { …, fractionOfPower: 0.64 }] }
 * ```
 */
export function combineNoise(terms: readonly NoiseTerm[]): NoiseCombination {
  if (!Array.isArray(terms)) {
    throw new BridgeworkError('invalid-shape', `\`terms\` must be an array; got ${formatValue(terms)}`, {
      param: 'terms',
      value: terms,
    });
  }
  const checked = terms.map((t: unknown, i) => {
    const r = checkOptions(`terms[${i}]`, t, { known: ['name', 'value'], required: ['name', 'value'] });
    if (typeof r['name'] !== 'string') {
      throw new BridgeworkError(
        'wrong-type',
        `\`terms[${i}].name\` must be a string; got ${formatValue(r['name'])}`,
        { param: `terms[${i}].name`, value: r['name'] },
      );
    }
    checkFinite(`terms[${i}].value`, r['value']);
    return { name: r['name'], value: checkNonNegative(`terms[${i}].value`, r['value']) };
  });
  const scale = checked.reduce((m, t) => Math.max(m, t.value), 0);
  if (scale === 0) {
    return { total: 0, terms: checked.map((t) => ({ ...t, fractionOfPower: 0 })) };
  }
  const sumOfSquares = checked.reduce((s, t) => s + (t.value / scale) ** 2, 0);
  return {
    total: checkFiniteResult(scale * Math.sqrt(sumOfSquares), {
      what: 'the root-sum-square',
      param: 'terms',
      value: terms,
    }),
    terms: checked.map((t) => ({ ...t, fractionOfPower: (t.value / scale) ** 2 / sumOfSquares })),
  };
}
