import { checkNonNegative, checkRange } from './checks.js';

/**
 * Boltzmann constant k in J/K, exact by the 2019 definition of the SI (CODATA 2018).
 *
 * @example
 * ```ts
 * BOLTZMANN_JOULES_PER_KELVIN; // 1.380649e-23
 * ```
 */
export const BOLTZMANN_JOULES_PER_KELVIN = 1.380649e-23;

/**
 * Standard acceleration of gravity gₙ in m/s², exact by definition (3rd CGPM, 1901).
 *
 * @example
 * ```ts
 * STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED; // 9.80665
 * ```
 */
export const STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED = 9.80665;

/**
 * The kelvin temperature of 0 °C: 273.15 K, exact by the definition of the Celsius scale.
 *
 * @example
 * ```ts
 * ZERO_CELSIUS_KELVIN; // 273.15
 * ```
 */
export const ZERO_CELSIUS_KELVIN = 273.15;

/**
 * Converts a Celsius temperature to kelvin (T = t + 273.15).
 *
 * @param temperatureCelsius - Temperature in °C: finite and at least −273.15 (absolute zero).
 * @returns Temperature in K (≥ 0).
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `out-of-range` below absolute zero.
 * @example
 * ```ts
 * kelvinFromCelsius(25); // 298.15
 * ```
 */
export function kelvinFromCelsius(temperatureCelsius: number): number {
  return (
    checkRange('temperatureCelsius', temperatureCelsius, { min: -ZERO_CELSIUS_KELVIN }) + ZERO_CELSIUS_KELVIN
  );
}

/**
 * Converts a kelvin temperature to Celsius (t = T − 273.15).
 *
 * @param temperatureKelvin - Temperature in K: finite and ≥ 0.
 * @returns Temperature in °C (≥ −273.15).
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `negative` below absolute zero.
 * @example
 * ```ts
 * celsiusFromKelvin(373.15); // 100
 * ```
 */
export function celsiusFromKelvin(temperatureKelvin: number): number {
  return checkNonNegative('temperatureKelvin', temperatureKelvin) - ZERO_CELSIUS_KELVIN;
}
