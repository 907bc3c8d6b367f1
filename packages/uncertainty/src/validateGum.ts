import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkNonNegative,
  checkInterval,
  checkOptions,
  formatValue,
} from '@bridgework/core';
import type { Interval } from '@bridgework/core';

/**
 * The numerical tolerance δ of a value expressed to a number of significant decimal digits
 * (JCGM 101 7.9.2).
 *
 * @remarks
 * Write |value| = c × 10^l with c an integer of `significantDigits` digits (rounding to nearest);
 * then δ = ½ × 10^l. For example u(y) = 0.000 35 to two digits is 35 × 10⁻⁵, so δ = 5 × 10⁻⁶.
 * A zero value has tolerance 0; below 1e-250, δ is found for v·10³⁰⁰ and divided back (within a
 * few ulps, and subnormal below about 2e-308). JCGM 101 uses δ to decide when an adaptive Monte Carlo run has
 * stabilised (7.9.4) and whether the GUM result is validated (8.2).
 *
 * @param value - The value, usually a standard uncertainty u(y) (finite).
 * @param significantDigits - ndig, an integer in [1, 15]. Default 2.
 * @returns δ, in the unit of `value`.
 * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`; `not-integer` or
 *   `out-of-range` for a bad digit count.
 * @example
 * ```ts
 * numericalTolerance(0.00035); // 5e-6
 * numericalTolerance(2.0, 2); // 0.05 (2.0 = 20 × 10⁻¹)
 * numericalTolerance(0.0999, 2); // 0.005 (0.0999 rounds to 10 × 10⁻²)
 * ```
 */
export function numericalTolerance(value: number, significantDigits: number = 2): number {
  const v = Math.abs(checkFinite('value', value));
  const digits = checkInteger('significantDigits', significantDigits, { min: 1, max: 15 });
  if (v === 0) return 0;
  // Below 1e-250 the powers of ten used here would leave the normal range: work on v·10³⁰⁰.
  if (v < 1e-250) return toleranceOf(v * 1e300, digits) / 1e300;
  return toleranceOf(v, digits);
}

/** δ for v in [1e-250, MAX_VALUE] (the powers of ten 10^l used stay normal doubles). */
function toleranceOf(v: number, digits: number): number {
  let l = Math.floor(Math.log10(v)) - digits + 1;
  const c = (exponent: number): number => Math.round(v / 10 ** exponent);
  // Repair log10 rounding at exact powers of ten, and values that round up to 10^digits.
  while (c(l) >= 10 ** digits) l += 1;
  while (c(l) < 10 ** (digits - 1)) l -= 1;
  // ½·10^l as the double nearest to it: an exact power of ten divides, never a rounded one multiplies.
  return l >= 0 ? 0.5 * 10 ** l : 0.5 / 10 ** -l;
}

/** The GUM side of a comparison: an estimate and its expanded uncertainty (a {@link Propagation} will do). */
export interface GumInterval {
  /** The estimate y. */
  readonly value: number;
  /** The expanded uncertainty U_p for the coverage probability of the comparison. */
  readonly expandedUncertainty: number;
}

/** The Monte Carlo side of a comparison (a {@link MonteCarloResult} will do). */
export interface MonteCarloInterval {
  /** The Monte Carlo standard uncertainty u(y), which sets the tolerance. */
  readonly standardUncertainty: number;
  /** The probabilistically symmetric coverage interval. */
  readonly interval: Interval;
}

/** Options of {@link validateGum}. */
export interface ValidateGumOptions {
  /** The GUM result (law of propagation). */
  readonly gum: GumInterval;
  /** The Monte Carlo result for the same model, inputs and coverage probability. */
  readonly monteCarlo: MonteCarloInterval;
  /** ndig, the significant digits regarded as meaningful in u(y): integer in [1, 15]. Default 2. */
  readonly significantDigits?: number;
}

/** The keys `gum` may carry: those of {@link GumInterval} and of a whole `Propagation`. */
const gumKeys: readonly string[] = [
  'value',
  'expandedUncertainty',
  'standardUncertainty',
  'sensitivities',
  'contributions',
  'budget',
  'effectiveDegreesOfFreedom',
  'coverage',
  'coverageFactor',
  'interval',
  'secondOrderVariance',
];

