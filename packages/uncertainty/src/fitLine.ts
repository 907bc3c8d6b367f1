import { BridgeworkError, checkFinite, checkOptions, checkPositive, formatValue } from '@bridgework/core';
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

/** The largest ratio of two known u(yₖ) of one fit: their weights 1/u² then stay within 1e300. */
const MAX_UNCERTAINTY_RATIO = 1e150;

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
 * on x̄ keeps the sums free of cancellation; x and y are scaled by powers of two (exactly) and the
 * weights taken relative to the smallest u(yₖ), so data anywhere in the binary64 range neither
 * overflow nor underflow in the sums, and ordinary data give the same doubles as unscaled. This is
 * the minimal general fit the GUM's worked
 * example needs; polynomial calibration fits belong to the calibration package.
 *
 * @param options - Points, reference abscissa and optional known uncertainties.
 * @returns The fitted line, its parameter uncertainties, covariance, residuals and a predictor.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite` for bad numbers;
 *   `invalid-shape` when x, y (or the uncertainties) differ in length; `too-few-points` for fewer
 *   than 3 points unweighted (2 weighted); `singular` when every x is the same; `not-positive`
 *   for an uncertainty ≤ 0; `out-of-range` for known uncertainties more than 1e150 apart, or a
 *   figure of the fit past binary64 (say a covariance in y units squared for y near 1e160);
 *   `unknown-option`, `missing-option` for the options' keys.
 * @example
 * ```ts
 * const fit = fitLine({ x: [1, 2, 3], y: [2.1, 3.9, 6.0], x0: 2 });
 * fit.intercept; // 4 (the mean of y, since x̄ = x₀)
 * fit.slope; // 1.95
 * ```
 */
export function fitLine(options: FitLineOptions): LineFit {
  const o = checkOptions('options', options, {
    known: ['x', 'y', 'x0', 'yStandardUncertainties'],
    required: ['x', 'y'],
  });
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
  let us: number[] | undefined;
  if (weighted && typeof given === 'number') {
    const u = checkPositive('yStandardUncertainties', given);
    us = x.map(() => u);
  } else if (weighted) {
    const list = numbers('yStandardUncertainties', given);
    if (list.length !== n) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`yStandardUncertainties\` must have ${n} entries; got ${list.length}`,
        {
          param: 'yStandardUncertainties',
          value: given,
          limit: n,
        },
      );
    }
    us = list.map((u, k) => checkPositive(`yStandardUncertainties[${k}]`, u));
    const smallest = us.reduce((m, u) => Math.min(m, u), Infinity);
    const largest = us.reduce((m, u) => Math.max(m, u), 0);
    if (largest / smallest > MAX_UNCERTAINTY_RATIO) {
      throw new BridgeworkError(
        'out-of-range',
        `\`yStandardUncertainties\` must lie within a factor ${MAX_UNCERTAINTY_RATIO} of each other (their weights 1/u² within 1e300, the range of binary64); got ${formatValue(smallest)} to ${formatValue(largest)}`,
        { param: 'yStandardUncertainties', value: given, limit: MAX_UNCERTAINTY_RATIO },
      );
    }
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
  // Work in units scaled by powers of two (exact): x by 2^ex and y by 2^ey, each about its largest
  // magnitude, and the weights relative to 1/(2^eu)² with 2^eu just below the smallest u(yₖ). For
  // ordinary data every result is the same double as without scaling; data near the ends of the
  // binary64 range neither overflow nor underflow in the sums.
  const ex = binaryExponent(x);
  const ey = binaryExponent(y);
  const eu = us === undefined ? 0 : binaryExponent([us.reduce((a, b) => Math.min(a, b), Infinity)]) - 1;
  const xs = x.map((v) => ldexp(v, -ex));
  const ys = y.map((v) => ldexp(v, -ey));
  const w = us === undefined ? x.map(() => 1) : us.map((u) => 1 / ldexp(u, -eu) ** 2);
  const total = w.reduce((a, b) => a + b, 0);
  const xMean = xs.reduce((a, v, k) => a + ((w[k] as number) / total) * v, 0);
  const yMean = ys.reduce((a, v, k) => a + ((w[k] as number) / total) * v, 0);
  let sxx = 0;
  let sxy = 0;
  for (let k = 0; k < n; k++) {
    const dx = (xs[k] as number) - xMean;
    sxx += (w[k] as number) * dx * dx;
    sxy += (w[k] as number) * dx * ((ys[k] as number) - yMean);
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
  // Scaled slope, residuals and their weighted sum of squares.
  const slopeScaled = sxy / sxx;
  const residualsScaled = ys.map((v, k) => v - (yMean + slopeScaled * ((xs[k] as number) - xMean)));
  const ssrScaled = residualsScaled.reduce((a, r, k) => a + (w[k] as number) * r * r, 0);
  const sScaled = n > 2 ? Math.sqrt(ssrScaled / (n - 2)) : 0;
  // σ, the scale of the parameter uncertainties in y units: 2^eu with known u(yₖ), else s; kept
  // as sigma·2^sigmaExp until the end, as the products below may leave the range on the way.
  const sigma = weighted ? 1 : sScaled;
  const sigmaExp = weighted ? eu : ey;
  const x0Scaled = ldexp(x0, -ex);
  const shift = x0Scaled - xMean;
  const slope = finite('slope', ldexp(slopeScaled, ey - ex));
  const intercept = finite('intercept', ldexp(yMean + slopeScaled * shift, ey));
  // √(1/W + shift²/Sxx) by hypot, which neither overflows nor underflows in the squares.
  const relativeIntercept = Math.hypot(Math.sqrt(1 / total), shift / Math.sqrt(sxx));
  // An exact fit (σ = 0) has zero uncertainties wherever x₀ lies.
  const interceptUncertainty =
    sigma === 0 ? 0 : finite('intercept uncertainty', ldexp(sigma * relativeIntercept, sigmaExp));
  const slopeUncertainty = finite('slope uncertainty', ldexp(sigma / Math.sqrt(sxx), sigmaExp - ex));
  const covariance =
    sigma === 0 ? 0 : finite('covariance', ldexp(((sigma * shift) / sxx) * sigma, 2 * sigmaExp - ex));
  const correlation = sigma > 0 && relativeIntercept > 0 ? shift / Math.sqrt(sxx) / relativeIntercept : 0;
  const degreesOfFreedom = weighted ? Infinity : n - 2;
  const residuals = residualsScaled.map((r) => ldexp(r, ey));
  // Weighted, Σ wₖrₖ² is the dimensionless χ²; unweighted it is in y units squared.
  const sumOfSquaredResiduals = finite(
    'sum of squared residuals',
    ldexp(ssrScaled, weighted ? 2 * (ey - eu) : 2 * ey),
  );
  const residualStandardDeviation = finite(
    'residual standard deviation',
    ldexp(sScaled, weighted ? ey - eu : ey),
  );
  return {
    x0,
    intercept,
    slope,
    interceptUncertainty,
    slopeUncertainty,
    covariance,
    correlation,
    degreesOfFreedom,
    residuals,
    sumOfSquaredResiduals,
    residualStandardDeviation,
    predict(at) {
      const atScaled = ldexp(checkFinite('x', at), -ex);
      const fromMean = atScaled - xMean; // the same variance as from x₀, written without cancellation
      const value = ldexp(yMean + slopeScaled * fromMean, ey);
      const standardUncertainty =
        sigma === 0
          ? 0
          : ldexp(sigma * Math.hypot(Math.sqrt(1 / total), fromMean / Math.sqrt(sxx)), sigmaExp);
      if (!Number.isFinite(value) || !Number.isFinite(standardUncertainty)) {
        throw new BridgeworkError(
          'out-of-range',
          `\`x\` must be where the line's value and its uncertainty are representable in binary64; got ${formatValue(at)}`,
          { param: 'x', value: at },
        );
      }
      return { value, standardUncertainty, degreesOfFreedom };
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

/** The exponent e of the power of two 2^e at or just above the largest |v| (0 when all are 0). */
function binaryExponent(values: readonly number[]): number {
  let largest = 0;
  for (const v of values) largest = Math.max(largest, Math.abs(v));
  if (largest === 0) return 0;
  if (!Number.isFinite(largest)) return 1023;
  let e = Math.ceil(Math.log2(largest));
  // Math.log2 may be off by one near powers of two: make 2^(e−1) < largest ≤ 2^e exactly.
  while (2 ** e < largest) e++;
  while (e > -1074 && 2 ** (e - 1) >= largest) e--;
  return Math.max(-1022, Math.min(1023, e));
}

/** v·2^e, applied in steps so that no factor overflows or underflows on its own. */
function ldexp(v: number, e: number): number {
  let r = v;
  let k = e;
  while (k > 1000) {
    r *= 2 ** 1000;
    k -= 1000;
  }
  while (k < -1000) {
    r *= 2 ** -1000;
    k += 1000;
  }
  return r * 2 ** k;
}

function finite(name: string, value: number): number {
  if (Number.isFinite(value)) return value;
  throw new BridgeworkError(
    'out-of-range',
    `the fit's ${name} is not representable in binary64 (${formatValue(value)}): express x or y in other units`,
    { param: 'y', value },
  );
}
