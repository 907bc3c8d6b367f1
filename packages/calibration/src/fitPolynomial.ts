import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
  type Interval,
} from '@bridgework/core';
import { MAGNITUDE_LIMIT, checkBoundedArray, finiteResult } from './internal/checks.js';
import { factorDesign, solveDesign, unitCovariance } from './internal/leastSquares.js';
import {
  derivative,
  horner,
  rootsUpToQuadratic,
  scaledToUnscaled,
  solveMonotone,
} from './internal/polynomial.js';

/** Options of {@link fitPolynomial}. */
export interface PolynomialFitOptions {
  /** Reference loads (the abscissa x), finite, any unit; at least `degree + 1` distinct values. */
  readonly loads: readonly number[];
  /** Readings at those loads (the ordinate y), finite, any unit (V/V, counts...); same length. */
  readonly readings: readonly number[];
  /** Polynomial degree: 1, 2 or 3. */
  readonly degree: number;
  /**
   * Known standard uncertainty of each reading (> 0, reading unit). When given, the coefficient
   * covariance is u²·(AᵀA)⁻¹ (a Type B input) and as many points as coefficients suffice; when
   * absent it is s²·(AᵀA)⁻¹ with s the residual standard deviation, which needs more points than
   * coefficients.
   */
  readonly readingStandardUncertainty?: number;
  /**
   * How far beyond the calibrated loads the inverse map may extrapolate, as a fraction of the
   * calibrated span on each side (0 to 1). Default 0.05.
   */
  readonly extrapolationFraction?: number;
}

/** The numeric method of a fit's inverse map. */
export type InverseMethod = 'closed-form' | 'safeguarded-newton';

/** A least-squares polynomial fit of reading against load (see {@link fitPolynomial}). */
export interface PolynomialFit {
  /** Polynomial degree (1–3). */
  readonly degree: number;
  /** Coefficients c0…cd in the caller's basis: reading = Σ c_k·load^k. */
  readonly coefficients: readonly number[];
  /** Standard uncertainties u(c_k), same order and units as `coefficients`. */
  readonly standardUncertainties: readonly number[];
  /** Covariance matrix of the coefficients, (d+1)×(d+1). */
  readonly covariance: readonly (readonly number[])[];
  /** Correlation matrix of the coefficients (independent of the uncertainty scale). */
  readonly correlation: readonly (readonly number[])[];
  /** Residuals reading − fitted reading, in input order. */
  readonly residuals: readonly number[];
  /** Residual standard deviation s = √(Σ residual²/ν); `undefined` when ν = 0. */
  readonly residualStandardDeviation: number | undefined;
  /** Degrees of freedom ν = points − coefficients. */
  readonly degreesOfFreedom: number;
  /** Whether the uncertainties come from the residuals or from `readingStandardUncertainty`. */
  readonly uncertaintySource: 'residuals' | 'given';
  /** The scaling used internally: t = (load − center)/halfRange maps the loads onto [−1, 1]. */
  readonly scaling: {
    /** Midpoint of the calibrated loads. */
    readonly center: number;
    /** Half the calibrated span. */
    readonly halfRange: number;
  };
  /** Coefficients a_k in the scaled variable t (reading = Σ a_k·t^k), better conditioned. */
  readonly scaledCoefficients: readonly number[];
  /** The range of the reference loads. */
  readonly calibratedRange: Interval;
  /**
   * Loads over which {@link PolynomialFit.loadAt} is defined: the calibrated range widened by
   * `extrapolationFraction` of its span on each side and cut at any turning point of the fit.
   * `undefined` when the fit turns inside the calibrated range (then it has no inverse).
   */
  readonly inverseRange: Interval | undefined;
  /** How {@link PolynomialFit.loadAt} solves: closed form for degree 1, safeguarded Newton otherwise. */
  readonly inverseMethod: InverseMethod;
  /**
   * The fitted reading at a load (any finite load; beyond the calibrated range it extrapolates).
   *
   * @param load - Load, in the unit of `loads`.
   */
  readingAt(load: number): number;
  /**
   * Standard uncertainty of the fitted reading at a load, √(gᵀ·V·g) with g = (1, x, …, x^d).
   *
   * @param load - Load, in the unit of `loads`.
   */
  readingUncertaintyAt(load: number): number;
  /**
   * The load at which the fit gives a reading (the inverse map), inside `inverseRange`.
   *
   * @param reading - Reading, in the unit of `readings`.
   * @throws {@link @bridgework/core!BridgeworkError} `no-solution` when the fit has no inverse;
   *   `out-of-range` for a reading outside the fit's values over `inverseRange`.
   */
  loadAt(reading: number): number;
}

