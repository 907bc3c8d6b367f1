import {
  BridgeworkError,
  ZERO_CELSIUS_KELVIN,
  checkFiniteResult,
  checkOneOf,
  checkOptions,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { checkPoints } from './internal/thermistor.js';
import type { SteinhartHartCoefficients } from './createSteinhartHartThermistor.js';
import { fitSteinhartHart, type ThermistorPoint } from './fitSteinhartHart.js';

/** The thermistor models {@link fitThermistor} fits. */
export type ThermistorModel = 'beta' | 'steinhart-hart';

/** Options of {@link fitThermistor}. */
export interface FitThermistorOptions {
  /** `'beta'` (two or more points) or `'steinhart-hart'` (three or more). */
  readonly model: ThermistorModel;
  /** Calibration points at distinct temperatures (at most 10 000). */
  readonly points: readonly ThermistorPoint[];
  /** Beta model: the reference temperature t0 of R0, °C. Default 25. */
  readonly referenceCelsius?: number;
}

/** A thermistor fit (see {@link fitThermistor}). */
export interface ThermistorFit {
  /** The model fitted. */
  readonly model: ThermistorModel;
  /** Beta model: R0 at t0 and B (undefined for Steinhart–Hart). */
  readonly beta:
    | {
        /** R0: the fitted resistance at the reference temperature, Ω. */
        readonly referenceOhms: number;
        /** t0: the reference temperature, °C. */
        readonly referenceCelsius: number;
        /** B: the fitted beta constant, K. */
        readonly betaKelvin: number;
      }
    | undefined;
  /** Steinhart–Hart coefficients (undefined for the beta model). */
  readonly steinhartHart: SteinhartHartCoefficients | undefined;
  /** At each point, the model's temperature at the point's resistance minus the point's temperature, K. */
  readonly residualsKelvin: readonly number[];
  /** Largest |residual|, K. */
  readonly largestResidualKelvin: number;
  /** Root mean square of the residuals, K. */
  readonly rmsResidualKelvin: number;
  /** Points minus coefficients (0: the curve passes through the points). */
  readonly degreesOfFreedom: number;
}

const MAX_POINTS = 10_000;

/**
 * Solves the weighted least-squares problem min ‖W(A·x − y)‖ for three unknowns by Householder QR
 * on the column-scaled matrix (backward stable; the columns 1, ln R, (ln R)³ are nearly parallel
 * and would square their condition number in the normal equations).
 */
function leastSquares3(
  rows: readonly (readonly [number, number, number])[],
  rhs: readonly number[],
): [number, number, number] {
  const m = rows.length;
  const scale = [0, 1, 2].map((j) => Math.hypot(...rows.map((r) => r[j] as number)));
  const a = rows.map((r) => r.map((x, j) => x / (scale[j] as number)));
  const b = rhs.slice();
  for (let k = 0; k < 3; k++) {
    const norm = Math.hypot(...a.slice(k).map((r) => r[k] as number));
    const alpha = (a[k]![k] as number) > 0 ? -norm : norm;
    const v = a.map((r, i) => (i < k ? 0 : (r[k] as number) - (i === k ? alpha : 0)));
    const vv = v.reduce((s, x) => s + x * x, 0);
    if (vv === 0) continue;
    for (let j = k; j < 3; j++) {
      let s = 0;
      for (let i = k; i < m; i++) s += (v[i] as number) * (a[i]![j] as number);
      const f = (2 * s) / vv;
      for (let i = k; i < m; i++) a[i]![j] = (a[i]![j] as number) - f * (v[i] as number);
    }
    let s = 0;
    for (let i = k; i < m; i++) s += (v[i] as number) * (b[i] as number);
    const f = (2 * s) / vv;
    for (let i = k; i < m; i++) b[i] = (b[i] as number) - f * (v[i] as number);
  }
  const x = [0, 0, 0];
  for (let k = 2; k >= 0; k--) {
    let s = b[k] as number;
    for (let j = k + 1; j < 3; j++) s -= (a[k]![j] as number) * (x[j] as number);
    x[k] = s / (a[k]![k] as number);
  }
  return x.map((xi, j) => xi / (scale[j] as number)) as [number, number, number];
}

/**
 * Fits a thermistor's beta or Steinhart–Hart model to calibration points by least squares, with
 * the residual of each point in kelvin.
 *
 * @remarks
 * - Steinhart–Hart, 1/T = a + b·ln R + c·(ln R)³ (T in K): with three points the curve through
 *   them ({@link fitSteinhartHart}, divided differences); with more, the weighted least-squares
 *   fit with weights T², so that the minimised residual is, to first order, the temperature error
 *   in kelvin (δT ≈ −T²·δ(1/T)); solved by Householder QR on the column-scaled matrix.
 * - Beta, ln R = ln R0 + B·(1/T − 1/T0): the straight-line least-squares fit of ln R against
 *   x = 1/T − 1/T0 = (T0 − T)/(T·T0) (relative resistance residuals, the data-sheet definition of
 *   B between two temperatures extended to many); two points give the data-sheet B exactly.
 * The residual of each point is the fitted model's temperature at the point's resistance (closed
 * form for both models) minus the point's temperature. A fit is refused when it is not an NTC
 * curve (b ≤ 0, B ≤ 0) or when the model's temperature at a point's resistance is not finite.
 *
 * @param options - Model, points, reference temperature (beta).
 * @returns The coefficients, the residuals and their summary.
 * @throws {@link @bridgework/core!BridgeworkError} `too-few-points` (fewer than two points for beta,
 *   three for Steinhart–Hart), `invalid-shape` (more than 10 000), `singular` (two points at one
 *   temperature), `no-solution` (not an NTC curve), `invalid-option` (unknown model), and the
 *   errors of the points' checks (`not-positive`, `out-of-range`, `not-finite`, `wrong-type`);
 *   `unknown-option`, `missing-option`.
 * @example
 * ```ts
 * const fit = fitThermistor({
 *   model: 'beta',
 *   points: [
 *     { ohms: 32650, temperatureCelsius: 0 },
 *     { ohms: 10000, temperatureCelsius: 25 },
 *     { ohms: 1752, temperatureCelsius: 70 },
 *   ],
 * });
 * fit.beta; // ≈ { referenceOhms: 9874.87, referenceCelsius: 25, betaKelvin: 3919.75 }
 * fit.largestResidualKelvin; // ≈ 0.285 (a beta curve bends less than the part)
 * ```
 */
export function fitThermistor(options: FitThermistorOptions): ThermistorFit {
  const o = checkOptions('options', options, {
    known: ['model', 'points', 'referenceCelsius'],
    required: ['model', 'points'],
  });
  const model = checkOneOf('model', o['model'], ['beta', 'steinhart-hart'] as const);
  const least = model === 'beta' ? 2 : 3;
  const given = o['points'];
  if (Array.isArray(given) && given.length < least) {
    throw new BridgeworkError(
      'too-few-points',
      `\`points\` must hold at least ${least} points for the ${model} model; got ${given.length}`,
      { param: 'points', value: given.length, limit: least },
    );
  }
  if (Array.isArray(given) && given.length > MAX_POINTS) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`points\` must hold at most ${MAX_POINTS} points; got ${given.length}`,
      {
        param: 'points',
        value: given.length,
        limit: MAX_POINTS,
      },
    );
  }
  const { u, y } = checkPoints(given, Array.isArray(given) ? given.length : least);
  const points = given as readonly ThermistorPoint[];
  const seen = new Map<number, number>();
  points.forEach((p, i) => {
    const j = seen.get(p.temperatureCelsius);
    if (j !== undefined) {
      throw new BridgeworkError(
        'singular',
        `\`points[${i}].temperatureCelsius\` must differ from every other point's; points[${j}] is at ${formatValue(p.temperatureCelsius)} °C too`,
        { param: `points[${i}].temperatureCelsius`, value: p.temperatureCelsius },
      );
    }
    seen.set(p.temperatureCelsius, i);
  });
  const n = points.length;
  const blame = { what: 'the fit', param: 'points', value: given };
  let temperatureAt: (lnR: number) => number;
  let beta: ThermistorFit['beta'];
  let steinhartHart: ThermistorFit['steinhartHart'];
  if (model === 'beta') {
    const t0c =
      o['referenceCelsius'] === undefined
        ? 25
        : checkRange('referenceCelsius', o['referenceCelsius'], {
            min: -ZERO_CELSIUS_KELVIN,
            minExclusive: true,
            max: 1000,
          });
    const t0 = t0c + ZERO_CELSIUS_KELVIN;
    const x = points.map(
      (p) => (t0c - p.temperatureCelsius) / ((p.temperatureCelsius + ZERO_CELSIUS_KELVIN) * t0),
    );
    const xm = x.reduce((s, v) => s + v, 0) / n;
    const um = u.reduce((s, v) => s + v, 0) / n;
    let sxy = 0;
    let sxx = 0;
    for (let i = 0; i < n; i++) {
      const dx = (x[i] as number) - xm;
      sxx += dx * dx;
      sxy += dx * ((u[i] as number) - um);
    }
    const b = checkFiniteResult(sxy / sxx, blame);
    if (!(b > 0)) {
      throw new BridgeworkError(
        'no-solution',
        `\`points\` must describe an NTC (resistance falling with temperature); the fit gives B = ${b} K`,
        {
          param: 'points',
          value: given,
        },
      );
    }
    const lnR0 = um - b * xm;
    beta = { referenceOhms: checkFiniteResult(Math.exp(lnR0), blame), referenceCelsius: t0c, betaKelvin: b };
    // 1/T = 1/T0 + (ln R − ln R0)/B.
    temperatureAt = (lnR) => 1 / (1 / t0 + (lnR - lnR0) / b) - ZERO_CELSIUS_KELVIN;
  } else {
    let c3: [number, number, number];
    if (n === 3) {
      const sh = fitSteinhartHart({ points });
      c3 = [sh.a, sh.b, sh.c];
    } else {
      const w = y.map((yi) => 1 / (yi * yi)); // T²
      c3 = leastSquares3(
        u.map((ui, i) => [w[i] as number, (w[i] as number) * ui, (w[i] as number) * ui * ui * ui] as const),
        y.map((yi, i) => (w[i] as number) * yi),
      );
    }
    const [a, b, c] = c3.map((v) => checkFiniteResult(v, blame)) as [number, number, number];
    if (!(b > 0)) {
      throw new BridgeworkError(
        'no-solution',
        `\`points\` must describe an NTC (resistance falling with temperature); the fit gives b = ${b}`,
        {
          param: 'points',
          value: given,
        },
      );
    }
    steinhartHart = { a, b, c };
    temperatureAt = (lnR) => 1 / (a + lnR * (b + c * lnR * lnR)) - ZERO_CELSIUS_KELVIN;
  }
  const residualsKelvin = u.map((ui, i) =>
    checkFiniteResult(temperatureAt(ui) - (points[i] as ThermistorPoint).temperatureCelsius, {
      what: 'the fitted temperature',
      param: `points[${i}]`,
      value: points[i],
    }),
  );
  return {
    model,
    beta,
    steinhartHart,
    residualsKelvin,
    largestResidualKelvin: Math.max(...residualsKelvin.map(Math.abs)),
    rmsResidualKelvin: Math.sqrt(residualsKelvin.reduce((s, r) => s + r * r, 0) / n),
    degreesOfFreedom: n - (model === 'beta' ? 2 : 3),
  };
}
