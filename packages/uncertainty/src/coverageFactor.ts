import {
  BridgeworkError,
  checkFinite,
  checkNonNegative,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { normalUpperQuantile, studentUpperQuantile } from './internal/special.js';

function checkProbability(param: string, p: unknown): number {
  return checkRange(param, p, { min: 0, max: 1, minExclusive: true, maxExclusive: true });
}

/**
 * The quantile of the standard normal distribution: the z with Φ(z) = probability.
 *
 * @remarks
 * Newton's method on the upper tail Q(z) = ½·erfc(z/√2), started from the rational approximation
 * of Abramowitz & Stegun 26.2.23, with erfc from the series A&S 7.1.6 below 0.5 and the continued
 * fraction A&S 7.1.14 above (both within 4e-15 relative), on ln Q so that deep tails converge in
 * a few steps. The smaller tail is solved, so extreme probabilities keep their relative precision.
 * Accuracy: Φ at the returned z is within 1e-14 + 4.4e-16·z² relative of the probability asked
 * for (the z² term is the conditioning of the tail: one ulp of z), against 50-digit references.
 *
 * @param probability - Φ(z), in (0, 1).
 * @returns z.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` outside (0, 1); `not-finite`, `wrong-type`.
 * @example
 * ```ts
 * normalQuantile(0.975); // 1.9599639845400538
 * ```
 */
export function normalQuantile(probability: number): number {
  const p = checkProbability('probability', probability);
  return p >= 0.5 ? normalUpperQuantile(1 - p) : -normalUpperQuantile(p);
}

/**
 * The quantile of Student's t-distribution with ν degrees of freedom: the t with F_ν(t) = probability.
 *
 * @remarks
 * ν = 1 and ν = 2 have closed forms (tan(π(p − ½)) and (2p − 1)/√(2p(1 − p))). For ν ≤ 1000
 * Newton's method solves ½·I_{ν/(ν+t²)}(ν/2, ½) = 1 − p, with the regularized incomplete beta
 * function evaluated by its continued fraction; above 1000 the Cornish–Fisher expansion of
 * Abramowitz & Stegun 26.7.5 to ν⁻⁴; ν = Infinity gives the normal quantile. Non-integer ν is
 * supported. Accuracy: 1e-12 relative against the exact finite series of A&S 26.7.3 and 26.7.4
 * for integer ν, and against JCGM 100 Table G.2.
 *
 * @param probability - F_ν(t), in (0, 1).
 * @param degreesOfFreedom - ν > 0, or `Infinity`.
 * @returns t.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` for a probability outside (0, 1);
 *   `not-positive` for ν ≤ 0; `not-finite`, `wrong-type`.
 * @example
 * ```ts
 * studentTQuantile(0.975, 9); // 2.2621571627982062
 * ```
 */
export function studentTQuantile(probability: number, degreesOfFreedom: number): number {
  const p = checkProbability('probability', probability);
  const nu = checkPositive('degreesOfFreedom', degreesOfFreedom, { allowInfinity: true });
  return p >= 0.5 ? studentUpperQuantile(1 - p, nu) : -studentUpperQuantile(p, nu);
}

/**
 * The coverage factor k = t_p(ν) for a coverage probability p: the two-sided quantile of Student's
 * t with ν degrees of freedom (JCGM 100 G.3.4 and G.4.1), or of the normal distribution for
 * ν = Infinity (JCGM 100 G.2.3).
 *
 * @remarks
 * k = t with F_ν(t) = (1 + p)/2; the tail (1 − p)/2 is formed directly, so p close to 1 keeps its
 * precision. ν is used as given: {@link propagate} applies the GUM's rule of truncating ν_eff to
 * the next lower integer first (JCGM 100 G.4.1). Method and accuracy as {@link studentTQuantile}.
 *
 * @param coverage - Coverage probability p, in (0, 1), e.g. 0.95.
 * @param degreesOfFreedom - ν > 0; default `Infinity` (normal).
 * @returns k, dimensionless.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` for p outside (0, 1); `not-positive`
 *   for ν ≤ 0; `not-finite`, `wrong-type`.
 * @example
 * ```ts
 * coverageFactor(0.95); // 1.9599639845400538
 * coverageFactor(0.95, 4); // 2.77644510519779 (JCGM 100 Table G.2: 2.78)
 * coverageFactor(0.9545, 10); // 2.2836816132996396 (Table G.2: 2.28)
 * ```
 */
export function coverageFactor(coverage: number, degreesOfFreedom: number = Infinity): number {
  const p = checkProbability('coverage', coverage);
  const nu = checkPositive('degreesOfFreedom', degreesOfFreedom, { allowInfinity: true });
  return studentUpperQuantile((1 - p) / 2, nu);
}

/** One uncertainty component for {@link welchSatterthwaite}. */
export interface UncertaintyComponent {
  /** The contribution uᵢ(y) = |cᵢ|·u(xᵢ) to the combined standard uncertainty (≥ 0), in the unit of y. */
  readonly contribution: number;
  /** Its degrees of freedom νᵢ (> 0; `Infinity` for an exactly known contribution). */
  readonly degreesOfFreedom: number;
}

/** Options of {@link welchSatterthwaite}. */
export interface WelchSatterthwaiteOptions {
  /** The uncertainty components. */
  readonly components: readonly UncertaintyComponent[];
  /**
   * The combined standard uncertainty u_c(y) (≥ 0). Default √(Σ uᵢ²), its value for uncorrelated
   * inputs; pass the value that includes correlation terms when there are any.
   */
  readonly combinedStandardUncertainty?: number;
}

/**
 * The effective degrees of freedom of a combined standard uncertainty, by the Welch–Satterthwaite
 * formula (JCGM 100 G.4.1, eq. G.2b).
 *
 * @remarks
 * ν_eff = u_c⁴(y) / Σ uᵢ⁴(y)/νᵢ. Components with νᵢ = ∞ or uᵢ = 0 add nothing to the sum; when
 * the sum is 0 (every component exact, or u_c = 0) ν_eff is `Infinity`. For uncorrelated inputs
 * ν_eff ≥ min νᵢ. The formula assumes independent components; with correlated inputs of finite
 * degrees of freedom it is only an approximation.
 *
 * @param options - The components and, optionally, the combined standard uncertainty.
 * @returns ν_eff (may be non-integer, or `Infinity`).
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for a missing array or component;
 *   `negative` for a negative contribution or combined uncertainty; `not-positive` for νᵢ ≤ 0;
 *   `not-finite` for a non-finite contribution.
 * @example
 * ```ts
 * welchSatterthwaite({
 *   components: [
 *     { contribution: 0.3, degreesOfFreedom: 4 },
 *     { contribution: 0.4, degreesOfFreedom: Infinity },
 *   ],
 * }); // 30.8641975308642 (= 0.5⁴/(0.3⁴/4))
 * ```
 */
export function welchSatterthwaite(options: WelchSatterthwaiteOptions): number {
  const o = checkOptions('options', options, {
    known: ['components', 'combinedStandardUncertainty'],
    required: ['components'],
  });
  const components = o['components'];
  if (!Array.isArray(components)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`components\` must be an array; got ${formatValue(components)}`,
      {
        param: 'components',
        value: components,
      },
    );
  }
  const checked = components.map((c: unknown, i) => {
    const entry = checkOptions(`components[${i}]`, c, {
      known: ['contribution', 'degreesOfFreedom'],
      required: ['contribution', 'degreesOfFreedom'],
    });
    return {
      contribution: checkNonNegative(`components[${i}].contribution`, entry['contribution']),
      degreesOfFreedom: checkPositive(`components[${i}].degreesOfFreedom`, entry['degreesOfFreedom'], {
        allowInfinity: true,
      }),
    };
  });
  const combined =
    o['combinedStandardUncertainty'] === undefined
      ? rootSumOfSquares(checked.map((c) => c.contribution))
      : checkNonNegative(
          'combinedStandardUncertainty',
          checkFinite('combinedStandardUncertainty', o['combinedStandardUncertainty']),
        );
  return effectiveDegreesOfFreedomOf(combined, checked);
}

