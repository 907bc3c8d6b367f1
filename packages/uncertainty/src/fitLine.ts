import { BridgeworkError, checkFinite, checkPositive, checkObject, formatValue } from '@bridgework/core';
import type { Correlation } from './correlations.js';
import type { InputQuantities, NormalQuantity } from './quantities.js';

/** Options of {@link fitLine}. */
export interface FitLineOptions {
  /** Abscissae xₖ (finite; at least two distinct values). */
  readonly x: readonly number[];
  /** Observations yₖ (finite), as many as `x`. */
  readonly y: readonly number[];
  /** The reference abscissa x₀ of the line y = y₁ + y₂(x − x₀). Default 0. */
  readonly x0?: number;
  /**
   * Known standard uncertainties of the observations (> 0): one for all, or one per point. When
   * given, the fit is weighted by 1/u²(yₖ) and the parameter covariance follows from them alone
   * (infinite degrees of freedom); when absent, the fit is unweighted and the covariance is
   * scaled by the residual variance s² with n − 2 degrees of freedom (JCGM 100 H.3).
   */
  readonly yStandardUncertainties?: number | readonly number[];
}

/** The parameters of a fitted line as named normal quantities. */
export interface LineParameterQuantities extends InputQuantities {
  /** y₁, the line's value at x₀, with u(y₁) and the fit's degrees of freedom. */
  readonly intercept: NormalQuantity;
  /** y₂, the slope, with u(y₂) and the fit's degrees of freedom. */
  readonly slope: NormalQuantity;
}

/** The two parameters of a fitted line as input quantities, ready for {@link propagate}. */
export interface LineQuantities {
  /** `intercept` (y₁ at x₀) and `slope` (y₂) as normal quantities with their degrees of freedom. */
  readonly inputs: LineParameterQuantities;
  /** Their correlation. */
  readonly correlations: readonly Correlation[];
}

/** A prediction of the fitted line with its standard uncertainty. */
export interface LinePrediction {
  /** y₁ + y₂(x − x₀). */
  readonly value: number;
  /** √(u²(y₁) + (x − x₀)²u²(y₂) + 2(x − x₀)·u(y₁, y₂)). */
  readonly standardUncertainty: number;
  /** Its degrees of freedom: those of the fit (n − 2, or `Infinity` with known uncertainties). */
  readonly degreesOfFreedom: number;
}

/** A straight line fitted by least squares, with the covariance of its parameters (see {@link fitLine}). */
export interface LineFit {
  /** The reference abscissa x₀. */
  readonly x0: number;
  /** y₁: the line's value at x₀. */
  readonly intercept: number;
  /** y₂: its slope. */
  readonly slope: number;
  /** u(y₁). */
  readonly interceptUncertainty: number;
  /** u(y₂). */
  readonly slopeUncertainty: number;
  /** The covariance u(y₁, y₂). */
  readonly covariance: number;
  /** The correlation coefficient r(y₁, y₂). */
  readonly correlation: number;
  /** Degrees of freedom of the parameter uncertainties: n − 2 unweighted, `Infinity` with known u(yₖ). */
  readonly degreesOfFreedom: number;
  /** Residuals yₖ − (y₁ + y₂(xₖ − x₀)). */
  readonly residuals: readonly number[];
  /** Σ wₖ·residualₖ² (wₖ = 1 unweighted, 1/u²(yₖ) weighted: then the χ² of the fit). */
  readonly sumOfSquaredResiduals: number;
  /** s = √(Σ wₖ·residualₖ²/(n − 2)); unweighted, the experimental standard deviation of the points (0 for n = 2). */
  readonly residualStandardDeviation: number;
  /**
   * The line's value at x and its standard uncertainty from the parameter covariance.
   *
   * @param x - Abscissa (finite).
   */
  predict(x: number): LinePrediction;
  /** The parameters as correlated normal input quantities for {@link propagate}. */
  quantities(): LineQuantities;
}

function numbers(param: string, value: unknown): number[] {
  if (!Array.isArray(value)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`${param}\` must be an array of numbers; got ${formatValue(value)}`,
      { param, value },
    );
  }
  return value.map((v: unknown, i) => checkFinite(`${param}[${i}]`, v));
}

/**
 * Fits a straight line y = y₁ + y₂(x − x₀) by least squares, with the uncertainties and
 * correlation of its parameters (JCGM 100 Annex H.3).
 *
 * @remarks
 * With weights wₖ (1, or 1/u²(yₖ)), W = Σwₖ, the weighted means x̄ and ȳ and
 * Sxx = Σwₖ(xₖ − x̄)²: y₂ = Σwₖ(xₖ − x̄)(yₖ − ȳ)/Sxx and y₁ = ȳ + y₂(x₀ − x̄). The parameter
 * covariance is σ²·[[1/W + (x₀ − x̄)²/Sxx, (x₀ − x̄)/Sxx], [(x₀ − x̄)/Sxx, 1/Sxx]] with σ² = 1 when
 * the u(yₖ) are known, and σ² = s² = Σ residual²/(n − 2) otherwise (JCGM 100 H.3.2–H.3.3). Centring
 * on x̄ keeps the sums free of cancellation. This is the minimal general fit the GUM's worked
 * example needs; polynomial calibration fits belong to the calibration package.
 *
 * @param options - Points, reference abscissa and optional known uncertainties.
 * @returns The fitted line, its parameter uncertainties, covariance, residuals and a predictor.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite` for bad numbers;
 *   `invalid-shape` when x, y (or the uncertainties) differ in length; `too-few-points` for fewer
 *   than 3 points unweighted (2 weighted); `singular` when every x is the same; `not-positive`
 *   for an uncertainty ≤ 0.
 * @example
 * ```ts
 * const fit = fitLine({ x: [1, 2, 3], y: [2.1, 3.9, 6.0], x0: 2 });
 * fit.intercept; // 4 (the mean of y, since x̄ = x₀)
 * fit.slope; // 1.95
 * ```
 */
