import { BridgeworkError, checkFiniteResult, checkOptions } from '@bridgework/core';
import { checkPoints } from './internal/thermistor.js';
import type { SteinhartHartCoefficients } from './createSteinhartHartThermistor.js';

/** One calibration point of a thermistor. */
export interface ThermistorPoint {
  /** Measured resistance, Ω (> 0). */
  readonly ohms: number;
  /** Temperature at which it was measured, °C (above −273.15). */
  readonly temperatureCelsius: number;
}

/** Options of {@link fitSteinhartHart}. */
export interface FitSteinhartHartOptions {
  /** Exactly three calibration points at distinct resistances. */
  readonly points: readonly ThermistorPoint[];
}

/**
 * Fits the Steinhart–Hart coefficients through three (resistance, temperature) points.
 *
 * @remarks
 * The three equations yᵢ = a + b·uᵢ + c·uᵢ³ (uᵢ = ln Rᵢ, yᵢ = 1/Tᵢ) are solved by divided
 * differences rather than by eliminating the matrix [1, u, u³], whose columns are nearly parallel
 * (u ≈ 7…12 for common NTCs): with the points ordered by u,
 *
 *   γ2 = (y2 − y1)/(u2 − u1),  γ3 = (y3 − y1)/(u3 − u1),
 *   c = (γ3 − γ2)/((u3 − u2)·(u1 + u2 + u3)),  b = γ2 − c·(u1² + u1·u2 + u2²),  a = y1 − b·u1 − c·u1³
 *
 * (the standard solution, e.g. in thermistor application notes; derived in docs/compensation.md).
 * Each step is a difference of data, so rounding adds no error beyond the data's own conditioning;
 * the fitted curve passes through the points to within 1e-9 K (tested against a 50-digit solve).
 * Choose points spread over the range of use (for example both ends and the middle): the fit is
 * exact at the points only.
 *
 * @param options - `points`: three calibration points.
 * @returns The coefficients a, b, c (pass them to {@link createSteinhartHartThermistor}).
 * @throws {@link @bridgework/core!BridgeworkError} `too-few-points` for fewer than three points,
 *   `invalid-shape` for more; `singular` for two equal resistances (or u1 + u2 + u3 = 0);
 *   `no-solution` when the points give b ≤ 0 (not an NTC curve); `not-positive`, `out-of-range`,
 *   `not-finite`, `wrong-type` for bad numbers (resistances within `OHMS_LIMITS` of the core
 *   package; `out-of-range` too for points so close that a coefficient overflows);
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option`.
 * @example
 * ```ts
 * fitSteinhartHart({ points: [
 *   { ohms: 32650, temperatureCelsius: 0 },
 *   { ohms: 10000, temperatureCelsius: 25 },
 *   { ohms: 1752, temperatureCelsius: 70 },
 * ] }); // ≈ { a: 1.128464e-3, b: 2.342273e-4, c: 8.73395e-8 }
 * ```
 */
export function fitSteinhartHart(options: FitSteinhartHartOptions): SteinhartHartCoefficients {
  const o = checkOptions('options', options, { known: ['points'], required: ['points'] });
  const { u, y } = checkPoints(o['points'], 3);
  const order = [0, 1, 2].sort((i, j) => u[i]! - u[j]!);
  const [u1, u2, u3] = order.map((i) => u[i]!) as [number, number, number];
  const [y1, y2, y3] = order.map((i) => y[i]!) as [number, number, number];
  const sum = u1 + u2 + u3;
  if (u1 === u2 || u2 === u3 || sum === 0) {
    throw new BridgeworkError(
      'singular',
      '`points` must have three distinct resistances (and ln R1 + ln R2 + ln R3 ≠ 0)',
      {
        param: 'points',
        value: o['points'],
      },
    );
  }
  const g2 = (y2 - y1) / (u2 - u1);
  const g3 = (y3 - y1) / (u3 - u1);
  const c = (g3 - g2) / ((u3 - u2) * sum);
  const b = g2 - c * (u1 * u1 + u1 * u2 + u2 * u2);
  const a = y1 - u1 * (b + c * u1 * u1);
  if (!(b > 0)) {
    throw new BridgeworkError(
      'no-solution',
      `\`points\` must describe an NTC (resistance falling with temperature); the fit gives b = ${b}`,
      {
        param: 'points',
        value: o['points'],
      },
    );
  }
  const blame = { what: 'the coefficients', param: 'points', value: o['points'] };
  return { a: checkFiniteResult(a, blame), b: checkFiniteResult(b, blame), c: checkFiniteResult(c, blame) };
}