/** √(Σ uᵢ²) without overflow or underflow: the sum is formed relative to the largest uᵢ. */
function rootSumOfSquares(values: readonly number[]): number {
  const largest = values.reduce((m, v) => Math.max(m, v), 0);
  if (largest === 0) return 0;
  let sum = 0;
  for (const v of values) sum += (v / largest) * (v / largest);
  return largest * Math.sqrt(sum);
}

/**
 * ν_eff = u_c⁴ / Σ uᵢ⁴/νᵢ, formed as 1 / Σ (uᵢ/u_c)⁴/νᵢ so that neither sum overflows or
 * underflows; `Infinity` when no component has finite νᵢ and uᵢ > 0, or u_c = 0.
 */
export function effectiveDegreesOfFreedomOf(
  combined: number,
  components: readonly { readonly contribution: number; readonly degreesOfFreedom: number }[],
): number {
  if (combined === 0) return Infinity;
  let denominator = 0;
  for (const { contribution, degreesOfFreedom } of components) {
    if (degreesOfFreedom === Infinity || contribution === 0) continue;
    const ratio = contribution / combined;
    denominator += (ratio * ratio * (ratio * ratio)) / degreesOfFreedom;
  }
  return denominator === 0 ? Infinity : 1 / denominator;
}

/** The degrees of freedom the GUM uses for k: ν_eff truncated to the next lower integer (G.4.1), unless below 1. */
export function truncatedDegreesOfFreedom(nu: number): number {
  return nu >= 1 && nu !== Infinity ? Math.floor(nu) : nu;
}
