import { BridgeworkError, checkOneOf, checkOptions, checkRange, formatValue } from '@bridgework/core';

/** A series of preferred numbers for resistors (IEC 60063:2015). */
export type PreferredSeries = 'E3' | 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

/** Every {@link PreferredSeries}, coarsest first. */
export const preferredSeries: readonly PreferredSeries[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

// IEC 60063:2015, Table 1 (E3–E24, two significant figures) and Table 2 (E48–E192, three), as
// mantissas times 10 or 100; from memory. E24 departs from round(10^(i/24)) at 2.7 … 4.7 and 8.2
// (historical values the standard keeps); E192 has 9.20 where the formula gives 9.19. E12, E6 and
// E3 take every 2nd, 4th and 8th value of E24; E48 and E96 every 4th and 2nd of E192.
const E24 = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91];
const E192 = [
  100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124, 126, 127,
  129, 130, 132, 133, 135, 137, 138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164,
  165, 167, 169, 172, 174, 176, 178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203, 205, 208, 210,
  213, 215, 218, 221, 223, 226, 229, 232, 234, 237, 240, 243, 246, 249, 252, 255, 258, 261, 264, 267, 271,
  274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309, 312, 316, 320, 324, 328, 332, 336, 340, 344, 348,
  352, 357, 361, 365, 370, 374, 379, 383, 388, 392, 397, 402, 407, 412, 417, 422, 427, 432, 437, 442, 448,
  453, 459, 464, 470, 475, 481, 487, 493, 499, 505, 511, 517, 523, 530, 536, 542, 549, 556, 562, 569, 576,
  583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681, 690, 698, 706, 715, 723, 732, 741,
  750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953,
  965, 976, 988,
];
const every = (values: readonly number[], step: number): number[] => values.filter((_, i) => i % step === 0);
/** Integer mantissas and their power of ten (value = mantissa·10^(decade − digits + 1)). */
const table: Readonly<
  Record<PreferredSeries, { readonly mantissas: readonly number[]; readonly digits: number }>
> = {
  E3: { mantissas: every(E24, 8), digits: 2 },
  E6: { mantissas: every(E24, 4), digits: 2 },
  E12: { mantissas: every(E24, 2), digits: 2 },
  E24: { mantissas: E24, digits: 2 },
  E48: { mantissas: every(E192, 4), digits: 3 },
  E96: { mantissas: every(E192, 2), digits: 3 },
  E192: { mantissas: E192, digits: 3 },
};

/** The value of mantissa m (an integer of `digits` digits) in decade d: m·10^(d − digits + 1), correctly rounded. */
const valueOf = (mantissa: number, digits: number, decade: number): number =>
  Number(`${mantissa}e${decade - digits + 1}`);

/**
 * The preferred values of one decade, from 1 to below 10 (IEC 60063:2015).
 *
 * @param series - The series.
 * @returns The decade's values, ascending: 1, 1.1, 1.2 … 9.1 for E24; 1, 1.02 … 9.76 for E96.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown series.
 * @example
 * ```ts
 * preferredValues('E12'); // [1, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]
 * ```
 */
export function preferredValues(series: PreferredSeries): readonly number[] {
  const { mantissas, digits } = table[checkOneOf('series', series, preferredSeries)];
  return mantissas.map((m) => valueOf(m, digits, 0));
}

/** How {@link nearestPreferredValue} picks a value. */
export type PreferredRounding = 'nearest' | 'up' | 'down';

/** Options of {@link nearestPreferredValue}. */
export interface NearestPreferredValueOptions {
  /** The wanted value (> 0; 1e-250 to 1e250), in any unit (Ω for a resistor). */
  readonly value: number;
  /** The series to pick from. */
  readonly series: PreferredSeries;
  /**
   * `'nearest'` (default): the nearest value by ratio; `'up'`: the smallest value ≥ `value`;
   * `'down'`: the largest value ≤ `value`.
   */
  readonly rounding?: PreferredRounding;
}

/** A value picked from a series (see {@link nearestPreferredValue}). */
export interface PreferredValue {
  /** The preferred value, in the unit of the wanted value. */
  readonly value: number;
  /** The series it is from. */
  readonly series: PreferredSeries;
  /** Its position in the decade (0 for 1.0). */
  readonly index: number;
  /** (value − wanted)/wanted, as a fraction. */
  readonly deviationFraction: number;
}

/**
 * The preferred value of a series nearest to a wanted value (for a shunt or trim resistor).
 *
 * @remarks
 * The E series are geometric: value i of En is about 10^(i/n), so each value stands for the band
 * between the geometric means of it and its neighbours, and "nearest" is nearest by ratio: of the
 * two values a ≤ x ≤ b that bracket x (across decade ends too), a when x/a ≤ b/x (that is
 * x² ≤ a·b), else b; an exact tie goes to the larger. Values are the tabulated ones of
 * IEC 60063:2015 (not the formula, which differs for E24 at 2.7–4.7 and 8.2 and for E192 at 9.20),
 * written as mantissa × 10^k and correctly rounded to a double.
 *
 * @param options - The wanted value, the series and the rounding.
 * @returns The picked value, its index and its deviation from the wanted value.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`,
 *   `out-of-range` for a value outside 1e-250 … 1e250; `invalid-option` for an unknown series or
 *   rounding; `unknown-option`, `missing-option` by the options rule.
 * @example
 * ```ts
 * nearestPreferredValue({ value: 174_650, series: 'E96' }).value; // 174000
 * nearestPreferredValue({ value: 174_650, series: 'E192' }).value; // 174000
 * nearestPreferredValue({ value: 174_650, series: 'E24', rounding: 'up' }).value; // 180000
 * ```
 */
export function nearestPreferredValue(options: NearestPreferredValueOptions): PreferredValue {
  const o = checkOptions('options', options, {
    known: ['value', 'series', 'rounding'],
    required: ['value', 'series'],
  });
  const x = checkRange('value', o['value'], { min: 1e-250, max: 1e250 });
  const series = checkOneOf('series', o['series'], preferredSeries);
  const rounding =
    o['rounding'] === undefined
      ? 'nearest'
      : checkOneOf('rounding', o['rounding'], ['nearest', 'up', 'down'] as const);
  const { mantissas, digits } = table[series];
  // Candidates: the decade of x and its neighbours, so a bracket always exists.
  const decade = Math.floor(Math.log10(x));
  const candidates: { value: number; index: number }[] = [];
  for (let d = decade - 1; d <= decade + 1; d++) {
    mantissas.forEach((m, index) => candidates.push({ value: valueOf(m, digits, d), index }));
  }
  let below = candidates[0]!;
  let above = candidates[candidates.length - 1]!;
  for (const c of candidates) {
    if (c.value <= x && c.value >= below.value) below = c;
    if (c.value >= x && c.value <= above.value) above = c;
  }
  if (!(below.value <= x && x <= above.value)) {
    // Unreachable: three decades always bracket x (log10 is within one ulp of the true decade).
    throw new BridgeworkError('no-solution', `\`value\` ${formatValue(x)} was not bracketed by the series`, {
      param: 'value',
      value: x,
    });
  }
  const pick =
    rounding === 'up'
      ? above
      : rounding === 'down'
        ? below
        : x / below.value < above.value / x
          ? below
          : above;
  return { value: pick.value, series, index: pick.index, deviationFraction: (pick.value - x) / x };
}
