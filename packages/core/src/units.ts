/**
 * Converts a strain (m/m) to microstrain (µε).
 *
 * @remarks
 * Multiplies by the exact integer 10⁶, so the only rounding is that of the product.
 *
 * @param strain - Strain, dimensionless (m/m).
 * @returns Microstrain, µε.
 * @example
 * ```ts
 * microstrainFromStrain(0.001); // 1000
 * ```
 */
export function microstrainFromStrain(strain: number): number {
  return strain * 1e6;
}

/**
 * Converts microstrain (µε) to strain (m/m).
 *
 * @remarks
 * Divides by the exact integer 10⁶ (a correctly rounded division), rather than multiplying by the
 * inexact double nearest 10⁻⁶, so `strainFromMicrostrain(1000) === 0.001`.
 *
 * @param microstrain - Microstrain, µε.
 * @returns Strain, dimensionless (m/m).
 * @example
 * ```ts
 * strainFromMicrostrain(1000); // 0.001
 * ```
 */
export function strainFromMicrostrain(microstrain: number): number {
  return microstrain / 1e6;
}

/**
 * Converts a bridge output ratio (V/V) to millivolts per volt.
 *
 * @param ratio - Output ratio Vout/Vexc, V/V.
 * @returns The same ratio in mV/V.
 * @example
 * ```ts
 * millivoltsPerVoltFromRatio(0.002); // 2
 * ```
 */
export function millivoltsPerVoltFromRatio(ratio: number): number {
  return ratio * 1e3;
}

/**
 * Converts millivolts per volt to a bridge output ratio (V/V).
 *
 * @param millivoltsPerVolt - Output in mV/V.
 * @returns Ratio Vout/Vexc, V/V.
 * @example
 * ```ts
 * ratioFromMillivoltsPerVolt(2); // 0.002
 * ```
 */
export function ratioFromMillivoltsPerVolt(millivoltsPerVolt: number): number {
  return millivoltsPerVolt / 1e3;
}
