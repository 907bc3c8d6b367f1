import { BridgeworkError, checkFinite, checkObject, formatValue } from '@bridgework/core';
import type { Correlation } from './correlations.js';
import type { NormalQuantity } from './quantities.js';

/** Input quantities from repeated observations, ready for {@link propagate} (see {@link typeAEvaluation}). */
export interface TypeAEvaluation {
  /** Each quantity: the mean, u = s/√n and ν = n − 1. */
  readonly inputs: Readonly<Record<string, NormalQuantity>>;
  /** The correlation coefficients of the means of simultaneous observations (pairs with r ≠ 0). */
  readonly correlations: readonly Correlation[];
}

/**
 * Type A evaluation of standard uncertainty from repeated, simultaneous observations
 * (JCGM 100 4.2 and 5.2.3).
 *
 * @remarks
 * For n observations qₖ of each quantity: the estimate is the mean q̄ (eq. 3), the experimental
 * variance s²(qₖ) = Σ(qₖ − q̄)²/(n − 1) (eq. 4), u(q̄) = s(qₖ)/√n (eq. 5) with ν = n − 1
 * degrees of freedom (G.3.3). Observations made together (the k-th of every series at the same
 * time) give the covariance of the means s(q̄, r̄) = Σ(qₖ − q̄)(rₖ − r̄)/(n(n − 1)) (eq. 17) and the
 * correlation coefficient r = s(q̄, r̄)/(s(q̄)·s(r̄)) (eq. 14); a pair involving a series without
 * scatter gets none. JCGM 100 H.2 starts this way from five sets of V, I and φ.
 *
 * @param observations - Series of observations by quantity name, all of the same length n ≥ 2.
 * @returns Normal input quantities with degrees of freedom, and their correlations.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite` for bad values;
 *   `invalid-shape` when there is no series or the series differ in length; `too-few-points` for
 *   fewer than 2 observations.
 * @example
 * ```ts
 * const { inputs } = typeAEvaluation({ V: [5.007, 4.994, 5.005, 4.990, 4.999] });
 * inputs.V; // { value: 4.9990000000000006, standardUncertainty: 0.0032093613071761794, degreesOfFreedom: 4 }
 * ```
 */
export function typeAEvaluation(observations: Readonly<Record<string, readonly number[]>>): TypeAEvaluation {
  const record = checkObject('observations', observations);
  const names = Object.keys(record);
  if (names.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      '`observations` must hold at least one series; got an empty object',
      {
        param: 'observations',
        value: observations,
      },
    );
  }
  const series = names.map((name) => {
    const v = record[name];
    if (!Array.isArray(v)) {
      throw new BridgeworkError(
        'wrong-type',
        `\`observations.${name}\` must be an array of numbers; got ${formatValue(v)}`,
        {
          param: `observations.${name}`,
          value: v,
        },
      );
    }
    return v.map((x: unknown, k) => checkFinite(`observations.${name}[${k}]`, x));
  });
  const n = (series[0] as number[]).length;
  series.forEach((s, i) => {
    if (s.length !== n) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`observations.${names[i]}\` must have ${n} observations like \`${names[0]}\`; got ${s.length}`,
        {
          param: `observations.${names[i]}`,
          value: s.length,
          limit: n,
        },
      );
    }
  });
  if (n < 2) {
    throw new BridgeworkError(
      'too-few-points',
      `\`observations\` must hold at least 2 observations per series; got ${n}`,
      {
        param: 'observations',
        value: n,
        limit: 2,
      },
    );
  }
  // Each series scaled by a power of two about its largest magnitude (exact), so that neither the
  // sums nor the squared deviations overflow or underflow; ordinary data give the same doubles.
  const exponents = series.map((s) => {
    const largest = s.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
    return largest === 0 ? 0 : Math.max(-1022, Math.min(1023, Math.ceil(Math.log2(largest))));
  });
  const scaled = series.map((s, i) => s.map((q) => q * 2 ** -(exponents[i] as number)));
  const scaledMeans = scaled.map((s) => s.reduce((a, b) => a + b, 0) / n);
  const deviations = scaled.map((s, i) => s.map((q) => q - (scaledMeans[i] as number)));
  const covarianceOfMeans = (i: number, j: number): number =>
    (deviations[i] as number[]).reduce((a, d, k) => a + d * ((deviations[j] as number[])[k] as number), 0) /
    (n * (n - 1));
  const scaledU = names.map((_, i) => Math.sqrt(covarianceOfMeans(i, i)));
  const means = scaledMeans.map((m, i) => m * 2 ** (exponents[i] as number));
  const u = scaledU.map((v, i) => v * 2 ** (exponents[i] as number));
  const inputs: Record<string, NormalQuantity> = {};
  names.forEach((name, i) => {
    inputs[name] = {
      value: means[i] as number,
      standardUncertainty: u[i] as number,
      degreesOfFreedom: n - 1,
    };
  });
  const correlations: Correlation[] = [];
  for (let i = 0; i < names.length; i++) {
    for (let j = i + 1; j < names.length; j++) {
      if (!((scaledU[i] as number) > 0 && (scaledU[j] as number) > 0)) continue;
      const r = covarianceOfMeans(i, j) / ((scaledU[i] as number) * (scaledU[j] as number));
      // |r| ≤ 1 by Cauchy–Schwarz; the guard only removes a last-bit rounding excess.
      if (r !== 0)
        correlations.push({
          between: [names[i] as string, names[j] as string],
          coefficient: Math.max(-1, Math.min(1, r)),
        });
    }
  }
  return { inputs, correlations };
}