/**
 * Least-squares polynomial fit of readings against loads, with uncertainties and an inverse.
 *
 * @remarks
 * Method: the loads are scaled to t ∈ [−1, 1], and the Vandermonde matrix A (n×(d+1)) in t is
 * factored A = Q·R by Householder QR in plain doubles (the package's own kernel; Golub and Van
 * Loan, _Matrix Computations_, 5.3.3), and R₁·a = Q₁ᵀ·y is solved by back substitution; the normal
 * equations, which square the condition number, are never formed. Coefficients are mapped to the
 * caller's basis by the binomial expansion of t = (x − center)/halfRange, and so is the covariance
 * V = T·(s²·R₁⁻¹R₁⁻ᵀ)·Tᵀ. This is the GUM's straight-line calibration generalised (JCGM 100:2008,
 * H.3); it reproduces that example's published results and agrees with a 40-digit decimal.js
 * solution of the normal equations to 1e-12. The inverse is closed-form for degree 1; for degrees
 * 2 and 3 a safeguarded Newton iteration on the monotone range converges to 4ε of the scaled
 * variable (about 1e-15 of the half-span) in at most 100 iterations. Synchronous, and free of
 * mathjs (mathjs is only the tests' oracle).
 *
 * @param options - Loads, readings, degree, optional reading uncertainty and extrapolation.
 * @returns The fit, its uncertainties, residuals and the two maps.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the
 *   options rule; `invalid-shape` for arrays that are not arrays or differ in length; `not-finite`,
 *   `wrong-type` for a bad entry (param `readings[i]`); `out-of-range` for a load or reading beyond
 *   ±1e150 (so that no sum of squares overflows); `out-of-range`, `not-integer` for a degree other
 *   than 1–3; `too-few-points` for fewer points than coefficients (or no more, without
 *   `readingStandardUncertainty`); `singular` when fewer distinct loads than coefficients are given
 *   or the system is numerically rank deficient.
 * @example
 * ```ts
 * const fit = fitPolynomial({ loads: [0, 1, 2, 3], readings: [0.1, 2.1, 3.9, 6.1], degree: 1 });
 * fit.coefficients; // ≈ [0.08, 1.98]
 * fit.loadAt(4); // ≈ 1.9798
 * ```
 */
