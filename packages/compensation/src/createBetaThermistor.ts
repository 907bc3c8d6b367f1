import { ZERO_CELSIUS_KELVIN, checkFinite, checkObject, checkPositive } from '@bridgework/core';
import type { Thermistor } from './thermistor.js';
import {
  checkComputedTemperature,
  checkOptionalRange,
  checkTemperature,
  unreachableOhms,
} from './internal/thermistor.js';

/** Options of {@link createBetaThermistor}. */
export interface BetaThermistorOptions {
  /** Resistance R0 at the reference temperature, Ω (> 0): the "R25" of a data sheet. */
  readonly referenceOhms: number;
  /** The reference temperature t0, °C (above −273.15). Default 25. */
  readonly referenceCelsius?: number;
  /** The beta (B) constant in K (> 0), e.g. the B25/85 of a data sheet. */
  readonly betaKelvin: number;
  /** The temperature range [min, max] in °C over which B holds; outside it the model is rejected. */
  readonly rangeCelsius?: readonly [number, number];
}

/**
 * Creates an NTC thermistor model from its beta constant.
 *
 * @remarks
 * The beta model R(T) = R0·exp(B·(1/T − 1/T0)), T in kelvin (the Arrhenius form on every NTC
 * data sheet). It is evaluated as R0·exp(B·(T0 − T)/(T·T0)), which keeps full precision near T0;
 * the inverse t = t0 − T0²·L/(B + T0·L), L = ln(R/R0), is the exact closed form of
 * 1/T = 1/T0 + L/B rearranged so that no subtraction cancels. Both directions are within a few
 * ulps. The beta model is a two-parameter approximation of a real thermistor (errors of a few
 * tenths of a kelvin over wide ranges are typical); use Steinhart–Hart
 * ({@link createSteinhartHartThermistor}) for better accuracy, and state `rangeCelsius` (the range
 * B was specified over) so that the model is not extrapolated.
 *
 * @param options - R0, t0, B and the optional range.
 * @returns The thermistor evaluator.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`,
 *   `out-of-range` (t0 or a range below absolute zero), `invalid-shape` (range).
 * @example
 * ```ts
 * const ntc = createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977 });
 * ntc.ohmsAt(0); // ≈ 33900.4 Ω
 * ntc.temperatureAt(10e3); // 25
 * ```
 */
export function createBetaThermistor(options: BetaThermistorOptions): Thermistor {
  const o = checkObject('options', options);
  const referenceOhms = checkPositive('referenceOhms', o['referenceOhms']);
  const t0 = o['referenceCelsius'] === undefined ? 25 : checkTemperature(o['referenceCelsius'], undefined);
  const beta = checkPositive('betaKelvin', o['betaKelvin']);
  const rangeCelsius = checkOptionalRange(o['rangeCelsius']);
  const kelvin0 = t0 + ZERO_CELSIUS_KELVIN;

  function ohmsAt(temperatureCelsius: number): number {
    const t = checkTemperature(temperatureCelsius, rangeCelsius);
    const kelvin = t + ZERO_CELSIUS_KELVIN;
    return referenceOhms * Math.exp((beta * (t0 - t)) / (kelvin * kelvin0));
  }

  return {
    rangeCelsius,
    ohmsAt,
    temperatureAt(ohms: number): number {
      const r = checkPositive('ohms', ohms);
      const l = Math.log(r / referenceOhms);
      const denominator = beta + kelvin0 * l;
      if (!(denominator > 0)) throw unreachableOhms(r, 'it would need T ≤ 0 K');
      return checkComputedTemperature(r, t0 - (kelvin0 * kelvin0 * l) / denominator, rangeCelsius);
    },
    slopeAt(temperatureCelsius: number): number {
      const r = ohmsAt(temperatureCelsius);
      const kelvin = checkFinite('temperatureCelsius', temperatureCelsius) + ZERO_CELSIUS_KELVIN;
      return (-beta * r) / (kelvin * kelvin);
    },
  };
}