export function fitLine(options: FitLineOptions): LineFit {
  const o = checkObject('options', options);
  const x = numbers('x', o['x']);
  const y = numbers('y', o['y']);
  const n = x.length;
  if (y.length !== n) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`y\` must have as many entries as \`x\` (${n}); got ${y.length}`,
      { param: 'y', value: y, limit: n },
    );
  }
  const x0 = o['x0'] === undefined ? 0 : checkFinite('x0', o['x0']);
  const given = o['yStandardUncertainties'];
  const weighted = given !== undefined;
  let w: number[];
  if (!weighted) w = x.map(() => 1);
  else if (typeof given === 'number') {
    const u = checkPositive('yStandardUncertainties', given);
    w = x.map(() => 1 / (u * u));
  } else {
    const us = numbers('yStandardUncertainties', given);
    if (us.length !== n) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`yStandardUncertainties\` must have ${n} entries; got ${us.length}`,
        {
          param: 'yStandardUncertainties',
          value: given,
          limit: n,
        },
      );
    }
    w = us.map((u, k) => {
      const v = checkPositive(`yStandardUncertainties[${k}]`, u);
      return 1 / (v * v);
    });
  }
  const least = weighted ? 2 : 3;
  if (n < least) {
    throw new BridgeworkError(
      'too-few-points',
      `\`x\` must hold at least ${least} points${weighted ? '' : ' (the residuals estimate the scatter)'}; got ${n}`,
      {
        param: 'x',
        value: n,
        limit: least,
      },
    );
  }
  const total = w.reduce((a, b) => a + b, 0);
  const xMean = x.reduce((a, v, k) => a + (w[k] as number) * v, 0) / total;
  const yMean = y.reduce((a, v, k) => a + (w[k] as number) * v, 0) / total;
  let sxx = 0;
  let sxy = 0;
  for (let k = 0; k < n; k++) {
    const dx = (x[k] as number) - xMean;
    sxx += (w[k] as number) * dx * dx;
    sxy += (w[k] as number) * dx * ((y[k] as number) - yMean);
  }
  if (!(sxx > 0)) {
    throw new BridgeworkError(
      'singular',
      '`x` must hold at least two distinct abscissae; every point has the same x',
      {
        param: 'x',
        value: x,
      },
    );
  }
  const slope = sxy / sxx;
  const intercept = yMean + slope * (x0 - xMean);
  const residuals = y.map((v, k) => v - (yMean + slope * ((x[k] as number) - xMean)));
  const ssr = residuals.reduce((a, r, k) => a + (w[k] as number) * r * r, 0);
  const s2 = n > 2 ? ssr / (n - 2) : 0;
  const sigma2 = weighted ? 1 : s2;
  const shift = x0 - xMean;
  const varSlope = sigma2 / sxx;
  const varIntercept = sigma2 / total + shift * shift * varSlope;
  const cov = shift * varSlope;
  const interceptUncertainty = Math.sqrt(varIntercept);
  const slopeUncertainty = Math.sqrt(varSlope);
  const correlation =
    interceptUncertainty > 0 && slopeUncertainty > 0 ? cov / (interceptUncertainty * slopeUncertainty) : 0;
  const degreesOfFreedom = weighted ? Infinity : n - 2;
  return {
    x0,
    intercept,
    slope,
    interceptUncertainty,
    slopeUncertainty,
    covariance: cov,
    correlation,
    degreesOfFreedom,
    residuals,
    sumOfSquaredResiduals: ssr,
    residualStandardDeviation: Math.sqrt(s2),
    predict(at) {
      const d = checkFinite('x', at) - x0;
      const fromMean = at - xMean; // the same variance, written without cancellation
      return {
        value: intercept + slope * d,
        standardUncertainty: Math.sqrt(sigma2 / total + fromMean * fromMean * varSlope),
        degreesOfFreedom,
      };
    },
    quantities() {
      const nu = degreesOfFreedom === Infinity ? {} : { degreesOfFreedom };
      return {
        inputs: {
          intercept: { value: intercept, standardUncertainty: interceptUncertainty, ...nu },
          slope: { value: slope, standardUncertainty: slopeUncertainty, ...nu },
        },
        // |r| < 1 exactly; the guard only removes a last-bit rounding excess.
        correlations: [
          { between: ['intercept', 'slope'], coefficient: Math.max(-1, Math.min(1, correlation)) },
        ],
      };
    },
  };
}