/** The keys `monteCarlo` may carry: those of {@link MonteCarloInterval} and of a whole `MonteCarloResult`. */
const monteCarloKeys: readonly string[] = [
  'standardUncertainty',
  'interval',
  'value',
  'shortestInterval',
  'trials',
  'coverage',
  'seed',
  'gum',
  'gumValidation',
  'adaptive',
  'values',
];

/** The outcome of the JCGM 101 clause 8 comparison (see {@link validateGum}). */
export interface GumValidation {
  /** d_low = |y − U_p − y_low|. */
  readonly dLow: number;
  /** d_high = |y + U_p − y_high|. */
  readonly dHigh: number;
  /** The numerical tolerance δ of u(y) to `significantDigits` digits. */
  readonly tolerance: number;
  /** ndig used. */
  readonly significantDigits: number;
  /** True when both d_low and d_high are no larger than δ: the GUM result is validated. */
  readonly validated: boolean;
}

/**
 * Compares a GUM coverage interval with a Monte Carlo one (JCGM 101 clause 8).
 *
 * @remarks
 * JCGM 101 8.2: with the GUM interval y ± U_p and the probabilistically symmetric Monte Carlo
 * interval [y_low, y_high] for the same coverage probability, d_low = |y − U_p − y_low| and
 * d_high = |y + U_p − y_high|. The GUM result is validated when both are no larger than the
 * numerical tolerance δ of u(y) ({@link numericalTolerance}); δ is taken from the Monte Carlo
 * u(y), as in the adaptive procedure (7.9). A Monte Carlo run should itself be precise to δ
 * (use the adaptive procedure) for the verdict to mean something.
 *
 * @param options - Both results and ndig.
 * @returns d_low, d_high, δ and the verdict.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `negative` for bad fields;
 *   `out-of-range` for an interval whose `max` is below its `min` or a bad digit count;
 *   `unknown-option` (naming the closest key), `missing-option` for the keys of the options, of
 *   `gum`, `monteCarlo` and its `interval` (the other keys of a whole `Propagation` or
 *   `MonteCarloResult` are known, so either result may be passed as it is).
 * @example
 * ```ts
 * validateGum({
 *   gum: { value: 0, expandedUncertainty: 3.92 },
 *   monteCarlo: { standardUncertainty: 2.0, interval: { min: -3.88, max: 3.88 } },
 * }); // { dLow: 0.040000000000000036, dHigh: 0.040000000000000036, tolerance: 0.05, significantDigits: 2, validated: true }
 * ```
 */
export function validateGum(options: ValidateGumOptions): GumValidation {
  const o = checkOptions('options', options, {
    known: ['gum', 'monteCarlo', 'significantDigits'],
    required: ['gum', 'monteCarlo'],
  });
  // Either side may be a whole result (a Propagation, a MonteCarloResult): their other keys are
  // known, so only a misspelt or foreign key is refused.
  const gum = checkOptions('gum', o['gum'], { known: gumKeys, required: ['value', 'expandedUncertainty'] });
  const mc = checkOptions('monteCarlo', o['monteCarlo'], {
    known: monteCarloKeys,
    required: ['standardUncertainty', 'interval'],
  });
  const y = checkFinite('gum.value', gum['value']);
  const expanded = checkNonNegative('gum.expandedUncertainty', gum['expandedUncertainty']);
  const u = checkNonNegative('monteCarlo.standardUncertainty', mc['standardUncertainty']);
  const { min: low, max: high } = checkInterval('monteCarlo.interval', mc['interval']);
  const significantDigits =
    o['significantDigits'] === undefined
      ? 2
      : checkInteger('significantDigits', o['significantDigits'], { min: 1, max: 15 });
  const tolerance = numericalTolerance(u, significantDigits);
  // Formed from halves (exact scalings, the same order of operations), so no intermediate sum overflows.
  const dLow = 2 * Math.abs(y / 2 - expanded / 2 - low / 2);
  const dHigh = 2 * Math.abs(y / 2 + expanded / 2 - high / 2);
  if (!Number.isFinite(dLow) || !Number.isFinite(dHigh)) {
    throw new BridgeworkError(
      'out-of-range',
      `the differences between the GUM and Monte Carlo interval ends are past binary64 (d_low ${formatValue(dLow)}, d_high ${formatValue(dHigh)}): express the quantities in other units`,
      { param: 'gum', value: [dLow, dHigh].map(String) },
    );
  }
  return { dLow, dHigh, tolerance, significantDigits, validated: dLow <= tolerance && dHigh <= tolerance };
}
