import {
  BOLTZMANN_JOULES_PER_KELVIN,
  checkOhms,
  checkOptions,
  checkRange,
  kelvinFromCelsius,
} from '@bridgework/core';

/** Options of {@link johnsonNoiseDensity}. */
export interface JohnsonNoiseOptions {
  /** Resistance in Ω, in [0, 1e15] (0 gives 0). */
  readonly ohms: number;
  /** Temperature of the resistor in °C (> −273.15). Default 25. */
  readonly temperatureCelsius?: number;
}

/** @internal Validates an optional temperature in °C (above absolute zero), default 25 °C. */
export function checkTemperature(param: string, value: unknown): number {
  return value === undefined ? 25 : checkRange(param, value, { min: -273.15, minExclusive: true });
}

/**
 * Thermal (Johnson–Nyquist) noise voltage density of a resistance: √(4·k·T·R), in V/√Hz.
 *
 * @remarks
 * Nyquist's theorem (H. Nyquist, Phys. Rev. 32, 1928): the open-circuit noise of a resistance R at
 * absolute temperature T has the one-sided power spectral density 4kTR, white well below
 * kT/h ≈ 6 THz. k is the exact Boltzmann constant of the 2019 SI, 1.380649 × 10⁻²³ J/K (CODATA
 * 2018), and T = t + 273.15 K. By the same theorem, any passive resistive network at one
 * temperature (a bridge) produces the Johnson noise of its output resistance: see
 * {@link bridgeNoiseSource}. Accuracy: a few ulps (one product and a square root); near absolute zero
 * the Celsius input limits it, since T = t + 273.15 carries an absolute error of about 3e-14 K.
 *
 * @param options - Resistance and temperature.
 * @returns Noise density in V/√Hz.
 * @throws {@link @bridgework/core!BridgeworkError} `negative`, `not-finite` or `wrong-type` for
 *   the resistance, `out-of-range` for one above 1e15 Ω; `out-of-range` for a temperature at or
 *   below −273.15 °C; `unknown-option` for a key it does not know (naming the closest),
 *   `missing-option` without `ohms`.
 * @example
 * ```ts
 * johnsonNoiseDensity({ ohms: 350 }); // 2.40062…e-9 (2.40062 nV/√Hz at 25 °C)
 * johnsonNoiseDensity({ ohms: 1000, temperatureCelsius: 25 }); // 4.05779…e-9
 * ```
 */
export function johnsonNoiseDensity(options: JohnsonNoiseOptions): number {
  const o = checkOptions('options', options, { known: ['ohms', 'temperatureCelsius'], required: ['ohms'] });
  const ohms = checkOhms('ohms', o['ohms'], { allowZero: true });
  const kelvin = kelvinFromCelsius(checkTemperature('temperatureCelsius', o['temperatureCelsius']));
  return Math.sqrt(4 * BOLTZMANN_JOULES_PER_KELVIN * kelvin * ohms);
}
