import { BridgeworkError } from './BridgeworkError.js';
import { checkFinite, formatValue } from './checks.js';

/**
 * The largest magnitude a value may have so that `value·factor` stays finite; the limit of every
 * unit helper that scales up.
 */
function checkScaled(param: string, value: unknown, factor: number, what: string): number {
  const x = checkFinite(param, value);
  const limit = Number.MAX_VALUE / factor;
  if (!(Math.abs(x) <= limit)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be at most ${limit} in magnitude, so that the ${what} stays finite; got ${formatValue(x)}`,
      { param, value: x, limit: [-limit, limit] },
    );
  }
  return x;
}

/**
 * Converts a strain (m/m) to microstrain (µε).
 *
 * @remarks
 * Multiplies by the exact integer 10⁶, so the only rounding is that of the product.
 *
 * @param strain - Strain, dimensionless (m/m); finite, at most 1.797e302 in magnitude (so the
 *   result is finite).
 * @returns Microstrain, µε.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `out-of-range` beyond the limit.
 * @example
 * ```ts
 * microstrainFromStrain(0.001); // 1000
 * ```
 */
export function microstrainFromStrain(strain: number): number {
  return checkScaled('strain', strain, 1e6, 'microstrain') * 1e6;
}

/**
 * Converts microstrain (µε) to strain (m/m).
 *
 * @remarks
 * Divides by the exact integer 10⁶ (a correctly rounded division), rather than multiplying by the
 * inexact double nearest 10⁻⁶, so `strainFromMicrostrain(1000) === 0.001`.
 *
 * @param microstrain - Microstrain, µε (finite).
 * @returns Strain, dimensionless (m/m).
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`.
 * @example
 * ```ts
 * strainFromMicrostrain(1000); // 0.001
 * ```
 */
export function strainFromMicrostrain(microstrain: number): number {
  return checkFinite('microstrain', microstrain) / 1e6;
}

/**
 * Converts a bridge output ratio (V/V) to millivolts per volt.
 *
 * @param ratio - Output ratio Vout/Vexc, V/V; finite, at most 1.797e305 in magnitude.
 * @returns The same ratio in mV/V.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `out-of-range` beyond the limit.
 * @example
 * ```ts
 * millivoltsPerVoltFromRatio(0.002); // 2
 * ```
 */
export function millivoltsPerVoltFromRatio(ratio: number): number {
  return checkScaled('ratio', ratio, 1e3, 'value in mV/V') * 1e3;
}

/**
 * Converts millivolts per volt to a bridge output ratio (V/V).
 *
 * @param millivoltsPerVolt - Output in mV/V (finite).
 * @returns Ratio Vout/Vexc, V/V.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`.
 * @example
 * ```ts
 * ratioFromMillivoltsPerVolt(2); // 0.002
 * ```
 */
export function ratioFromMillivoltsPerVolt(millivoltsPerVolt: number): number {
  return checkFinite('millivoltsPerVolt', millivoltsPerVolt) / 1e3;
}
