/** An NTC thermistor model: resistance and temperature both ways, and the slope. */
export interface Thermistor {
  /**
   * The temperature range [min, max] in °C the model was fitted over, when one was given;
   * temperatures and resistances outside it are rejected. `undefined`: any temperature above
   * absolute zero at which the model is defined.
   */
  readonly rangeCelsius: readonly [number, number] | undefined;
  /**
   * Resistance at a temperature, Ω.
   *
   * @param temperatureCelsius - Above −273.15 °C, inside `rangeCelsius` when set.
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range`, `no-solution`, `not-finite`, `wrong-type`.
   */
  ohmsAt(temperatureCelsius: number): number;
  /**
   * Temperature at a resistance, °C: the inverse of `ohmsAt`.
   *
   * @param ohms - Resistance in Ω (> 0).
   * @throws {@link @bridgework/core!BridgeworkError} `no-solution`, `out-of-range`, `not-positive`, `not-finite`, `wrong-type`.
   */
  temperatureAt(ohms: number): number;
  /**
   * Slope dR/dT at a temperature, Ω/K (negative for an NTC).
   *
   * @param temperatureCelsius - As for `ohmsAt`.
   */
  slopeAt(temperatureCelsius: number): number;
}