export function fitPolynomial(options: PolynomialFitOptions): PolynomialFit {
  const o = checkOptions('options', options, {
    known: ['loads', 'readings', 'degree', 'readingStandardUncertainty', 'extrapolationFraction'],
    required: ['loads', 'readings', 'degree'],
  });
  const degree = checkInteger('degree', o['degree'], { min: 1, max: 3 });
  const loads = checkBoundedArray('loads', o['loads']);
  const readings = checkBoundedArray('readings', o['readings'], loads.length);
  const known =
    o['readingStandardUncertainty'] === undefined
      ? undefined
      : checkRange(
          'readingStandardUncertainty',
          checkPositive('readingStandardUncertainty', o['readingStandardUncertainty']),
          { max: MAGNITUDE_LIMIT },
        );
  const extrapolation =
    o['extrapolationFraction'] === undefined
      ? 0.05
      : checkRange('extrapolationFraction', o['extrapolationFraction'], { min: 0, max: 1 });
  const n = loads.length;
  const p = degree + 1;
  const needed = known === undefined ? p + 1 : p;
  if (n < needed) {
    throw new BridgeworkError(
      'too-few-points',
      `\`loads\` must hold at least ${needed} points for a degree-${degree} fit${known === undefined ? ' with uncertainties from the residuals (or give readingStandardUncertainty)' : ''}; got ${n}`,
      { param: 'loads', value: n, limit: needed },
    );
  }
  const distinct = new Set(loads).size;
  if (distinct < p) {
    throw new BridgeworkError(
      'singular',
      `\`loads\` must hold at least ${p} distinct values for a degree-${degree} fit; got ${distinct}`,
      { param: 'loads', value: distinct, limit: p },
    );
  }

  const min = Math.min(...loads);
  const max = Math.max(...loads);
  const center = 0.5 * min + 0.5 * max;
  const half = 0.5 * max - 0.5 * min;
  const ts = loads.map((x) => (x - center) / half);
  const design = new Float64Array(n * p);
  ts.forEach((t, i) => {
    for (let k = 0; k < p; k++) design[i * p + k] = t ** k;
  });
  const factor = factorDesign(design, n, p, 64 * n * Number.EPSILON);
  if (factor.accepted.length < p) {
    throw new BridgeworkError(
      'singular',
      `\`loads\` give a numerically rank-deficient degree-${degree} system (a column of the scaled design lies within 64·n·ε of the others)`,
      { param: 'loads' },
    );
  }
  const scaled = Array.from(solveDesign(factor, readings));
  const residuals = readings.map((y, i) => y - horner(scaled, ts[i] as number));
  const dof = n - p;
  const s = dof > 0 ? Math.sqrt(residuals.reduce((sum, e) => sum + e * e, 0) / dof) : undefined;
  const scale = known ?? (s as number);

  // Unit-variance covariance in t: R₁⁻¹·R₁⁻ᵀ.
  const unitFlat = unitCovariance(factor);
  const unitScaled = Array.from({ length: p }, (_, i) =>
    Array.from({ length: p }, (_, j) => unitFlat[i * p + j] as number),
  );
  const t = scaledToUnscaled(center, half, degree);
  const transform = (m: number[][]): number[][] =>
    Array.from({ length: p }, (_, i) =>
      Array.from({ length: p }, (_, j) => {
        let sum = 0;
        for (let k = 0; k < p; k++) {
          for (let l = 0; l < p; l++) {
            sum +=
              ((t[i] as number[])[k] as number) *
              ((m[k] as number[])[l] as number) *
              ((t[j] as number[])[l] as number);
          }
        }
        return sum;
      }),
    );
  const unit = transform(unitScaled);
  const covariance = unit.map((row) => row.map((v) => v * scale * scale));
  const unitSd = unit.map((row, i) => Math.sqrt(row[i] as number));
  const correlation = unit.map((row, i) =>
    row.map((v, j) => (i === j ? 1 : v / ((unitSd[i] as number) * (unitSd[j] as number)))),
  );
  const coefficients = Array.from({ length: p }, (_, i) =>
    scaled.reduce((sum, ak, k) => sum + ((t[i] as number[])[k] as number) * ak, 0),
  );

  const figures = [...coefficients, ...covariance.flat(), ...correlation.flat(), s ?? 0, scale];
  if (!figures.every(Number.isFinite) || unitSd.some((u) => !(u > 0))) {
    throw new BridgeworkError(
      'out-of-range',
      `\`loads\` must span a range whose powers up to ${degree} stay within the double range (the coefficients per unit load overflow or vanish); got loads from ${formatValue(min)} to ${formatValue(max)}: express them in a larger or smaller unit`,
      { param: 'loads', value: [min, max] },
    );
  }

  // The inverse: the fit must be strictly monotone on the calibrated range ([−1, 1] in t).
  const slope = derivative(scaled);
  const turning = rootsUpToQuadratic(slope);
  const monotone = !turning.some((root) => root > -1 && root < 1) && horner(slope, 0) !== 0;
  let inverseRange: Interval | undefined;
  let tLo = -1 - 2 * extrapolation;
  let tHi = 1 + 2 * extrapolation;
  if (monotone) {
    for (const root of turning) {
      if (root <= -1) tLo = Math.max(tLo, root);
      if (root >= 1) tHi = Math.min(tHi, root);
    }
    inverseRange = { min: center + half * tLo, max: center + half * tHi };
  }
  // The readings at the ends, both as the scaled variable gives them and as readingAt gives them
  // from the end loads (which round (load − center)/half): within those and a few ulps a reading
  // is at the end.
  const ends = [
    horner(scaled, tLo),
    horner(scaled, tHi),
    horner(scaled, (center + half * tLo - center) / half),
    horner(scaled, (center + half * tHi - center) / half),
  ];
  const slack = 8 * Number.EPSILON * Math.max(...ends.map(Math.abs));
  const readingLimits = [Math.min(...ends) - slack, Math.max(...ends) + slack] as const;

  return {
    degree,
    coefficients,
    standardUncertainties: covariance.map((row, i) => Math.sqrt(row[i] as number)),
    covariance,
    correlation,
    residuals,
    residualStandardDeviation: s,
    degreesOfFreedom: dof,
    uncertaintySource: known === undefined ? 'residuals' : 'given',
    scaling: { center, halfRange: half },
    scaledCoefficients: scaled,
    calibratedRange: { min, max },
    inverseRange,
    inverseMethod: degree === 1 ? 'closed-form' : 'safeguarded-newton',
    readingAt(load: number): number {
      const x = checkFinite('load', load);
      return finiteResult('load', x, horner(scaled, (x - center) / half), 'the fitted reading');
    },
    readingUncertaintyAt(load: number): number {
      const x = checkFinite('load', load);
      const tt = (x - center) / half;
      // g = (1, t, …, t^d) divided by max(1, |t|)^d, so no power overflows; scaled back at the end.
      const big = Math.max(1, Math.abs(tt));
      let v = 0;
      for (let i = 0; i < p; i++) {
        for (let j = 0; j < p; j++) {
          const gi = (tt / big) ** i / big ** (degree - i);
          const gj = (tt / big) ** j / big ** (degree - j);
          v += gi * ((unitScaled[i] as number[])[j] as number) * gj;
        }
      }
      return finiteResult('load', x, scale * Math.sqrt(Math.max(v, 0)) * big ** degree, 'the uncertainty');
    },
    loadAt(reading: number): number {
      const y = checkFinite('reading', reading);
      if (inverseRange === undefined) {
        throw new BridgeworkError(
          'no-solution',
          `the degree-${degree} fit turns inside the calibrated range, so \`reading\` has no unique load; got ${formatValue(y)}`,
          { param: 'reading', value: y },
        );
      }
      if (!(y >= readingLimits[0] && y <= readingLimits[1])) {
        throw new BridgeworkError(
          'out-of-range',
          `\`reading\` must be in [${readingLimits[0]}, ${readingLimits[1]}], the fit's values over its inverse range; got ${formatValue(y)}`,
          { param: 'reading', value: y, limit: [...readingLimits] },
        );
      }
      const tt =
        degree === 1
          ? (y - (scaled[0] as number)) / (scaled[1] as number)
          : solveMonotone(scaled, slope, y, tLo, tHi);
      return center + half * tt;
    },
  };
}
